import { useEffect } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { ButtonLink } from '../../../components/button.tsx';
import { ProgressBar } from '../../../components/progress-bar.tsx';
import { paths } from '../../../config/paths.ts';
import { vectorKeys } from '../../../lib/query-keys.ts';
import { useRunEvents } from '../api/use-run-events.ts';

/** A run's progress, fed by its server-sent events: done of total, the last result, the outcome. */
export function RunPanel({ runId, selection }: { runId: number; selection: string }) {
  const progress = useRunEvents(runId);
  const queryClient = useQueryClient();
  const finished = progress?.finished ?? false;
  // The list's "Last run" column changes with the run.
  useEffect(() => {
    if (finished) void queryClient.invalidateQueries({ queryKey: vectorKeys.lists() });
  }, [finished, queryClient]);
  const total = progress?.total ?? 0;
  const fraction = progress && total > 0 ? progress.done / total : undefined;
  return (
    <div className="flex flex-col gap-2 rounded-lg border border-slate-200 bg-white px-4 py-3 dark:border-slate-800 dark:bg-slate-900" role="region" aria-label="Run progress">
      <div className="flex flex-wrap items-center justify-between gap-2 text-sm">
        <p className="font-medium text-slate-800 dark:text-slate-100">
          Run #{runId} · {selection}
        </p>
        <p className="font-mono text-xs text-slate-600 tabular dark:text-slate-400" aria-live="polite">
          {progress ? `${progress.done}/${total} · ${progress.passed} passed · ${progress.failed} failed` : 'starting…'}
          {progress?.finished && progress.newFailures ? ` · ${progress.newFailures} new` : ''}
        </p>
      </div>
      <ProgressBar label="Vectors run" fraction={fraction} />
      <div className="flex flex-wrap items-center justify-between gap-2 text-xs text-slate-500 dark:text-slate-400">
        <p className="min-w-0 truncate font-mono">{progress?.last ? `${progress.last.ok ? 'PASS' : 'FAIL'} ${progress.last.id}${progress.last.message ? ` — ${progress.last.message}` : ''}` : ' '}</p>
        {progress?.error && <p className="text-red-700 dark:text-red-300">{progress.error}</p>}
        {progress?.finished && (
          <ButtonLink size="sm" to={paths.runs.detail.getHref(runId)}>
            {progress.status === 'failed' ? 'See what happened' : 'Open the results'}
          </ButtonLink>
        )}
      </div>
    </div>
  );
}
