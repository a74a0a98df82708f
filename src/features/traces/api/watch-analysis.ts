import type { AnalysisEvent } from '../../../../shared/api/index.ts';

/**
 * Follows a trace's analysis over server-sent events until it is done or failed; returns a stop
 * function. The stream is closed on the final event, so the browser does not reconnect.
 */
export function watchAnalysis(traceId: string | number, onEvent: (event: AnalysisEvent) => void): () => void {
  const source = new EventSource(`/api/traces/${encodeURIComponent(String(traceId))}/events`);
  const handle = (message: MessageEvent<string>) => {
    const event = JSON.parse(message.data) as AnalysisEvent;
    if (event.type !== 'progress') source.close();
    onEvent(event);
  };
  for (const type of ['progress', 'done', 'failed'] as const) source.addEventListener(type, handle);
  return () => source.close();
}
