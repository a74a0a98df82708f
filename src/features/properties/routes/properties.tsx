import { useRef, useState } from 'react';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { CodeEditor, type CodeEditorProblem } from '../../../components/code-editor.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { Select } from '../../../components/select.tsx';
import { isCancelled } from '../../../lib/engine-worker.ts';
import { CounterexamplePanel } from '../components/counterexample-panel.tsx';
import { ResultPanel, type RunOutcome } from '../components/result-panel.tsx';
import { readSettings, RunControls, type RunSettings } from '../components/run-panel.tsx';
import { propertyVectorOf, SavePropertyPanel, vectorProblem, type PropertyMeta } from '../components/save-property-panel.tsx';
import { ServerQueuePanel } from '../components/server-queue-panel.tsx';
import { useEngineTypes } from '../lib/engine-types.ts';
import { blankExample, examples, type PropertyExample } from '../lib/examples.ts';
import { nameForCode } from '../lib/follow-code.ts';
import { checkInWorker, usePropertyWorker, type PropertyProgress } from '../lib/property-worker.ts';

const BLANK_ID = '__new__';

const exampleOptions = [...examples.map((example) => ({ value: example.id, label: example.title })), { value: BLANK_ID, label: 'A new property (template)' }];

function metaOf(example: PropertyExample): PropertyMeta {
  return { id: example.id, title: example.title, ref: example.ref, tags: example.tags, holds: example.holds };
}

/** Metadata that always validates, for running code whose id or title is still being written. */
const scratchMeta: PropertyMeta = { id: 'property/scratch', title: 'Scratch property', ref: 'common practice', tags: [], holds: true };

function ProblemsLine({ problems, typesReady }: { problems: CodeEditorProblem[]; typesReady: boolean }) {
  if (!typesReady) return <p className="text-xs text-slate-500">Loading the engine and fast-check types…</p>;
  const errors = problems.filter((p) => p.severity === 'error');
  if (errors.length === 0)
    return (
      <p className="text-xs text-emerald-700 dark:text-emerald-400" data-testid="type-problems">
        Type check: no problems.
      </p>
    );
  return (
    <div className="text-xs text-amber-800 dark:text-amber-300" data-testid="type-problems">
      <p>Type check: {errors.length === 1 ? '1 problem' : `${errors.length} problems`} (the property still runs; types are a help, not a gate).</p>
      <ul className="mt-1 list-disc pl-5 font-mono">
        {errors.slice(0, 3).map((p) => (
          <li key={`${p.line}:${p.column}:${p.message}`}>
            {p.line}:{p.column} {p.message.length > 160 ? `${p.message.slice(0, 160)}…` : p.message}
          </li>
        ))}
      </ul>
    </div>
  );
}

