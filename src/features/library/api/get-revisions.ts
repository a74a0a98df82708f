import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { vectorKeys } from './keys.ts';
import { vectorPath, type RevisionSummary } from './types.ts';

export type RevisionsResponse = { items: RevisionSummary[]; total: number; latest: number };

export function getRevisions(id: string, signal?: AbortSignal): Promise<RevisionsResponse> {
  return api.get<RevisionsResponse>(`${vectorPath(id)}/revisions`, { signal });
}

export function revisionsQueryOptions(id: string) {
  return queryOptions({ queryKey: [...vectorKeys.detail(id), 'revisions'], queryFn: ({ signal }) => getRevisions(id, signal) });
}

export function useRevisions(id: string) {
  return useQuery(revisionsQueryOptions(id));
}
