import { Badge } from '../../../components/badge.tsx';
import type { RunResultRow } from '../api/start-run.ts';

const pre = 'max-h-72 overflow-auto rounded-md border border-slate-200 bg-slate-50 p-3 font-mono text-xs whitespace-pre text-slate-700 dark:border-slate-800 dark:bg-slate-950 dark:text-slate-300';

/** One vector's result: pass or fail, why, and for a failure the expected output beside the actual. */
export function RunResultView({ result }: { result: RunResultRow }) {
  return (
    <div className="flex flex-col gap-3" role="status" aria-label="Result of this vector">
      <p className="flex flex-wrap items-center gap-2 text-sm">
        <Badge tone={result.ok ? 'success' : 'error'} dot>
          {result.ok ? 'Passed' : 'Failed'}
        </Badge>
        <span className="font-mono text-xs text-slate-500">{result.durationMs.toFixed(1)} ms</span>
      </p>
      {result.message && <p className="font-mono text-xs whitespace-pre-wrap text-red-700 dark:text-red-300">{result.message}</p>}
      {!result.ok && (
        <div className="grid gap-3 lg:grid-cols-2">
          <section aria-label="Expected">
            <h3 className="mb-1 text-xs font-semibold text-slate-700 dark:text-slate-300">Expected</h3>
            <pre className={pre}>{JSON.stringify(result.expected ?? null, null, 2)}</pre>
          </section>
          <section aria-label="Actual">
            <h3 className="mb-1 text-xs font-semibold text-slate-700 dark:text-slate-300">Actual</h3>
            <pre className={pre}>{JSON.stringify(result.actual ?? null, null, 2)}</pre>
          </section>
        </div>
      )}
    </div>
  );
}
