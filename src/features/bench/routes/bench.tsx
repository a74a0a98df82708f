import { memo, useCallback, useEffect, useMemo, useRef, useState, type FormEvent } from 'react';
import { FormProvider, useForm, type UseFormReturn } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useSearchParams } from 'react-router';
import type { ScenarioInput } from '../../../../shared/sim/scenario.ts';
import { Button } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { EmptyState } from '../../../components/empty-state.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { ProgressBar } from '../../../components/progress-bar.tsx';
import type { TimeWindow } from '../../../components/timeline/time-window.ts';
import { cn } from '../../../lib/cn.ts';
import { useIsDark } from '../../../lib/theme.ts';
import { useTrace } from '../../../lib/api/get-trace.ts';
import { BenchTimeline } from '../components/bench-timeline.tsx';
import { ExportPanel } from '../components/export-panel.tsx';
import { MessagePanel } from '../components/message-panel.tsx';
import { ContractSummary, FindingsTable } from '../components/run-summary.tsx';
import { ScenarioForm } from '../components/scenario-form.tsx';
import { ScenarioJson } from '../components/scenario-json.tsx';
import { benchFormResolverSchema, defaultScenario, formOfScenario, parseScenarioText, scenarioOfForm, type BenchFormValues } from '../lib/form-model.ts';
import { capturedMessagesOf, scenarioFromMessages } from '../lib/scenario-from-trace.ts';
import { shareHash, sharedFromHash } from '../../../lib/share-url.ts';
import type { RunMessage } from '../lib/timeline-data.ts';
import { useSimulation } from '../lib/use-simulation.ts';
import { fail, type Result } from '../../../../shared/core/result.ts';

/** The JSON view's text: two-space indent, keys in the order people read a scenario (source first). */
const scenarioText = (scenario: ScenarioInput) => `${JSON.stringify(scenario, null, 2)}\n`;

type Loaded = { input: ScenarioInput; values: BenchFormValues };

/** Scenario JSON text as the form's values, or the reason it cannot be shown ("field: message"). */
function loadText(text: string): Result<{ loaded: Loaded }> {
  const parsed = parseScenarioText(text);
  if (!parsed.ok) return parsed;
  const form = formOfScenario(parsed.scenario);
  if (!form.ok) return form;
  return { ok: true, loaded: { input: parsed.input, values: form.values } };
}

const load = (input: unknown) => loadText(JSON.stringify(input ?? null));

function initialScenario(): { loaded: Loaded; notice: string | null } {
  const fallback = load(defaultScenario);
  if (!fallback.ok) throw new Error(fallback.error.message);
  const shared = sharedFromHash(window.location.hash);
  if (!shared) return { loaded: fallback.loaded, notice: null };
  if (!shared.ok) return { loaded: fallback.loaded, notice: shared.error.message };
  const result = load(shared.value);
  return result.ok
    ? { loaded: result.loaded, notice: 'Opened the shared scenario from the link.' }
    : { loaded: fallback.loaded, notice: `The shared scenario could not be opened: ${result.error.message}` };
}

function SafetyNote() {
  return (
    <aside aria-label="Safety" className="mb-5 rounded-md border border-amber-300/70 bg-amber-50 px-4 py-2.5 text-xs text-amber-950 dark:border-amber-400/30 dark:bg-amber-400/10 dark:text-amber-100">
      <strong className="font-semibold">Simulation only.</strong> Nothing here drives hardware. Real adapters deliver up to 48 V and 5 A: before you reproduce a scenario on a bench, follow the USB PD
      and Type-C specifications, your certified test lab’s procedures and local electrical codes.
    </aside>
  );
}

/**
 * The form on its own, memoised: progress updates and results re-render the page many times a
 * second, and the form's hundred inputs need not follow.
 */
const ScenarioFormPanel = memo(function ScenarioFormPanel({ form, hidden, onSubmit }: { form: UseFormReturn<BenchFormValues>; hidden: boolean; onSubmit(event: FormEvent): Promise<void> }) {
  return (
    <FormProvider {...form}>
      <form id="bench-scenario" aria-label="Scenario" onSubmit={(event) => void onSubmit(event)} noValidate className={hidden ? 'hidden' : ''}>
        <ScenarioForm />
      </form>
    </FormProvider>
  );
});

