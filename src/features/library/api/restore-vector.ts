import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { vectorKeys } from '../../../lib/query-keys.ts';
import type { StoredVector } from '../../../../shared/api/index.ts';
import { vectorPath } from './types.ts';

export function restoreVector(input: { id: string; revision: number }): Promise<StoredVector> {
  return api.post<StoredVector>(`${vectorPath(input.id)}/restore`, { revision: input.revision });
}

export function useRestoreVector() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: restoreVector,
    onSuccess: (saved) => {
      queryClient.setQueryData(vectorKeys.detail(saved.id), saved);
      void queryClient.invalidateQueries({ queryKey: vectorKeys.lists() });
      void queryClient.invalidateQueries({ queryKey: [...vectorKeys.detail(saved.id), 'revisions'] });
    },
  });
}
