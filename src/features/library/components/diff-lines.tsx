// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
import { cn } from '../../../lib/cn.ts';

export type LineChange = { value: string; added?: boolean; removed?: boolean };

/** A line diff as one column: removed lines red with "−", added green with "+". */
export function DiffLines({ changes, label, className }: { changes: readonly LineChange[]; label: string; className?: string }) {
  const lines = changes.flatMap((change) =>
    change.value
      .replace(/\n$/, '')
      .split('\n')
      .map((text) => ({ text, kind: change.added ? 'added' : change.removed ? 'removed' : 'same' })),
  );
  const changed = lines.some((l) => l.kind !== 'same');
  return (
    <div role="region" aria-label={label} className={cn('overflow-auto rounded-md border border-slate-200 bg-white font-mono text-xs dark:border-slate-800 dark:bg-slate-950', className)}>
      {!changed && <p className="p-3 text-slate-500">No difference.</p>}
      {changed &&
        lines.map((line, index) => (
          <div
            key={index}
            data-diff={line.kind}
            className={cn(
              'px-3 whitespace-pre',
              line.kind === 'added' && 'bg-emerald-50 text-emerald-800 dark:bg-emerald-500/10 dark:text-emerald-300',
              line.kind === 'removed' && 'bg-red-50 text-red-800 dark:bg-red-500/10 dark:text-red-300',
              line.kind === 'same' && 'text-slate-600 dark:text-slate-400',
            )}
          >
            <span aria-hidden="true" className="mr-2 inline-block w-3 select-none">
              {line.kind === 'added' ? '+' : line.kind === 'removed' ? '−' : ' '}
            </span>
            {line.text}
          </div>
        ))}
    </div>
  );
}