export function BenchRoute() {
  const [initial] = useState(initialScenario);
  const [notice, setNotice] = useState<string | null>(initial.notice);
  const baseRef = useRef<ScenarioInput>(initial.loaded.input);
  const applyingRef = useRef(false);
  const [jsonText, setJsonText] = useState(() => scenarioText(initial.loaded.input));
  const [jsonError, setJsonError] = useState<string | null>(null);
  const [tab, setTab] = useState<'form' | 'json'>('form');
  const [shareUrl, setShareUrl] = useState<string | null>(null);
  const [window_, setWindow] = useState<TimeWindow>({ startUs: 0, endUs: 1 });
  const [selected, setSelected] = useState<{ index: number; message: RunMessage } | null>(null);
  const timelineRef = useRef<HTMLDivElement>(null);
  const dark = useIsDark();
  const simulation = useSimulation();
  const { state, lastRun } = simulation;

  const form = useForm<BenchFormValues>({ resolver: zodResolver(benchFormResolverSchema), defaultValues: initial.loaded.values, mode: 'onChange' });

  const apply = useCallback(
    (loaded: Loaded) => {
      applyingRef.current = true;
      baseRef.current = loaded.input;
      form.reset(loaded.values);
      applyingRef.current = false;
    },
    [form],
  );

  // Form → JSON: every valid change rewrites the text; an invalid form leaves the text alone.
  useEffect(() => {
    const subscription = form.watch((values) => {
      if (applyingRef.current) return;
      const parsed = benchFormResolverSchema.safeParse(values);
      if (!parsed.success) return;
      const mapped = scenarioOfForm(parsed.data, baseRef.current);
      if (!mapped.ok) return;
      baseRef.current = mapped.scenario;
      setJsonText(scenarioText(mapped.scenario));
      setJsonError(null);
    });
    return () => subscription.unsubscribe();
  }, [form]);

  // JSON → form: a valid scenario replaces the form; an invalid one shows why and keeps the text.
  const onJsonChange = useCallback(
    (text: string) => {
      setJsonText(text);
      const result = loadText(text);
      if (!result.ok) {
        setJsonError(result.error.message);
        return;
      }
      setJsonError(null);
      apply(result.loaded);
    },
    [apply],
  );

  // /bench?fromTrace=<id>: the stored trace's offers, the sink's choices and timing.
  const [searchParams] = useSearchParams();
  const fromTrace = searchParams.get('fromTrace');
  const trace = useTrace(initial.notice === null ? fromTrace : null);
  const appliedTrace = useRef<string | null>(null);
  useEffect(() => {
    if (!fromTrace || !trace.data || appliedTrace.current === fromTrace) return;
    appliedTrace.current = fromTrace;
    const captured = capturedMessagesOf(trace.data);
    const derived = captured ? scenarioFromMessages(captured.messages, { endUs: captured.endUs }) : fail('trace.no-timeline', 'The trace has no timeline to read.');
    const loaded = derived.ok ? load(derived.scenario) : derived;
    if (!loaded.ok) {
      setNotice(`Trace ${fromTrace} could not be opened as a scenario: ${loaded.error.message}`);
      return;
    }
    apply(loaded.loaded);
    setJsonText(scenarioText(loaded.loaded.input));
    setNotice(`Opened trace ${fromTrace} as a scenario. ${derived.ok ? derived.notes.join(' ') : ''} Change one thing and run it to see what would have happened.`);
  }, [fromTrace, trace.data, apply]);
  useEffect(() => {
    if (fromTrace && trace.isError) setNotice(`Trace ${fromTrace} could not be loaded: ${trace.error instanceof Error ? trace.error.message : 'unknown error'}`);
  }, [fromTrace, trace.isError, trace.error]);

  // A new run shows whole; the selection belongs to the old run.
  const [windowFor, setWindowFor] = useState<unknown>(null);
  if (state.status === 'done' && windowFor !== state.run) {
    // Adjusting state while rendering (not in an effect) keeps this inside the run's transition.
    setWindowFor(state.run);
    setWindow({ startUs: 0, endUs: Math.max(1, state.run.endUs) });
    setSelected(null);
  }

  const { start } = simulation;
  const submit = useMemo(
    () =>
      form.handleSubmit((values) => {
        const mapped = scenarioOfForm(values, baseRef.current);
        if (!mapped.ok) return;
        void start(mapped.scenario);
      }),
    [form, start],
  );

  const share = async () => {
    const values = benchFormResolverSchema.safeParse(form.getValues());
    if (!values.success) {
      void form.trigger();
      return;
    }
    const mapped = scenarioOfForm(values.data, baseRef.current);
    if (!mapped.ok) return;
    const url = `${window.location.origin}${window.location.pathname}${shareHash(mapped.scenario)}`;
    window.history.replaceState(null, '', url);
    setShareUrl(url);
    try {
      await navigator.clipboard.writeText(url);
    } catch {
      // The link is shown in a field as well; copying is a convenience.
    }
  };

  const running = state.status === 'running';
  const shown = state.status === 'done' ? state.run : lastRun;
  const chartSvg = useCallback(() => timelineRef.current?.querySelector<SVGSVGElement>('[data-testid="vbus-chart"] svg.recharts-surface') ?? null, []);
  const findingsCount = useMemo(() => shown?.findings.length ?? 0, [shown]);

  return (
    <div>
      <PageHeader
        eyebrow="Simulate"
        title="Bench"
        description="Describe a source, a sink, a cable and the faults to inject; run it and read every message, timer, state and volt of the negotiation."
      />
      <SafetyNote />
      {notice && (
        <p role="status" className="mb-4 flex items-start justify-between gap-3 rounded-md bg-sky-50 px-4 py-2 text-sm text-sky-900 dark:bg-sky-500/10 dark:text-sky-100">
          <span>{notice}</span>
          <button type="button" className="text-xs underline" onClick={() => setNotice(null)}>
            Dismiss
          </button>
        </p>
      )}

      <div className="grid grid-cols-1 gap-5 xl:grid-cols-[minmax(0,34rem)_minmax(0,1fr)]">
        <Card>
          <CardHeader
            title="Scenario"
            actions={
              <div role="tablist" aria-label="Scenario view" className="flex rounded-md bg-slate-100 p-0.5 dark:bg-slate-800">
                {(['form', 'json'] as const).map((value) => (
                  <button
                    key={value}
                    type="button"
                    role="tab"
                    aria-selected={tab === value}
                    className={cn(
                      'rounded px-3 py-1 text-xs font-medium',
                      tab === value ? 'bg-white text-slate-900 shadow-xs dark:bg-slate-950 dark:text-slate-50' : 'text-slate-600 dark:text-slate-400',
                    )}
                    onClick={() => setTab(value)}
                  >
                    {value === 'form' ? 'Form' : 'JSON'}
                    {value === 'json' && jsonError && <span className="ml-1 text-red-600">•</span>}
                  </button>
                ))}
              </div>
            }
          />
          <CardBody>
            <ScenarioFormPanel form={form} hidden={tab !== 'form'} onSubmit={submit} />
            {tab === 'json' && <ScenarioJson text={jsonText} error={jsonError} onChange={onJsonChange} />}
          </CardBody>
        </Card>

        <div className="flex min-w-0 flex-col gap-5">
          <Card>
            <CardHeader
              title="Run"
              description="The simulation runs in a background worker; the page stays responsive."
              actions={
                <>
                  <Button variant="secondary" size="sm" onClick={() => void share()}>
                    Share link
                  </Button>
                  {running ? (
                    <Button variant="danger" size="sm" onClick={simulation.cancel}>
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
              {jsonError && <p className="text-xs text-amber-800 dark:text-amber-300">The JSON view has an error; Run uses the last valid scenario (the form).</p>}
              {Object.keys(form.formState.errors).length > 0 && (
                <p role="alert" className="text-xs text-red-600 dark:text-red-400">
                  Fix the highlighted fields in the form before running.
                </p>
              )}
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
                    {shown.events.length} records, {shown.samples.count.toLocaleString('en-GB')} samples, {findingsCount} findings · simulated {(shown.endUs / 1_000).toLocaleString('en-GB')} ms in{' '}
                    {shown.elapsedMs} ms
                  </p>
                </>
              ) : (
                !running && <p className="text-sm text-slate-600 dark:text-slate-400">Run the scenario to see the contract, the findings and the timeline.</p>
              )}
            </CardBody>
          </Card>
          {shown && (
            <Card>
              <CardHeader title="Findings" description="The same checks that run on captured traces, over the simulated one." />
              <CardBody>
                <FindingsTable findings={shown.findings} onSelectTime={(tUs) => setWindow({ startUs: Math.max(0, tUs - 20_000), endUs: Math.min(shown.endUs, tUs + 20_000) })} />
              </CardBody>
            </Card>
          )}
        </div>
      </div>

      <div className="mt-5 flex flex-col gap-5">
        {shown ? (
          <>
            <Card>
              <CardHeader title="Timeline" description="Drag the handles under the chart to zoom; click a message to read it." />
              <CardBody className={cn('grid gap-4', selected && 'lg:grid-cols-[minmax(0,1fr)_24rem]')}>
                <div ref={timelineRef} className="min-w-0">
                  <BenchTimeline
                    run={shown}
                    window={window_}
                    onWindowChange={setWindow}
                    selectedIndex={selected?.index ?? null}
                    onSelectMessage={(index, message) => setSelected({ index, message })}
                    onSelectFinding={(index) => {
                      const tUs = shown.findings[index]?.t;
                      if (tUs !== undefined) setWindow({ startUs: Math.max(0, tUs - 20_000), endUs: Math.min(shown.endUs, tUs + 20_000) });
                    }}
                    dark={dark}
                  />
                </div>
                {selected && <MessagePanel selected={selected.message} onClose={() => setSelected(null)} />}
              </CardBody>
            </Card>
            <Card>
              <CardHeader title="Export" description="Take the run elsewhere: as a trace, as samples, as a picture, or as a test vector." />
              <CardBody>
                <ExportPanel run={shown} chartSvg={chartSvg} dark={dark} />
              </CardBody>
            </Card>
          </>
        ) : (
          <EmptyState title="No run yet" description="The timeline of VBUS, IBUS, messages, states and timers appears here after a run." />
        )}
      </div>
    </div>
  );
}
