/**
 * The Fault sweep page (under Simulate): a scenario (pasted, or opened from a Bench share link),
 * the fault kinds and timer edges, the run count before starting, the sweep in Web Workers with
 * progress, rate and cancel; then the matrix, the outcome classes and the broken runs. A cell opens
 * its run on the Bench; a broken run is shrunk and saved to the team library in one click.
 */
import { useEffect, useMemo, useState } from 'react';
import { useNavigate } from 'react-router';
import { fail, type Result } from '../../../../shared/core/result.ts';
import { OUTCOME_LABELS } from '../../../../shared/sweep/outcome.ts';
import { INVARIANTS } from '../../../../shared/sweep/invariants.ts';
import { summarize } from '../../../../shared/sweep/summary.ts';
import type { SweepFaultKind, SweepOptions, SweepRun } from '../../../../shared/sweep/index.ts';
import { Button } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { ProgressBar } from '../../../components/progress-bar.tsx';
import { Textarea } from '../../../components/textarea.tsx';
import { saveVector } from '../../../lib/save-vector.ts';
import { benchHref, sharedFromHash } from '../../../lib/share-url.ts';
import type { SweepPlanOutput } from '../../../../workers/sweep.worker.ts';
import { OutcomeLegend, SweepMatrix } from '../components/sweep-matrix.tsx';
import { useSweep } from '../lib/use-sweep.ts';
import { plural } from '../../../lib/plural.ts';
import { startServerSweep } from '../api/start-server-sweep.ts';
import { InvariantsHeld } from '../components/invariants-held.tsx';
import { useUser } from '../../../lib/auth.ts';
import { roleGroups, type Role } from '../../../lib/roles.ts';
import { paths } from '../../../config/paths.ts';

/** Who may start a sweep on the server (the API's run starters). */
const runStarters: readonly Role[] = roleGroups.editors;

// Kestrel Devices K27 (5 V 3 A, 9 V 3 A) and a sink asking 9 V 2 A.
const DEMO = { source: { caps: { pdos: ['0x0001912c', '0x0002d12c'] } }, sink: { policy: { kind: 'fixed', voltageMv: 9000, currentMa: 2000 } }, durationMs: 5000, seed: 3 };
const KINDS: { kind: SweepFaultKind; label: string }[] = [
  { kind: 'drop', label: 'Lost (drop)' },
  { kind: 'corrupt', label: 'Bad CRC (corrupt)' },
  { kind: 'delay', label: 'Late (delay)' },
  { kind: 'reject', label: 'Reject' },
  { kind: 'no-ps-rdy', label: 'No PS_RDY' },
];

const INVARIANT_COUNT = INVARIANTS.length;

function initialText(): string {
  const shared = sharedFromHash(window.location.hash);
  return JSON.stringify(shared?.ok ? shared.value : DEMO, null, 2);
}

function parseText(text: string): Result<{ value: Record<string, unknown> }> {
  try {
    const value = JSON.parse(text) as unknown;
    return value && typeof value === 'object' && !Array.isArray(value) ? { ok: true, value: value as Record<string, unknown> } : fail('scenario.invalid', 'The scenario must be a JSON object.');
  } catch (error) {
    return fail('scenario.json', `Not valid JSON: ${error instanceof Error ? error.message : String(error)}`);
  }
}

/** The scenario one run played: the input's own faults and timers, then the run's. */
function scenarioOfRun(input: Record<string, unknown>, run: SweepRun): Record<string, unknown> {
  const faults = [...(Array.isArray(input.faults) ? input.faults : []), ...run.faults];
  const timers = run.timers ? { ...(input.timers as object | undefined), ...run.timers } : input.timers;
  return { ...input, faults, ...(timers ? { timers } : {}) };
}

