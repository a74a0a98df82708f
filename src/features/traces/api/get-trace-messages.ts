import { queryOptions, useQueries } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { traceKeys } from '../../../lib/query-keys.ts';
import type { MessageRange } from '../../../../shared/api/index.ts';

/** `offset`: the first row (or `atUs`: the first row at that time); `fold`: rows without GoodCRCs (their GoodCRCs still come with them). */
export type MessageRangeParams = { offset?: number; atUs?: number; limit: number; fold: boolean };

/** `GET /api/traces/:id/messages?offset=&limit=&fold=goodcrc`: a run of the whole trace's messages. */
export async function getTraceMessages(id: string | number, params: MessageRangeParams, signal?: AbortSignal): Promise<MessageRange> {
  const query = new URLSearchParams({ limit: String(params.limit) });
  if (params.atUs !== undefined) query.set('atUs', String(Math.round(params.atUs)));
  else query.set('offset', String(params.offset ?? 0));
  if (params.fold) query.set('fold', 'goodcrc');
  return api.get<MessageRange>(`/traces/${encodeURIComponent(String(id))}/messages?${query}`, { signal });
}

export function traceMessagesQueryOptions(id: string | number, params: MessageRangeParams) {
  return queryOptions({ queryKey: [...traceKeys.detail(id), 'messages', params], queryFn: ({ signal }) => getTraceMessages(id, params, signal), staleTime: Number.POSITIVE_INFINITY });
}

/** Several runs at once (the pages of a list that are on screen). */
export function useTraceMessagePages(id: string | number, pages: readonly MessageRangeParams[], enabled = true) {
  return useQueries({ queries: pages.map((params) => ({ ...traceMessagesQueryOptions(id, params), enabled })) });
}
