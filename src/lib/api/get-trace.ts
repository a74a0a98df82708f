/** `GET /api/traces/:id`: one stored trace with its analysis (null until the analysis is done). */
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TraceDetail } from '../../../shared/api/index.ts';
import { api } from '../api-client.ts';
import { traceKeys } from '../query-keys.ts';

export function getTrace(id: string | number, signal?: AbortSignal): Promise<TraceDetail> {
  return api.get<TraceDetail>(`/traces/${encodeURIComponent(String(id))}`, { signal });
}

export function traceQueryOptions(id: string | number) {
  return queryOptions({ queryKey: traceKeys.detail(id), queryFn: ({ signal }) => getTrace(id, signal) });
}

/** Disabled without an id, so a page can always call it. */
export function useTrace(id: string | number | null) {
  return useQuery({ ...traceQueryOptions(id ?? ''), enabled: id !== null && id !== '' });
}
