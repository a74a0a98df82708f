import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { Link } from 'react-router';
import type { Run } from '../../../../shared/api/index.ts';
import { OUTCOME_LABELS } from '../../../../shared/sweep/outcome.ts';
import { paths } from '../../../config/paths.ts';
import { shareHash } from '../../../lib/share-url.ts';

/** A server sweep's campaign: outcome classes with counts and an example each, and the invariants every run was judged by. */
export function SweepRunSummary({ run }: { run: Run }) {
  const sweep = run.sweep;
  if (!sweep) return null;
  const running = run.status === 'running';
  return (
    <Card className="mb-4" role="region" aria-label="Sweep outcomes">
      <CardHeader
        title="Fault sweep"
        description={`${run.total.toLocaleString('en-US')} runs over ${sweep.messages} messages of the fault-free run; ${sweep.broken === 0 ? (running ? 'no broken run so far' : 'every invariant held') : `${sweep.broken.toLocaleString('en-US')} broke an invariant (listed below)`}.`}
        actions={
          <Link className="text-xs font-medium text-amber-700 underline dark:text-amber-400" to={`${paths.sweep.getHref()}${shareHash(sweep.scenario)}`}>
            Open the scenario on the Fault sweep page
          </Link>
        }
      />
      <CardBody className="grid gap-6 md:grid-cols-2">
        <section aria-label="Outcome classes">
          <h3 className="mb-2 text-xs font-semibold tracking-wide text-slate-500 uppercase">Outcomes</h3>
          {running ? (
            <p className="text-sm text-slate-500">Counted when the sweep ends.</p>
          ) : (
            <ul className="space-y-1 text-sm" data-testid="sweep-run-outcomes">
              {sweep.outcomes.map((o) => (
                <li key={o.outcome}>
                  <span className="font-medium">{OUTCOME_LABELS[o.outcome]}</span>: {o.runs.toLocaleString('en-US')} run{o.runs === 1 ? '' : 's'}, e.g.{' '}
                  <span className="font-mono">{o.example.run}</span>
                </li>
              ))}
            </ul>
          )}
        </section>
        <section aria-label="Invariants">
          <h3 className="mb-2 text-xs font-semibold tracking-wide text-slate-500 uppercase">Invariants judged</h3>
          <ul className="space-y-2 text-sm">
            {sweep.invariants.map((invariant) => (
              <li key={invariant.id}>
                <p>
                  <span className="font-medium">{invariant.title}</span> <span className="font-mono text-xs text-slate-500">{invariant.id}</span>
                </p>
                <p className="text-xs text-slate-600 dark:text-slate-300">{invariant.explanation}</p>
              </li>
            ))}
          </ul>
        </section>
      </CardBody>
    </Card>
  );
}
