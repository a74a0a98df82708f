import type { ReactNode } from 'react';
import { Button } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { ProgressBar } from '../../../components/progress-bar.tsx';
import type { BenchRun, SimulationState } from '../lib/use-simulation.ts';
import { ContractSummary } from './run-summary.tsx';

export type RunPanelProps = {
  state: SimulationState;
  shown: BenchRun | null;
  onCancel(): void;
  onShare(): void;
  shareUrl: string | null;
  /** Why the run may not reflect the JSON view or the form (shown above the result). */
  warnings: ReactNode;
};

/** Run and its outcome at a glance: progress, the contract reached and the run's size. */
export function RunPanel({ state, shown, onCancel, onShare, shareUrl, warnings }: RunPanelProps) {
  const running = state.status === 'running';
  return (
    <Card>
      <CardHeader
        title="Run"
        description="The simulation runs in a background worker; the page stays responsive."
        actions={
          <>
            <Button variant="secondary" size="sm" onClick={onShare}>
              Share link
            </Button>
            {running ? (
              <Button variant="danger" size="sm" onClick={onCancel}>
                Cancel
              </Button>
            ) : null}
            <Button type="submit" form="bench-scenario" size="sm" loading={running}>
              Run
            </Button>
          </>
        }
      />
      <CardBody className="flex flex-col gap-3">
        {running && <ProgressBar fraction={state.fraction} label="Simulation progress" />}
        {state.status === 'cancelled' && <p className="text-sm text-slate-600 dark:text-slate-400">Run cancelled.</p>}
        {state.status === 'failed' && (
          <p role="alert" className="text-sm text-red-600 dark:text-red-400">
            {state.message}
          </p>
        )}
        {warnings}
        {shareUrl && (
          <label className="flex flex-col gap-1 text-xs text-slate-600 dark:text-slate-400">
            Link to this scenario (copied to the clipboard)
            <input
              readOnly
              value={shareUrl}
              aria-label="Share link"
              onFocus={(event) => event.currentTarget.select()}
              className="h-8 rounded border border-slate-300 bg-slate-50 px-2 font-mono text-[11px] dark:border-slate-700 dark:bg-slate-950"
            />
          </label>
        )}
        {shown ? (
          <>
            <ContractSummary contract={shown.contract} contracts={shown.contracts} endUs={shown.endUs} />
            <p className="text-xs text-slate-500 dark:text-slate-400" data-testid="run-stats">
              {shown.events.length} records, {shown.samples.count.toLocaleString('en-GB')} samples, {shown.findings.length} {shown.findings.length === 1 ? 'finding' : 'findings'} · simulated{' '}
              {(shown.endUs / 1_000).toLocaleString('en-GB')} ms in {shown.elapsedMs} ms
            </p>
          </>
        ) : (
          !running && <p className="text-sm text-slate-600 dark:text-slate-400">Run the scenario to see the contract, the findings and the timeline here.</p>
        )}
      </CardBody>
    </Card>
  );
}
