import { Button } from '../../../components/button.tsx';
import { Input } from '../../../components/input.tsx';
import { ProgressBar } from '../../../components/progress-bar.tsx';
import type { PropertyProgress } from '../lib/property-worker.ts';
import { plural } from '../../../lib/plural.ts';

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
  const runs = `${progress.runs.toLocaleString('en-GB')} of ${plural(progress.totalRuns, 'run')}`;
  if (progress.phase === 'shrinking') return `Failed at run ${progress.runs.toLocaleString('en-GB')}; shrinking (${progress.shrinkRuns.toLocaleString('en-GB')} tries)…`;
  return runs;
}

export type RunControlsProps = {
  settings: RunSettings;
  onSettings: (next: RunSettings) => void;
  running: boolean;
  progress: PropertyProgress | null;
  onRun: () => void;
  onCancel: () => void;
  /** Why Run is not possible right now (the worker is starting, the fields are wrong). */
  disabledReason?: string;
};

/**
 * Runs, seed, Run and Cancel as items of the editor's tool row (a wrapping flex row), so they stay
 * above the editor; the progress takes a line of its own under them.
 */
export function RunControls({ settings, onSettings, running, progress, onRun, onCancel, disabledReason }: RunControlsProps) {
  const read = readSettings(settings);
  const errors = read.ok ? {} : read.errors;
  const fraction = progress ? (progress.phase === 'shrinking' ? undefined : progress.runs / Math.max(1, progress.totalRuns)) : undefined;
  return (
    <>
      <Input label="Runs" mono inputMode="numeric" className="w-28" value={settings.runs} error={errors.runs} onChange={(e) => onSettings({ ...settings, runs: e.target.value })} disabled={running} />
      <Input
        label="Seed"
        mono
        inputMode="numeric"
        className="w-28"
        title="The same seed gives the same generated inputs everywhere."
        value={settings.seed}
        error={errors.seed}
        onChange={(e) => onSettings({ ...settings, seed: e.target.value })}
        disabled={running}
      />
      {/* pt-5.5: the height of a field's label and gap, so the buttons line up with the inputs. */}
      <div className="flex items-center gap-2 pt-5.5">
        <Button onClick={onRun} loading={running} disabled={!read.ok || disabledReason !== undefined}>
          {running ? 'Running…' : 'Run property'}
        </Button>
        <Button variant="secondary" onClick={onCancel} disabled={!running}>
          Cancel
        </Button>
      </div>
      <p className="basis-full text-xs text-slate-500 dark:text-slate-400">
        {disabledReason && !running ? `${disabledReason} ` : ''}fast-check runs the property with this many generated inputs from this seed; the same seed gives the same inputs everywhere.
      </p>
      {running && (
        <div className="basis-full space-y-1.5" aria-live="polite">
          <ProgressBar fraction={fraction} label="Property runs" />
          <p className="font-mono text-xs text-slate-600 tabular dark:text-slate-400" data-testid="run-progress">
            {progressText(progress)}
          </p>
        </div>
      )}
    </>
  );
}
