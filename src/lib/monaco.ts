/**
 * Monaco, set up to run offline: the editor and its language workers come from our own bundle.
 * Without `loader.config({ monaco })`, @monaco-editor/react would fetch Monaco from a CDN.
 * Import this module only from lazy chunks (it is about 1 MB gzip).
 */
import * as monaco from 'monaco-editor';
import { loader } from '@monaco-editor/react';
// Worker paths from monaco-editor's own ESM layout (the package's exports map `./*` to esm/vs/*).
import EditorWorker from 'monaco-editor/editor/editor.worker?worker';
import JsonWorker from 'monaco-editor/languages/features/json/json.worker?worker';
import TsWorker from 'monaco-editor/languages/features/typescript/ts.worker?worker';

self.MonacoEnvironment = {
  getWorker(_workerId: string, label: string): Worker {
    if (label === 'json') return new JsonWorker();
    if (label === 'typescript' || label === 'javascript') return new TsWorker();
    return new EditorWorker();
  },
};

loader.config({ monaco });

monaco.typescript.typescriptDefaults.setCompilerOptions({
  target: monaco.typescript.ScriptTarget.ES2020,
  module: monaco.typescript.ModuleKind.ESNext,
  moduleResolution: monaco.typescript.ModuleResolutionKind.NodeJs,
  strict: true,
  allowNonTsExtensions: true,
  noEmit: true,
});

// Parley's own editor colours, close to the app's slate/amber palette.
monaco.editor.defineTheme('parley-light', {
  base: 'vs',
  inherit: true,
  rules: [],
  colors: {
    'editor.background': '#ffffff',
    'editorLineNumber.foreground': '#94a3b8',
    'editorLineNumber.activeForeground': '#b45309',
    'editor.selectionBackground': '#fde68a99',
    'editorCursor.foreground': '#d97706',
  },
});
monaco.editor.defineTheme('parley-dark', {
  base: 'vs-dark',
  inherit: true,
  rules: [],
  colors: {
    'editor.background': '#0f172a',
    'editorLineNumber.foreground': '#475569',
    'editorLineNumber.activeForeground': '#fbbf24',
    'editor.selectionBackground': '#f59e0b40',
    'editorCursor.foreground': '#fbbf24',
    'editorWidget.background': '#1e293b',
  },
});

// Monaco measures glyphs once; measure again when the bundled mono font has arrived.
void document.fonts?.ready.then(() => monaco.editor.remeasureFonts());

type SchemaEntry = { uri: string; fileMatch: string[]; schema: object };
const schemaEntries = new Map<string, SchemaEntry>();

function applySchemas(): void {
  monaco.json.jsonDefaults.setDiagnosticsOptions({
    validate: true,
    allowComments: false,
    enableSchemaRequest: false,
    schemas: [...schemaEntries.values()],
  });
}

/** Attaches a JSON Schema to one model path (validation and completion); returns the undo. */
export function attachJsonSchema(modelPath: string, schema: object): () => void {
  const uri = `inmemory://parley/schemas/${encodeURIComponent(modelPath)}.json`;
  schemaEntries.set(modelPath, { uri, fileMatch: [monaco.Uri.parse(modelPath).toString()], schema });
  applySchemas();
  return () => {
    schemaEntries.delete(modelPath);
    applySchemas();
  };
}

/** Adds type declarations (e.g. the engine's types for a script editor); returns the undo. */
export function addTypeDeclarations(filePath: string, content: string): () => void {
  const lib = monaco.typescript.typescriptDefaults.addExtraLib(content, filePath);
  return () => lib.dispose();
}

applySchemas();

export { monaco };
