import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { traceKeys } from './get-traces.ts';
import type { TraceDetail } from './types.ts';

/** One stored trace with its analysis (null until the analysis is done). */
export async function getTrace(id: string | number, signal?: AbortSignal): Promise<TraceDetail> {
  return api.get<TraceDetail>(`/traces/${encodeURIComponent(String(id))}`, { signal });
}

export function traceQueryOptions(id: string | number) {
  return queryOptions({
    queryKey: traceKeys.detail(id),
    queryFn: ({ signal }) => getTrace(id, signal),
  });
}

export function useTrace(id: string | number) {
  return useQuery(traceQueryOptions(id));
}
