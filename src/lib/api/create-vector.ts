/**
 * `POST /api/vectors`: the one fetcher that creates a vector in the team Library, used by the
 * Library's editor, the Bench's "Save to Library" and the saves of the Properties and Fault sweep
 * pages (features do not import each other, so it lives here). A revision of a stored vector is a
 * `PUT` (the Library's `saveVector`).
 */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../api-client.ts';
import { vectorKeys } from '../query-keys.ts';
import type { StoredVector } from '../../../shared/api/index.ts';

export { vectorKeys };

export type CreateVectorInput = {
  /** The vector file's fields (docs/vector.md). */
  file: Record<string, unknown>;
  deviceId?: number | null;
  /** The revision note; the server writes "Created" without one. */
  message?: string;
};

export function createVector({ file, deviceId, message }: CreateVectorInput): Promise<StoredVector> {
  return api.post<StoredVector>('/vectors', { ...file, deviceId: deviceId ?? null, ...(message === undefined ? {} : { message }) });
}

/** Creates a vector and refreshes the Library's lists; the new vector is cached as its detail. */
export function useCreateVector() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createVector,
    onSuccess: (created) => {
      queryClient.setQueryData(vectorKeys.detail(created.id), created);
      void queryClient.invalidateQueries({ queryKey: vectorKeys.lists() });
    },
  });
}
