import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { traceKeys } from '../../../lib/query-keys.ts';
import type { TimelineWindow } from '../../../../shared/api/index.ts';

/**
 * A window of the timeline. Without `startUs`/`endUs` the whole trace. `points`: about how many
 * VBUS readings (the server picks the level); `limit`: most messages, events, spans and finding pins.
 */
export type TimelineWindowParams = { startUs?: number; endUs?: number; points?: number; limit?: number };

/** `GET /api/traces/:id/timeline?startUs=&endUs=&points=&limit=`. */
export async function getTraceTimeline(id: string | number, params: TimelineWindowParams, signal?: AbortSignal): Promise<TimelineWindow> {
  const query = new URLSearchParams(Object.entries(params).flatMap(([key, value]) => (value === undefined ? [] : [[key, String(Math.round(value))]])));
  return api.get<TimelineWindow>(`/traces/${encodeURIComponent(String(id))}/timeline?${query}`, { signal });
}

export function traceTimelineQueryOptions(id: string | number, params: TimelineWindowParams) {
  return queryOptions({ queryKey: [...traceKeys.detail(id), 'timeline', params], queryFn: ({ signal }) => getTraceTimeline(id, params, signal), placeholderData: keepPreviousData });
}

export function useTraceTimeline(id: string | number, params: TimelineWindowParams, enabled = true) {
  return useQuery({ ...traceTimelineQueryOptions(id, params), enabled });
}
