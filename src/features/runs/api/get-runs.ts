import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { runKeys } from '../../../lib/query-keys.ts';
import type { Run } from '../../../../shared/api/index.ts';

export type RunsParams = { project?: string; source?: string; page: number; pageSize: number };
export type RunsResponse = { items: Run[]; total: number; projects: string[] };

export function getRuns(params: RunsParams, signal?: AbortSignal): Promise<RunsResponse> {
  return api.get<RunsResponse>('/runs', { query: params, signal });
}

export function runsQueryOptions(params: RunsParams) {
  return queryOptions({
    queryKey: runKeys.list(params),
    queryFn: ({ signal }) => getRuns(params, signal),
    placeholderData: keepPreviousData,
    // A running run changes by itself; refresh the list while one is open.
    refetchInterval: (query) => (query.state.data?.items.some((r) => r.status === 'running') ? 2_000 : false),
  });
}

export function useRuns(params: RunsParams) {
  return useQuery(runsQueryOptions(params));
}