export function FaultSweepRoute() {
  const [text, setText] = useState(initialText);
  const [kinds, setKinds] = useState<SweepFaultKind[]>(['drop', 'corrupt', 'delay']);
  const [timerEdges, setTimerEdges] = useState(true);
  const [pairs, setPairs] = useState(false);
  const [planned, setPlanned] = useState<SweepPlanOutput | null>(null);
  const [saved, setSaved] = useState<Record<string, string>>({});
  const sweep = useSweep();
  const user = useUser();
  const navigate = useNavigate();
  const [serverStart, setServerStart] = useState<{ busy: boolean; error?: string }>({ busy: false });
  const parsed = useMemo(() => parseText(text), [text]);
  const options: SweepOptions = useMemo(() => ({ kinds, timerEdges, pairs }), [kinds, timerEdges, pairs]);
  const { plan } = sweep;

  useEffect(() => {
    if (!parsed.ok || kinds.length === 0) return setPlanned(null);
    let live = true;
    const timer = setTimeout(
      () =>
        void plan(parsed.value, options).then(
          (p) => live && setPlanned(p),
          () => undefined,
        ),
      250,
    );
    return () => {
      live = false;
      clearTimeout(timer);
    };
  }, [parsed, options, kinds.length, plan]);

  const state = sweep.state;
  const runs = state.phase === 'done' ? state.runs : [];
  const summary = useMemo(() => summarize(runs), [runs]);
  const running = state.phase === 'running';
  const rate = running
    ? Math.round(state.done / Math.max(0.001, (performance.now() - state.startedMs) / 1_000))
    : state.phase === 'done'
      ? Math.round(runs.length / Math.max(0.001, state.elapsedMs / 1_000))
      : null;

  const open = (run: SweepRun) => {
    if (parsed.ok) window.open(benchHref(scenarioOfRun(parsed.value, run), { run: true }), '_blank', 'noopener');
  };
  const runOnServer = async () => {
    if (!parsed.ok) return;
    setServerStart({ busy: true });
    try {
      const { run } = await startServerSweep(parsed.value, { kinds, pairs, timerEdges });
      void navigate(paths.runs.detail.getHref(run.id));
    } catch (error) {
      setServerStart({ busy: false, error: error instanceof Error ? error.message : String(error) });
    }
  };
  const save = async (run: SweepRun) => {
    if (!parsed.ok) return;
    setSaved((s) => ({ ...s, [run.placement]: 'Shrinking…' }));
    try {
      const shrunk = await sweep.shrink(parsed.value, run);
      if (!shrunk.ok) return setSaved((s) => ({ ...s, [run.placement]: shrunk.error.message }));
      const outcome = await saveVector(shrunk.vector);
      setSaved((s) => ({ ...s, [run.placement]: outcome.kind === 'library' ? `Saved to the Library as ${outcome.id}` : `${outcome.reason}: downloaded ${outcome.fileName}` }));
    } catch (error) {
      setSaved((s) => ({ ...s, [run.placement]: `Not saved: ${error instanceof Error ? error.message : String(error)}` }));
    }
  };

  return (
    <div className="space-y-6">
      <PageHeader
        eyebrow="Simulate"
        title="Fault sweep"
        description="Run a scenario once fault-free, then once for every placement of each fault on every message and every timer at the ends of its range, and judge each run by invariants."
      />
      <Card>
        <CardHeader title="Campaign" description="Paste a scenario (or open one from the Bench with its share link). The sweep runs in your browser." />
        <CardBody className="space-y-4">
          <Textarea label="Scenario (JSON)" mono rows={10} value={text} onChange={(e) => setText(e.target.value)} error={parsed.ok ? undefined : parsed.error.message} spellCheck={false} />
          <fieldset className="flex flex-wrap gap-x-5 gap-y-2 text-sm">
            <legend className="mb-1 text-sm font-medium">Faults on every message</legend>
            {KINDS.map(({ kind, label }) => (
              <label key={kind} className="flex items-center gap-1.5">
                <input type="checkbox" checked={kinds.includes(kind)} onChange={(e) => setKinds((k) => (e.target.checked ? [...k, kind] : k.filter((x) => x !== kind)))} />
                {label}
              </label>
            ))}
          </fieldset>
          <div className="flex flex-wrap gap-x-5 gap-y-2 text-sm">
            <label className="flex items-center gap-1.5">
              <input type="checkbox" checked={timerEdges} onChange={(e) => setTimerEdges(e.target.checked)} /> Each timer at its minimum and maximum
            </label>
            <label className="flex items-center gap-1.5">
              <input type="checkbox" checked={pairs} onChange={(e) => setPairs(e.target.checked)} /> Every pair of faults
            </label>
          </div>
          <div className="flex flex-wrap items-center gap-3">
            <Button disabled={!planned?.ok || running} onClick={() => planned?.ok && parsed.ok && void sweep.start(parsed.value, options, planned.runs)}>
              Start sweep
            </Button>
            {running && (
              <Button variant="secondary" onClick={sweep.cancel}>
                Cancel
              </Button>
            )}
            {runStarters.includes(user.role) && (
              <Button
                variant="secondary"
                disabled={!planned?.ok || serverStart.busy}
                onClick={() => void runOnServer()}
                title="Run the campaign on the server for the team; it is listed with the runs"
              >
                {serverStart.busy ? 'Starting…' : 'Run on the server'}
              </Button>
            )}
            <p className="text-sm text-slate-600 dark:text-slate-300" data-testid="run-count">
              {planned === null
                ? 'Working out the runs…'
                : planned.ok
                  ? `${plural(planned.runs, 'run')} over ${plural(planned.messages.length, 'message')} of the fault-free run`
                  : planned.error.message}
            </p>
          </div>
          {running && <ProgressBar fraction={state.done / Math.max(1, state.total)} label="Sweep progress" />}
          {rate !== null && (
            <p className="text-xs text-slate-500" data-testid="sweep-rate">
              {running ? `${state.done} of ${state.total} runs` : plural(runs.length, 'run')} · {rate.toLocaleString('en-US')} runs/s
            </p>
          )}
          {serverStart.error && (
            <p className="text-sm text-red-700 dark:text-red-300" role="alert">
              The server did not start the sweep: {serverStart.error}
            </p>
          )}
          {state.phase === 'cancelled' && <p className="text-sm text-slate-600">Cancelled. Start again to run the whole campaign.</p>}
          {state.phase === 'failed' && <p className="text-sm text-red-700">The sweep failed: {state.message}</p>}
        </CardBody>
      </Card>

      {state.phase === 'done' && planned?.ok && (
        <>
          <Card>
            <CardHeader title="Matrix" description="Messages of the fault-free run × fault kinds. Click a cell to open that run's timeline on the Bench." />
            <CardBody className="space-y-3">
              <OutcomeLegend />
              <SweepMatrix messages={planned.messages} columns={planned.columns} runs={runs} onOpen={open} />
            </CardBody>
          </Card>
          <Card>
            <CardHeader title="Outcomes" />
            <CardBody>
              <ul className="space-y-1 text-sm" data-testid="sweep-outcomes">
                {summary.outcomes.map((o) => (
                  <li key={o.outcome}>
                    <span className="font-medium">{OUTCOME_LABELS[o.outcome]}</span>: {o.runs} run{o.runs === 1 ? '' : 's'}, e.g. <span className="font-mono">{o.example.run}</span>
                  </li>
                ))}
              </ul>
            </CardBody>
          </Card>
          <Card>
            <CardHeader
              title={summary.brokenCount === 0 ? 'Every invariant held' : `${summary.brokenCount} run${summary.brokenCount === 1 ? '' : 's'} broke an invariant`}
              description={`${runs.length.toLocaleString('en-US')} runs judged by ${INVARIANT_COUNT} invariants. ${summary.outcomes.map((o) => `${OUTCOME_LABELS[o.outcome]}: ${o.runs.toLocaleString('en-US')}`).join(' · ')}.`}
            />
            <CardBody className="space-y-4">
              <InvariantsHeld runs={runs} />
              <ul className="space-y-3 text-sm empty:hidden" data-testid="sweep-broken">
                {runs
                  .filter((r) => r.broken.length > 0)
                  .map((run) => (
                    <li key={run.placement} className="space-y-1">
                      <p>
                        <span className="font-mono font-medium">{run.placement}</span> · <span className="font-mono">{run.broken[0]!.invariant}</span>: {run.broken[0]!.message}
                      </p>
                      <div className="flex flex-wrap items-center gap-2">
                        <Button size="sm" variant="secondary" onClick={() => open(run)}>
                          Open on the Bench
                        </Button>
                        <Button
                          size="sm"
                          onClick={() => void save(run)}
                          disabled={saved[run.placement] !== undefined && saved[run.placement] !== 'Shrinking…' && !saved[run.placement]!.startsWith('Not saved')}
                        >
                          Save to Library
                        </Button>
                        {saved[run.placement] && (
                          <span className="text-xs text-slate-600 dark:text-slate-300" role="status">
                            {saved[run.placement]}
                          </span>
                        )}
                      </div>
                    </li>
                  ))}
              </ul>
            </CardBody>
          </Card>
        </>
      )}
    </div>
  );
}
