// The timeline is a chunk of its own, asked for once: by the route as navigation starts, and again
// (the same promise) by the page that draws it.
let timelineChunk: Promise<typeof import('../../../components/timeline/trace-timeline.tsx')> | undefined;

export function loadTimelineChunk() {
  timelineChunk ??= import('../../../components/timeline/trace-timeline.tsx');
  return timelineChunk;
}
