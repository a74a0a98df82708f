import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { createVector } from '../../../lib/api/create-vector.ts';
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

/** A new vector is created (`POST`, the one fetcher in src/lib/api); an edit is a new revision (`PUT`). */
export function saveVector(input: SaveVectorInput): Promise<StoredVector> {
  if (input.revision === undefined) return createVector(input);
  return api.put<StoredVector>(vectorPath(String(input.file.id)), { ...input.file, deviceId: input.deviceId, message: input.message, revision: input.revision });
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
