import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { vectorKeys } from '../../../lib/query-keys.ts';
import type { StoredVector } from '../../../../shared/api/index.ts';
import { vectorPath } from './types.ts';

export function getVector(id: string, signal?: AbortSignal): Promise<StoredVector> {
  return api.get<StoredVector>(vectorPath(id), { signal });
}

export function vectorQueryOptions(id: string) {
  return queryOptions({ queryKey: vectorKeys.detail(id), queryFn: ({ signal }) => getVector(id, signal), staleTime: Infinity });
}

export function useVector(id: string | null) {
  return useQuery({ ...vectorQueryOptions(id ?? ''), enabled: id !== null });
}
