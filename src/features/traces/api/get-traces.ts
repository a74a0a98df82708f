import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { traceKeys } from '../../../lib/query-keys.ts';
import type { TraceItem } from '../../../../shared/api/index.ts';

export type TraceSort = 'createdAt' | '-createdAt' | 'title' | '-title' | 'sizeBytes' | '-sizeBytes' | 'errors' | '-errors';
export type TraceListParams = {
  q?: string;
  deviceId?: string;
  severity?: 'error' | 'warning' | 'info' | 'clean' | '';
  uploaderId?: string;
  sort: TraceSort;
  page: number;
  pageSize: number;
};

export type TraceListResponse = { items: TraceItem[]; total: number; page: number; pageSize: number; uploaders: { id: number; name: string }[] };

/** One page of stored traces, filtered and sorted by the server. */
export async function getTraces(params: TraceListParams, signal?: AbortSignal): Promise<TraceListResponse> {
  return api.get<TraceListResponse>('/traces', { query: params, signal });
}

export function tracesQueryOptions(params: TraceListParams) {
  return queryOptions({
    queryKey: traceKeys.list(params),
    queryFn: ({ signal }) => getTraces(params, signal),
    placeholderData: keepPreviousData,
  });
}

export function useTraces(params: TraceListParams) {
  return useQuery(tracesQueryOptions(params));
}
