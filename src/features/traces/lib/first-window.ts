import type { TimeWindow } from '../../../components/timeline/time-window.ts';
import type { TimelineWindowParams } from '../api/get-trace-timeline.ts';

/** The window a link asks for (`?from=&to=`, µs), or null for the whole trace. */
export function windowFromParams(params: URLSearchParams): TimeWindow | null {
  const from = Number(params.get('from'));
  const to = Number(params.get('to'));
  return params.has('from') && params.has('to') && Number.isFinite(from) && Number.isFinite(to) && to > from && from >= 0 ? { startUs: from, endUs: to } : null;
}

/** The timeline asks for about this many VBUS readings and at most this many messages, spans and pins per window. */
const WINDOW_READ = { points: 2_000, limit: 5_000 };
/** At least this much is read beyond each edge of the window (invented: a sparse log reads VBUS about once a second). */
const READ_MARGIN_MIN_US = 1_000_000;

/**
 * The timeline read for the window on screen (`null`: the whole trace, whose end the server knows).
 * A margin either side: the reading before the window holds its value into it, and a small pan
 * needs no new read.
 */
export function windowRead(view: TimeWindow | null): TimelineWindowParams {
  if (!view) return WINDOW_READ;
  const marginUs = Math.max(view.endUs - view.startUs, READ_MARGIN_MIN_US);
  return { startUs: Math.max(0, view.startUs - marginUs), endUs: view.endUs + marginUs, ...WINDOW_READ };
}
