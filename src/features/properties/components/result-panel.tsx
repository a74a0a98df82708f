import type { ReactNode } from 'react';
import { Badge } from '../../../components/badge.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import type { PropertyCheck } from '../lib/property-worker.ts';
import { plural } from '../../../lib/plural.ts';

export type RunOutcome = { kind: 'checked'; check: Extract<PropertyCheck, { ok: true }>; expectHolds: boolean } | { kind: 'error'; message: string } | { kind: 'cancelled'; runs: number };

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div>
      <dt className="text-[11px] font-medium text-slate-500 uppercase dark:text-slate-400">{label}</dt>
      <dd className="font-mono text-sm text-slate-900 tabular dark:text-slate-100">{children}</dd>
    </div>
  );
}

/** The verdict: holds or fails, with runs, seed, shrinks and the shrunk counterexample. */
export function ResultPanel({ outcome }: { outcome: RunOutcome | null }) {
  return (
    <Card aria-labelledby="result-heading" role="region">
      <CardHeader title={<span id="result-heading">Result</span>} />
      <CardBody className="space-y-4" data-testid="property-result">
        {outcome === null && <p className="text-sm text-slate-500">Run the property to see whether it holds.</p>}
        {outcome?.kind === 'cancelled' && <p className="text-sm text-slate-700 dark:text-slate-300">Cancelled after {plural(outcome.runs, 'run')}. Nothing was decided.</p>}
        {outcome?.kind === 'error' && (
          <p role="alert" className="rounded-md border border-red-200 bg-red-50 px-3 py-2 text-sm text-red-800 dark:border-red-500/30 dark:bg-red-500/10 dark:text-red-200">
            {outcome.message}
          </p>
        )}
        {outcome?.kind === 'checked' && <Verdict check={outcome.check} expectHolds={outcome.expectHolds} />}
      </CardBody>
    </Card>
  );
}

function Verdict({ check, expectHolds }: { check: Extract<PropertyCheck, { ok: true }>; expectHolds: boolean }) {
  const property = check.result.property;
  if (!property) return <p className="text-sm text-slate-500">{check.result.message ?? 'No outcome.'}</p>;
  if (property.error) {
    return (
      <p role="alert" className="rounded-md border border-red-200 bg-red-50 px-3 py-2 text-sm text-red-800 dark:border-red-500/30 dark:bg-red-500/10 dark:text-red-200">
        {property.error.message}
      </p>
    );
  }
  const asExpected = property.holds === expectHolds;
  return (
    <>
      <div className="flex flex-wrap items-center gap-2">
        <span data-testid="verdict" className={property.holds ? 'text-lg font-semibold text-emerald-700 dark:text-emerald-400' : 'text-lg font-semibold text-red-700 dark:text-red-400'}>
          {property.holds ? 'Holds' : 'Fails'}
        </span>
        <Badge tone={asExpected ? 'success' : 'warning'} dot>
          {asExpected ? 'as the vector expects' : `the vector expects it to ${expectHolds ? 'hold' : 'fail'}`}
        </Badge>
      </div>
      <dl className="grid grid-cols-2 gap-x-4 gap-y-2 sm:grid-cols-4">
        <Fact label="Runs">{property.numRuns.toLocaleString('en-GB')}</Fact>
        <Fact label="Seed">{property.seed}</Fact>
        <Fact label="Shrinks">{property.numShrinks ?? '—'}</Fact>
        <Fact label="Time">{property.durationMs === undefined ? '—' : `${Math.round(property.durationMs).toLocaleString('en-GB')} ms`}</Fact>
      </dl>
      {!property.holds && (
        <div className="space-y-2">
          {property.failure && (
            <p className="text-sm text-slate-800 dark:text-slate-200">
              <span className="font-medium">Why it failed:</span> <span data-testid="failure">{property.failure}</span>
            </p>
          )}
          <div>
            <h3 className="mb-1 text-xs font-medium text-slate-500 dark:text-slate-400">Shrunk counterexample</h3>
            <pre data-testid="counterexample-json" className="max-h-80 overflow-auto rounded-md bg-slate-50 p-3 font-mono text-xs text-slate-800 dark:bg-slate-950 dark:text-slate-200">
              {JSON.stringify(property.counterexample, null, 2)}
            </pre>
          </div>
          {property.path !== undefined && (
            <p className="text-xs text-slate-500 dark:text-slate-400">
              Replay exactly this failure with seed <span className="font-mono">{property.seed}</span> and path <span className="font-mono">{property.path}</span>.
            </p>
          )}
        </div>
      )}
    </>
  );
}
