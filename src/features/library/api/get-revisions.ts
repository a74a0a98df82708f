import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { vectorKeys } from '../../../lib/query-keys.ts';
import type { RevisionSummary } from '../../../../shared/api/index.ts';
import { vectorPath } from './types.ts';

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
