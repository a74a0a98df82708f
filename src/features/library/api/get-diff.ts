import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { vectorKeys } from '../../../lib/query-keys.ts';
import type { VectorDiff } from '../../../../shared/api/index.ts';
import { vectorPath } from './types.ts';

export function getDiff(id: string, from: number, to: number, signal?: AbortSignal): Promise<VectorDiff> {
  return api.get<VectorDiff>(`${vectorPath(id)}/diff`, { query: { from, to }, signal });
}

export function diffQueryOptions(id: string, from: number, to: number) {
  return queryOptions({ queryKey: [...vectorKeys.detail(id), 'revisions', 'diff', from, to], queryFn: ({ signal }) => getDiff(id, from, to, signal), placeholderData: keepPreviousData });
}

export function useDiff(id: string, from: number | null, to: number | null) {
  return useQuery({ ...diffQueryOptions(id, from ?? 0, to ?? 0), enabled: from !== null && to !== null && from !== to });
}
