import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { traceKeys } from '../../../lib/query-keys.ts';
import type { TraceSummaryDetail } from '../../../../shared/api/index.ts';

/** `GET /api/traces/:id/summary`: the trace, its analysis without the lists, and progress while it runs. */
export async function getTraceSummary(id: string | number, signal?: AbortSignal): Promise<TraceSummaryDetail> {
  return api.get<TraceSummaryDetail>(`/traces/${encodeURIComponent(String(id))}/summary`, { signal });
}

export function traceSummaryQueryOptions(id: string | number) {
  return queryOptions({ queryKey: [...traceKeys.detail(id), 'summary'], queryFn: ({ signal }) => getTraceSummary(id, signal) });
}

export function useTraceSummary(id: string | number) {
  return useQuery(traceSummaryQueryOptions(id));
}
