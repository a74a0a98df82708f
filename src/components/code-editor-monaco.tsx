import { useEffect, useRef } from 'react';
import Editor from '@monaco-editor/react';
import { addTypeDeclarations, monaco, attachJsonSchema } from '../lib/monaco.ts';
import { useIsDark } from '../lib/theme.ts';
import type { CodeEditorProblem, CodeEditorProps } from './code-editor.tsx';

function severityOf(value: monaco.MarkerSeverity): CodeEditorProblem['severity'] {
  if (value === monaco.MarkerSeverity.Error) return 'error';
  if (value === monaco.MarkerSeverity.Warning) return 'warning';
  return 'info';
}

/** The Monaco half of CodeEditor; loaded lazily by code-editor.tsx. */
export default function CodeEditorMonaco({ value, onChange, language, label, path, jsonSchema, typeDeclarations, readOnly, height, onProblems }: CodeEditorProps) {
  const dark = useIsDark();
  const modelPath = `file:///${path.replace(/^\/+/, '')}`;
  const onProblemsRef = useRef(onProblems);
  onProblemsRef.current = onProblems;

  useEffect(() => {
    if (language !== 'json' || !jsonSchema) return;
    return attachJsonSchema(modelPath, jsonSchema);
  }, [language, jsonSchema, modelPath]);

  useEffect(() => {
    if (language !== 'typescript' || !typeDeclarations?.length) return;
    const undo = typeDeclarations.map((lib) => addTypeDeclarations(lib.filePath, lib.content));
    return () => {
      for (const fn of undo) fn();
    };
  }, [language, typeDeclarations]);

  useEffect(() => {
    const uri = monaco.Uri.parse(modelPath);
    const report = () => {
      const markers = monaco.editor.getModelMarkers({ resource: uri });
      onProblemsRef.current?.(
        markers.map((marker) => ({
          line: marker.startLineNumber,
          column: marker.startColumn,
          message: marker.message,
          severity: severityOf(marker.severity),
        })),
      );
    };
    const subscription = monaco.editor.onDidChangeMarkers((uris) => {
      if (uris.some((changed) => changed.toString() === uri.toString())) report();
    });
    return () => subscription.dispose();
  }, [modelPath]);

  return (
    <Editor
      value={value}
      language={language}
      path={modelPath}
      height={height}
      theme={dark ? 'parley-dark' : 'parley-light'}
      onChange={(next) => onChange?.(next ?? '')}
      loading={<span className="p-3 text-xs text-slate-500">Loading editor…</span>}
      options={{
        ariaLabel: label,
        readOnly,
        domReadOnly: readOnly,
        minimap: { enabled: false },
        fontFamily: "'JetBrains Mono', ui-monospace, monospace",
        fontSize: 13,
        lineHeight: 20,
        scrollBeyondLastLine: false,
        tabSize: 2,
        automaticLayout: true,
        renderLineHighlight: readOnly ? 'none' : 'line',
        fixedOverflowWidgets: true,
      }}
    />
  );
}
