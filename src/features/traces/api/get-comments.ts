import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { traceKeys } from '../../../lib/query-keys.ts';

export type TraceComment = { id: number; author: { id: number; name: string; role: string }; body: string; createdAt: string };

export const commentsKey = (traceId: string | number) => [...traceKeys.detail(traceId), 'comments'] as const;

export async function getComments(traceId: string | number, signal?: AbortSignal) {
  return api.get<{ items: TraceComment[]; total: number }>(`/traces/${encodeURIComponent(String(traceId))}/comments`, { signal });
}

export function commentsQueryOptions(traceId: string | number) {
  return queryOptions({ queryKey: commentsKey(traceId), queryFn: ({ signal }) => getComments(traceId, signal) });
}

export function useComments(traceId: string | number) {
  return useQuery(commentsQueryOptions(traceId));
}
