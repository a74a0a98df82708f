import { useMemo } from 'react';
import { CodeEditor } from '../../../components/code-editor.tsx';
import { scenarioJsonSchema } from '../../../../shared/vectors/schema.ts';

export type ScenarioJsonProps = {
  text: string;
  /** The problem with the text, when it is not a valid scenario; the form keeps the last good one. */
  error: string | null;
  onChange(text: string): void;
};

/** The scenario as JSON, checked against the scenario's JSON Schema as you type. */
export function ScenarioJson({ text, error, onChange }: ScenarioJsonProps) {
  const schema = useMemo(() => scenarioJsonSchema(), []);
  return (
    <div className="flex flex-col gap-2">
      <CodeEditor value={text} onChange={onChange} language="json" label="Scenario JSON" path="bench/scenario.json" jsonSchema={schema} height="34rem" />
      {error ? (
        <p role="alert" data-testid="scenario-json-error" className="rounded-md bg-red-50 px-3 py-2 font-mono text-xs text-red-700 dark:bg-red-500/10 dark:text-red-300">
          {error}
          <span className="block font-sans text-[11px] text-red-600/80 dark:text-red-300/70">The form keeps the last valid scenario until this is fixed.</span>
        </p>
      ) : (
        <p className="text-xs text-slate-500 dark:text-slate-400">Edits here update the form; edits in the form rewrite this text.</p>
      )}
    </div>
  );
}
