import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { MessagePanel } from '../../../components/timeline/message-detail.tsx';
import type { TimeWindow } from '../../../components/timeline/time-window.ts';
import { cn } from '../../../lib/cn.ts';
import { useIsDark } from '../../../lib/theme.ts';
import { BenchTimeline } from '../components/bench-timeline.tsx';
import { ExportPanel } from '../components/export-panel.tsx';
import { RunPanel } from '../components/run-panel.tsx';
import { FindingsTable } from '../components/run-summary.tsx';
import { SafetyNote } from '../components/safety-note.tsx';
import { SaveToLibrary } from '../components/save-to-library.tsx';
import { ScenarioPanel } from '../components/scenario-panel.tsx';
import { autorunFromHash, shareHash } from '../../../lib/share-url.ts';
import type { RunMessage } from '../../../components/timeline/lane-messages.ts';
import { useScenarioEditor } from '../lib/use-scenario-editor.ts';
import { useSimulation } from '../lib/use-simulation.ts';
import { useTraceScenario } from '../lib/use-trace-scenario.ts';

/**
 * The Bench: the scenario on the left (collapsible), the run beside it — contract, timeline with
 * the message list, findings, then saving and exports — so a run is read without scrolling away
 * from the question that produced it.
 */
export function BenchRoute() {
  const editor = useScenarioEditor();
  const [notice, setNotice] = useState<string | null>(editor.initialNotice);
  const [formCollapsed, setFormCollapsed] = useState(false);
  const [shareUrl, setShareUrl] = useState<string | null>(null);
  const [title, setTitle] = useState('Bench scenario');
  const [window_, setWindow] = useState<TimeWindow>({ startUs: 0, endUs: 1 });
  const [selected, setSelected] = useState<{ index: number; message: RunMessage } | null>(null);
  const timelineRef = useRef<HTMLDivElement>(null);
  const dark = useIsDark();
  const simulation = useSimulation();
  const { state, lastRun, start } = simulation;

  useTraceScenario(editor.initialNotice === null, editor.apply, setNotice);

  // A new run shows whole; the selection belongs to the old run.
  const [windowFor, setWindowFor] = useState<unknown>(null);
  if (state.status === 'done' && windowFor !== state.run) {
    // Adjusting state while rendering (not in an effect) keeps this inside the run's transition.
    setWindowFor(state.run);
    setWindow({ startUs: 0, endUs: Math.max(1, state.run.endUs) });
    setSelected(null);
  }

  // A link from a Fault sweep cell (#scenario=…&run=1) shows that run at once: run the shared scenario once, on opening.
  const autorunDone = useRef(false);
  const { current: currentScenario } = editor;
  const { openedShared } = editor;
  useEffect(() => {
    if (autorunDone.current || !openedShared || !autorunFromHash(window.location.hash)) return;
    autorunDone.current = true;
    const scenario = currentScenario();
    if (scenario) void start(scenario);
  }, [openedShared, currentScenario, start]);

  const { submitWith } = editor;
  const submit = useMemo(() => submitWith((scenario) => void start(scenario)), [submitWith, start]);

  const share = async () => {
    const scenario = editor.current();
    if (!scenario) return;
    const url = `${window.location.origin}${window.location.pathname}${shareHash(scenario)}`;
    window.history.replaceState(null, '', url);
    setShareUrl(url);
    try {
      await navigator.clipboard.writeText(url);
    } catch {
      // The link is shown in a field as well; copying is a convenience.
    }
  };

  const shown = state.status === 'done' ? state.run : lastRun;
  const chartSvg = useCallback(() => timelineRef.current?.querySelector<SVGSVGElement>('[data-testid="vbus-chart"] svg.parley-chart-surface') ?? null, []);
  const focusTime = (tUs: number, endUs: number) => setWindow({ startUs: Math.max(0, tUs - 20_000), endUs: Math.min(endUs, tUs + 20_000) });
  const formErrors = Object.keys(editor.form.formState.errors).length > 0;

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

      <div className={cn('grid grid-cols-1 items-start gap-5', formCollapsed ? 'lg:grid-cols-[2.75rem_minmax(0,1fr)]' : 'lg:grid-cols-[minmax(0,30rem)_minmax(0,1fr)]')}>
        <div className={cn(!formCollapsed && 'lg:sticky lg:top-4 lg:max-h-[calc(100vh-2rem)] lg:overflow-y-auto')}>
          <ScenarioPanel
            form={editor.form}
            onSubmit={submit}
            jsonText={editor.jsonText}
            jsonError={editor.jsonError}
            onJsonChange={editor.onJsonChange}
            collapsed={formCollapsed}
            onCollapsedChange={setFormCollapsed}
          />
        </div>

        <div className="flex min-w-0 flex-col gap-5" data-testid="bench-result">
          <RunPanel
            state={state}
            shown={shown}
            onCancel={simulation.cancel}
            onShare={() => void share()}
            shareUrl={shareUrl}
            warnings={
              <>
                {editor.jsonError && <p className="text-xs text-amber-800 dark:text-amber-300">The JSON view has an error; Run uses the last valid scenario (the form).</p>}
                {formErrors && (
                  <p role="alert" className="text-xs text-red-600 dark:text-red-400">
                    Fix the highlighted fields in the form before running.
                  </p>
                )}
              </>
            }
          />
          {shown && (
            <>
              <Card>
                <CardHeader title="Timeline" description="Drag the handles under the chart to zoom; click a message or walk the list with ↑ ↓ to read it." />
                <CardBody className={cn('grid gap-4', selected && '2xl:grid-cols-[minmax(0,1fr)_22rem]')}>
                  <div ref={timelineRef} className="min-w-0">
                    <BenchTimeline
                      run={shown}
                      window={window_}
                      onWindowChange={setWindow}
                      selectedIndex={selected?.index ?? null}
                      onSelectMessage={(index, message) => setSelected({ index, message })}
                      onSelectFinding={(index) => {
                        const tUs = shown.findings[index]?.t;
                        if (tUs !== undefined) focusTime(tUs, shown.endUs);
                      }}
                      dark={dark}
                    />
                  </div>
                  {selected && <MessagePanel selected={selected.message} onClose={() => setSelected(null)} />}
                </CardBody>
              </Card>
              <Card>
                <CardHeader title="Findings" description="The same checks that run on captured traces, over the simulated one." />
                <CardBody>
                  <FindingsTable findings={shown.findings} onSelectTime={(tUs) => focusTime(tUs, shown.endUs)} />
                </CardBody>
              </Card>
              <Card>
                <CardHeader title="Keep this run" description="Save it to the team Library as a negotiation vector, or take it elsewhere as files." />
                <CardBody className="flex flex-col gap-4">
                  <SaveToLibrary run={shown} title={title} onTitleChange={setTitle} />
                  <ExportPanel run={shown} title={title} chartSvg={chartSvg} dark={dark} />
                </CardBody>
              </Card>
            </>
          )}
        </div>
      </div>
    </div>
  );
}
