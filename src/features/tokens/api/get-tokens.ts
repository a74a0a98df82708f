import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import type { ApiToken } from '../../../../shared/api/index.ts';
import { tokenKeys } from '../../../lib/query-keys.ts';

export function getTokens(signal?: AbortSignal): Promise<{ items: ApiToken[]; total: number }> {
  return api.get<{ items: ApiToken[]; total: number }>('/tokens', { signal });
}

export function tokensQueryOptions() {
  return queryOptions({ queryKey: tokenKeys.lists(), queryFn: ({ signal }) => getTokens(signal) });
}

export function useTokens() {
  return useQuery(tokensQueryOptions());
}
