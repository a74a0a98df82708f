import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { vectorKeys } from '../../../lib/query-keys.ts';

export type VectorRevision = { revision: number; vector: Record<string, unknown> };

/** The vector as it was when it ran (its revision), or the current one for CI results. */
export function getVectorRevision(id: string, revision: number | null, signal?: AbortSignal): Promise<VectorRevision> {
  const base = `/vectors/${encodeURIComponent(id)}`;
  if (revision !== null) return api.get<VectorRevision>(`${base}/revisions/${revision}`, { signal });
  return api.get<Record<string, unknown> & { revision: number }>(base, { signal }).then((v) => ({ revision: v.revision, vector: v }));
}

export function vectorRevisionQueryOptions(id: string, revision: number | null) {
  return queryOptions({ queryKey: [...vectorKeys.detail(id), 'revisions', revision ?? 'latest'], queryFn: ({ signal }) => getVectorRevision(id, revision, signal), staleTime: Infinity });
}

export function useVectorRevision(id: string, revision: number | null, enabled: boolean) {
  return useQuery({ ...vectorRevisionQueryOptions(id, revision), enabled });
}
