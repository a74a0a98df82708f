import { Button } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { Input } from '../../../components/input.tsx';
import { ProgressBar } from '../../../components/progress-bar.tsx';
import type { PropertyProgress } from '../lib/property-worker.ts';

export type RunSettings = { runs: string; seed: string };

export const MAX_RUNS = 1_000_000;

/** "runs: …" / "seed: …" problems with the fields, or the numbers. */
export function readSettings(settings: RunSettings): { ok: true; runs: number; seed: number } | { ok: false; errors: Partial<Record<keyof RunSettings, string>> } {
  const errors: Partial<Record<keyof RunSettings, string>> = {};
  const runs = Number(settings.runs);
  const seed = Number(settings.seed);
  if (!/^\d+$/.test(settings.runs.trim()) || runs < 1 || runs > MAX_RUNS) errors.runs = `a whole number from 1 to ${MAX_RUNS.toLocaleString('en-GB')}`;
  if (!/^-?\d+$/.test(settings.seed.trim()) || !Number.isSafeInteger(seed)) errors.seed = 'a whole number';
  return Object.keys(errors).length > 0 ? { ok: false, errors } : { ok: true, runs, seed };
}

function progressText(progress: PropertyProgress | null): string {
  if (!progress) return 'Starting the worker…';
  const runs = `${progress.runs.toLocaleString('en-GB')} of ${progress.totalRuns.toLocaleString('en-GB')} runs`;
  if (progress.phase === 'shrinking') return `Failed at run ${progress.runs.toLocaleString('en-GB')}; shrinking (${progress.shrinkRuns.toLocaleString('en-GB')} tries)…`;
  return runs;
}

export type RunPanelProps = {
  settings: RunSettings;
  onSettings: (next: RunSettings) => void;
  running: boolean;
  progress: PropertyProgress | null;
  onRun: () => void;
  onCancel: () => void;
  /** Why Run is not possible right now (the worker is starting, the fields are wrong). */
  disabledReason?: string;
};

export function RunPanel({ settings, onSettings, running, progress, onRun, onCancel, disabledReason }: RunPanelProps) {
  const read = readSettings(settings);
  const errors = read.ok ? {} : read.errors;
  const fraction = progress ? (progress.phase === 'shrinking' ? undefined : progress.runs / Math.max(1, progress.totalRuns)) : undefined;
  return (
    <Card aria-labelledby="run-heading">
      <CardHeader title={<span id="run-heading">Run</span>} description="fast-check runs the property with this many generated inputs from this seed; the same seed gives the same inputs everywhere." />
      <CardBody className="space-y-4">
        <div className="grid grid-cols-2 gap-3">
          <Input label="Runs" mono inputMode="numeric" value={settings.runs} error={errors.runs} onChange={(e) => onSettings({ ...settings, runs: e.target.value })} disabled={running} />
          <Input label="Seed" mono inputMode="numeric" value={settings.seed} error={errors.seed} onChange={(e) => onSettings({ ...settings, seed: e.target.value })} disabled={running} />
        </div>
        <div className="flex items-center gap-2">
          <Button onClick={onRun} loading={running} disabled={!read.ok || disabledReason !== undefined}>
            {running ? 'Running…' : 'Run property'}
          </Button>
          <Button variant="secondary" onClick={onCancel} disabled={!running}>
            Cancel
          </Button>
          {disabledReason && !running && <span className="text-xs text-slate-500">{disabledReason}</span>}
        </div>
        {running && (
          <div className="space-y-1.5" aria-live="polite">
            <ProgressBar fraction={fraction} label="Property runs" />
            <p className="font-mono text-xs text-slate-600 tabular dark:text-slate-400" data-testid="run-progress">
              {progressText(progress)}
            </p>
          </div>
        )}
      </CardBody>
    </Card>
  );
}
