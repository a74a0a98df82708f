import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { tokenKeys } from '../../../lib/query-keys.ts';

export function revokeToken(id: number): Promise<void> {
  return api.delete<void>(`/tokens/${id}`);
}

export function useRevokeToken() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: revokeToken, onSuccess: () => queryClient.invalidateQueries({ queryKey: tokenKeys.lists() }) });
}
