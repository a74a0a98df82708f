import { useEffect, useState } from 'react';

export type RunProgress = {
  done: number;
  total: number;
  passed: number;
  failed: number;
  finished: boolean;
  status?: 'done' | 'failed';
  newFailures?: number;
  last?: { id: string; ok: boolean; message?: string; durationMs: number };
  error?: string;
};

/** Follows a run's server-sent events (`GET /api/runs/:id/events`) until it is done. */
export function useRunEvents(runId: number | null): RunProgress | null {
  const [progress, setProgress] = useState<RunProgress | null>(null);
  useEffect(() => {
    if (runId === null) return;
    setProgress(null);
    const source = new EventSource(`/api/runs/${runId}/events`);
    source.addEventListener('progress', (event) => {
      const data = JSON.parse((event as MessageEvent<string>).data) as Omit<RunProgress, 'finished'>;
      setProgress((before) => ({ ...data, last: data.last ?? before?.last, finished: false }));
    });
    source.addEventListener('done', (event) => {
      const data = JSON.parse((event as MessageEvent<string>).data) as Omit<RunProgress, 'finished'>;
      setProgress((before) => ({ ...data, last: before?.last, finished: true }));
      source.close();
    });
    source.onerror = () => {
      // The stream ends after "done"; a broken stream before that shows as an error.
      setProgress((before) =>
        before?.finished ? before : { ...(before ?? { done: 0, total: 0, passed: 0, failed: 0 }), finished: true, error: 'Lost the connection to the run; open it on the Runs page.' },
      );
      source.close();
    };
    return () => source.close();
  }, [runId]);
  return progress;
}
