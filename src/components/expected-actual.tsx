import type { ReactNode } from 'react';
import { Badge } from './badge.tsx';
import { cn } from '../lib/cn.ts';

/** JSON, two-space indented, in a scrolling monospace block; `className` replaces the default max-h-96. */
export function JsonBlock({ value, className }: { value: unknown; className?: string }) {
  return (
    <pre
      className={cn(
        'overflow-auto rounded-md border border-slate-200 bg-slate-50 p-3 font-mono text-xs whitespace-pre text-slate-700 dark:border-slate-800 dark:bg-slate-950 dark:text-slate-300',
        className ?? 'max-h-96',
      )}
    >
      {JSON.stringify(value ?? null, null, 2)}
    </pre>
  );
}

/** A vector's verdict line: Passed or Failed, anything the caller adds, the run time; then the runner's message. */
export function ResultSummary({ ok, durationMs, message, children }: { ok: boolean; durationMs: number; message?: string | null; children?: ReactNode }) {
  return (
    <>
      <p className="flex flex-wrap items-center gap-2 text-sm">
        <Badge tone={ok ? 'success' : 'error'} dot>
          {ok ? 'Passed' : 'Failed'}
        </Badge>
        {children}
        <span className="font-mono text-xs text-slate-500">{durationMs.toFixed(1)} ms</span>
      </p>
      {message && <p className="font-mono text-xs whitespace-pre-wrap text-red-700 dark:text-red-300">{message}</p>}
    </>
  );
}

/** What a vector expected beside what came out, side by side where there is room. */
export function ExpectedActual({ expected, actual, blockClassName }: { expected: unknown; actual: unknown; blockClassName?: string }) {
  return (
    <div className="grid gap-3 lg:grid-cols-2">
      <section aria-label="Expected">
        <h3 className="mb-1 text-xs font-semibold text-slate-700 dark:text-slate-300">Expected</h3>
        <JsonBlock value={expected} className={blockClassName} />
      </section>
      <section aria-label="Actual">
        <h3 className="mb-1 text-xs font-semibold text-slate-700 dark:text-slate-300">Actual</h3>
        <JsonBlock value={actual} className={blockClassName} />
      </section>
    </div>
  );
}
