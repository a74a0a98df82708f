import { INVARIANTS } from '../../../../shared/sweep/invariants.ts';
import type { SweepRun } from '../../../../shared/sweep/run-placement.ts';

/** Each invariant every run was judged by, its one-sentence explanation, and in how many runs it held. */
export function InvariantsHeld({ runs }: { runs: readonly SweepRun[] }) {
  return (
    <ul className="space-y-2 text-sm" data-testid="sweep-invariants">
      {INVARIANTS.map((invariant) => {
        const broken = runs.filter((run) => run.broken.some((b) => b.invariant === invariant.id)).length;
        return (
          <li key={invariant.id}>
            <p>
              <span className="font-medium">{invariant.title}</span> <span className="font-mono text-xs text-slate-500">{invariant.id}</span>
              <span className={broken === 0 ? 'text-emerald-700 dark:text-emerald-400' : 'text-red-700 dark:text-red-400'}>
                {' '}
                · {broken === 0 ? `held in all ${runs.length.toLocaleString('en-US')} runs` : `broken in ${broken.toLocaleString('en-US')} of ${runs.length.toLocaleString('en-US')} runs`}
              </span>
            </p>
            <p className="text-xs text-slate-600 dark:text-slate-300">{invariant.explanation}</p>
          </li>
        );
      })}
    </ul>
  );
}
