import { lazy, Suspense } from 'react';
import { cn } from '../lib/cn.ts';

export type CodeEditorLanguage = 'json' | 'typescript';

export type TypeDeclaration = { filePath: string; content: string };

export type CodeEditorProps = {
  value: string;
  onChange?: (value: string) => void;
  language: CodeEditorLanguage;
  /** Names the editor for assistive technology. */
  label: string;
  /** Model path; distinct editors need distinct paths (e.g. `vector.json`, `policy.ts`). */
  path: string;
  /** JSON only: validation and completion against this JSON Schema. */
  jsonSchema?: object;
  /** TypeScript only: extra declarations the script may use. */
  typeDeclarations?: readonly TypeDeclaration[];
  readOnly?: boolean;
  /** CSS height, e.g. '20rem' or 320 (px). */
  height?: string | number;
  className?: string;
  /** Problems Monaco found (schema or type errors), for a summary beside the editor. */
  onProblems?: (problems: CodeEditorProblem[]) => void;
};

export type CodeEditorProblem = { line: number; column: number; message: string; severity: 'error' | 'warning' | 'info' };

// Monaco (about 1 MB gzip) loads only when an editor first renders.
const MonacoCodeEditor = lazy(() => import('./code-editor-monaco.tsx'));

/** A code editor (Monaco, bundled, no network) for JSON with an optional schema, or TypeScript. */
export function CodeEditor(props: CodeEditorProps) {
  const height = props.height ?? '20rem';
  return (
    <div className={cn('overflow-hidden rounded-md border border-slate-300 dark:border-slate-700', props.className)} style={{ height }} data-testid="code-editor">
      <Suspense fallback={<EditorFallback value={props.value} label={props.label} />}>
        <MonacoCodeEditor {...props} height={height} />
      </Suspense>
    </div>
  );
}

/** While Monaco loads, the text is already readable. */
function EditorFallback({ value, label }: { value: string; label: string }) {
  return (
    <pre role="region" aria-label={`${label} (loading editor)`} className="h-full overflow-auto bg-white p-3 font-mono text-xs text-slate-600 dark:bg-slate-900 dark:text-slate-400">
      {value}
    </pre>
  );
}