export function PropertiesRoute() {
  const worker = usePropertyWorker();
  const typeDeclarations = useEngineTypes();
  const first = examples[0] ?? blankExample;
  const [exampleId, setExampleId] = useState(first.id);
  const [code, setCode] = useState(first.code);
  const [example, setExample] = useState<PropertyExample>(first);
  const [metaDraft, setMetaDraft] = useState<PropertyMeta>(metaOf(first));
  // Id and title follow the code until the user types their own (follow-code.ts).
  const [typed, setTyped] = useState({ id: false, title: false });
  const followed = nameForCode(example, code, example === blankExample);
  const meta: PropertyMeta = { ...metaDraft, id: typed.id ? metaDraft.id : followed.id, title: typed.title ? metaDraft.title : followed.title };
  const setMeta = (next: PropertyMeta) => {
    setTyped((was) => ({ id: was.id || next.id !== meta.id, title: was.title || next.title !== meta.title }));
    setMetaDraft(next);
  };
  const [settings, setSettings] = useState<RunSettings>({ runs: String(first.runs), seed: String(first.seed) });
  const [problems, setProblems] = useState<CodeEditorProblem[]>([]);
  const [running, setRunning] = useState(false);
  const [progress, setProgress] = useState<PropertyProgress | null>(null);
  const [outcome, setOutcome] = useState<RunOutcome | null>(null);
  const lastRuns = useRef(0);

  const read = readSettings(settings);
  const propertyVector = read.ok ? propertyVectorOf(meta, code, read.runs, read.seed) : null;

  const load = (id: string) => {
    const example = id === BLANK_ID ? blankExample : examples.find((e) => e.id === id);
    if (!example) return;
    setExampleId(id);
    setExample(example);
    setCode(example.code);
    setMetaDraft(metaOf(example));
    setTyped({ id: false, title: false });
    setSettings({ runs: String(example.runs), seed: String(example.seed) });
    setOutcome(null);
  };

  const run = () => {
    if (!worker || !read.ok || running) return;
    const vector = propertyVector && vectorProblem(propertyVector) === undefined ? propertyVector : propertyVectorOf({ ...scratchMeta, holds: meta.holds }, code, read.runs, read.seed);
    setRunning(true);
    setProgress(null);
    setOutcome(null);
    lastRuns.current = 0;
    checkInWorker(worker, vector, (p) => {
      lastRuns.current = p.runs;
      setProgress(p);
    })
      .then((check) => setOutcome(check.ok ? { kind: 'checked', check, expectHolds: meta.holds } : { kind: 'error', message: check.error.message }))
      .catch((error: unknown) => {
        if (isCancelled(error)) setOutcome({ kind: 'cancelled', runs: lastRuns.current });
        else setOutcome({ kind: 'error', message: `The property worker stopped: ${error instanceof Error ? error.message : String(error)}` });
      })
      .finally(() => setRunning(false));
  };

  const checked = outcome?.kind === 'checked' ? outcome.check : null;
  const counterexampleVector = checked?.result.counterexampleVector;
  return (
    <>
      <PageHeader
        eyebrow="Test"
        title="Properties"
        description="Write a property over the engine in TypeScript, let fast-check look for an input that breaks it, and keep the shrunk counterexample as a negotiation vector."
      />
      {/* The editor takes the page's width (property code has long lines); results and saving go below. */}
      <Card aria-labelledby="code-heading">
        <CardHeader
          title={<span id="code-heading">Property code</span>}
          description={
            <>
              <span className="font-mono">export default ({'{ fc, engine }'}: PropertyContext) =&gt; fc.property(…)</span>; completion knows fast-check and{' '}
              <span className="font-mono">engine.codec</span>, <span className="font-mono">.rules</span>, <span className="font-mono">.sim</span>, <span className="font-mono">.trace</span>,{' '}
              <span className="font-mono">.arbitraries</span>. Throw (or return false) to fail a run.
            </>
          }
        />
        <CardBody className="space-y-3">
          <div className="flex flex-wrap items-start gap-x-3 gap-y-2" role="group" aria-label="Run">
            {/* A row of its own: example titles are long sentences, and a select cuts what does not fit. */}
            <Select label="Example" className="min-w-64 basis-full" value={exampleId} options={exampleOptions} onChange={(e) => load(e.target.value)} disabled={running} />
            <RunControls
              settings={settings}
              onSettings={setSettings}
              running={running}
              progress={progress}
              onRun={run}
              onCancel={() => worker?.cancel()}
              disabledReason={worker ? (code.trim() === '' ? 'Write a property first.' : undefined) : 'Starting the worker…'}
            />
          </div>
          <CodeEditor language="typescript" label="Property code" path="property.ts" value={code} onChange={setCode} typeDeclarations={typeDeclarations} onProblems={setProblems} height="28rem" />
          <ProblemsLine problems={problems} typesReady={typeDeclarations !== undefined} />
        </CardBody>
      </Card>
      <div className="mt-6 grid items-start gap-6 lg:grid-cols-2">
        <ResultPanel outcome={outcome} />
        <SavePropertyPanel meta={meta} onMeta={setMeta} vector={propertyVector} />
      </div>
      {checked?.counterexampleRun && counterexampleVector && (
        <div className="mt-6">
          <CounterexamplePanel key={String(counterexampleVector.id) + checked.result.durationMs} run={checked.counterexampleRun} vector={counterexampleVector} />
        </div>
      )}
      <div className="mt-6">
        <ServerQueuePanel />
      </div>
    </>
  );
}
