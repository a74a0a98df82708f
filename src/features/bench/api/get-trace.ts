import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { createQueryKeys } from '../../../lib/query-keys.ts';

export const traceKeys = createQueryKeys('traces');

/** `GET /api/traces/:id`: the stored trace's analysis (read loosely; see lib/scenario-from-trace.ts). */
export async function getTrace(id: string, signal?: AbortSignal): Promise<unknown> {
  return api.get<unknown>(`/traces/${encodeURIComponent(id)}`, { signal });
}

export function traceQueryOptions(id: string) {
  return queryOptions({ queryKey: traceKeys.detail(id), queryFn: ({ signal }) => getTrace(id, signal), staleTime: 60_000 });
}

/** Disabled without an id, so the page can always call it. */
export function useTrace(id: string | null) {
  return useQuery({ ...traceQueryOptions(id ?? ''), enabled: id !== null && id !== '' });
}
