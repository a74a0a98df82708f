import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { runKeys } from '../../../lib/query-keys.ts';
import type { Run, RunResult } from '../../../../shared/api/index.ts';

export type RunResponse = { run: Run; results: RunResult[] };

export function getRun(id: number, signal?: AbortSignal): Promise<RunResponse> {
  return api.get<RunResponse>(`/runs/${id}`, { signal });
}

export function runQueryOptions(id: number) {
  return queryOptions({
    queryKey: runKeys.detail(id),
    queryFn: ({ signal }) => getRun(id, signal),
    refetchInterval: (query) => (query.state.data?.run.status === 'running' ? 1_500 : false),
  });
}

export function useRun(id: number) {
  return useQuery(runQueryOptions(id));
}
