import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { vectorKeys } from '../../../lib/query-keys.ts';
import type { StoredVector } from '../../../../shared/api/index.ts';
import { vectorPath } from './types.ts';

export type SaveVectorInput = {
  file: Record<string, unknown>;
  deviceId: number | null;
  message: string;
  /** The revision edited; absent for a new vector. */
  revision?: number;
};

export function saveVector(input: SaveVectorInput): Promise<StoredVector> {
  const body = { ...input.file, deviceId: input.deviceId, message: input.message };
  if (input.revision === undefined) return api.post<StoredVector>('/vectors', body);
  return api.put<StoredVector>(vectorPath(String(input.file.id)), { ...body, revision: input.revision });
}

export function useSaveVector() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveVector,
    onSuccess: (saved) => {
      queryClient.setQueryData(vectorKeys.detail(saved.id), saved);
      void queryClient.invalidateQueries({ queryKey: vectorKeys.lists() });
      void queryClient.invalidateQueries({ queryKey: [...vectorKeys.detail(saved.id), 'revisions'] });
    },
  });
}
