import type { QueryClient } from '@tanstack/react-query';
import { windowFromParams, windowRead } from '../lib/first-window.ts';
import { loadTimelineChunk } from '../lib/timeline-chunk.ts';
import { traceSummaryQueryOptions } from './get-trace-summary.ts';
import { traceTimelineQueryOptions } from './get-trace-timeline.ts';

/**
 * What the trace page needs before it can draw, asked for as navigation starts (the route's
 * loader), beside the session check and the page's own code rather than after them: the summary,
 * the first window of the timeline (the one the link's `?from=&to=` names, else the whole trace)
 * and the timeline's code. Nothing is awaited: the page reads the same cache entries.
 */
export function prefetchTracePage(queryClient: QueryClient, traceId: string, search: URLSearchParams): void {
  void queryClient.prefetchQuery(traceSummaryQueryOptions(traceId));
  void queryClient.prefetchQuery(traceTimelineQueryOptions(traceId, windowRead(windowFromParams(search))));
  // In a task of its own: asking for a chunk appends a preload link per module it needs, which would
  // lengthen the router's first task (already appending those of the page's own chunks).
  setTimeout(() => void loadTimelineChunk(), 0);
}
