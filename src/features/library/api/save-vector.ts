import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { createVector } from '../../../lib/api/create-vector.ts';
import { vectorKeys } from './keys.ts';
import { vectorPath, type StoredVector } from './types.ts';

export type SaveVectorInput = {
  file: Record<string, unknown>;
  deviceId: number | null;
  message: string;
  /** The revision edited; absent for a new vector. */
  revision?: number;
};

export function saveVector(input: SaveVectorInput): Promise<StoredVector> {
  const body = { ...input.file, deviceId: input.deviceId, message: input.message };
  if (input.revision === undefined) return createVector(input.file, input) as Promise<StoredVector>;
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
