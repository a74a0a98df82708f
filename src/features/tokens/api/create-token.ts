import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import type { ApiToken } from '../../../../shared/api/index.ts';
import { tokenKeys } from '../../../lib/query-keys.ts';

export function createToken(input: { project: string; name: string }): Promise<{ token: string; item: ApiToken }> {
  return api.post<{ token: string; item: ApiToken }>('/tokens', input);
}

export function useCreateToken() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: createToken, onSuccess: () => queryClient.invalidateQueries({ queryKey: tokenKeys.lists() }) });
}
