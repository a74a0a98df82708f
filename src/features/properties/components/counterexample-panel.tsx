import { lazy, Suspense, useState } from 'react';
import { Badge } from '../../../components/badge.tsx';
import { Button } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import type { CounterexampleRun } from '../../../../workers/property.worker.ts';
import { downloadVector, saveVector } from '../../../lib/save-vector.ts';
import { CounterexampleMessages } from './message-list.tsx';
import { SaveStatus, type SaveState } from './save-status.tsx';
import { plural } from '../../../lib/plural.ts';

// The timeline's parts arrive in their own chunk, once a counterexample is there to draw.
const CounterexampleTimeline = lazy(() => import('./counterexample-timeline.tsx'));

function contractText(run: CounterexampleRun): string {
  const c = run.contract;
  if (!c) return 'no contract';
  return `${c.kind} ${(c.voltageMv / 1_000).toFixed(2)} V · ${(c.currentMa / 1_000).toFixed(2)} A · ${(c.powerMw / 1_000).toFixed(1)} W (object ${c.objectPosition})`;
}

export type CounterexamplePanelProps = {
  run: CounterexampleRun;
  /** The negotiation vector the runner built from the counterexample (counterexampleVector). */
  vector: Record<string, unknown>;
};

/** The shrunk counterexample as a scenario: simulated by the real engine, drawn, and saved as a vector in one click. */
export function CounterexamplePanel({ run, vector }: CounterexamplePanelProps) {
  const [save, setSave] = useState<SaveState>({ kind: 'idle' });
  const errors = run.findings.filter((f) => f.severity === 'error').length;
  const onSave = () => {
    setSave({ kind: 'saving' });
    saveVector(vector).then(
      (outcome) => setSave({ kind: 'done', outcome }),
      (error: unknown) => setSave({ kind: 'failed', error }),
    );
  };
  return (
    <Card aria-labelledby="counterexample-heading" role="region">
      <CardHeader
        title={<span id="counterexample-heading">Counterexample scenario</span>}
        description="The shrunk counterexample is a negotiation scenario: here it is simulated by the real engine, so you can see what happens on the wire."
        actions={
          <>
            <Button size="sm" onClick={onSave} loading={save.kind === 'saving'}>
              Save as negotiation vector
            </Button>
            <Button size="sm" variant="secondary" onClick={() => downloadVector(vector)}>
              Download vector
            </Button>
          </>
        }
      />
      <CardBody className="space-y-4">
        <div className="flex flex-wrap items-center gap-2 text-sm text-slate-700 dark:text-slate-300">
          <span>
            Contract:{' '}
            <span className="font-mono" data-testid="counterexample-contract">
              {contractText(run)}
            </span>
          </span>
          <Badge tone={errors > 0 ? 'error' : 'success'} dot>
            {errors === 1 ? '1 error finding' : `${errors} error findings`}
          </Badge>
          <Badge tone="neutral">{plural(run.messages.length, 'message')}</Badge>
        </div>
        <SaveStatus state={save} />
        <Suspense fallback={<div className="h-80" />}>
          <CounterexampleTimeline run={run} />
        </Suspense>
        <CounterexampleMessages records={run.messageRecords} />
        <details className="text-xs text-slate-600 dark:text-slate-400">
          <summary className="cursor-pointer select-none">The vector it saves ({String(vector.id)})</summary>
          <pre className="mt-2 max-h-72 overflow-auto rounded-md bg-slate-50 p-3 font-mono text-slate-800 dark:bg-slate-950 dark:text-slate-200">{JSON.stringify(vector, null, 2)}</pre>
        </details>
      </CardBody>
    </Card>
  );
}
