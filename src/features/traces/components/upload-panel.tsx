// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
import { MAX_TRACE_BYTES } from '../../../../shared/api/index.ts';
import { useEffect, useId, useImperativeHandle, useRef, useState, type DragEvent, type Ref } from 'react';
import { Link } from 'react-router';
import { useQueryClient } from '@tanstack/react-query';
import { Button } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { Input } from '../../../components/input.tsx';
import { ProgressBar } from '../../../components/progress-bar.tsx';
import { Select } from '../../../components/select.tsx';
import { Textarea } from '../../../components/textarea.tsx';
import { paths } from '../../../config/paths.ts';
import { isApiError } from '../../../lib/api-client.ts';
import { cn } from '../../../lib/cn.ts';
import { useDevices } from '../../../lib/api/get-devices.ts';
import { getTrace } from '../../../lib/api/get-trace.ts';
import { traceKeys } from '../../../lib/query-keys.ts';
import type { TraceDetail } from '../../../../shared/api/index.ts';
import { uploadTrace } from '../api/upload-trace.ts';
import { watchAnalysis } from '../api/watch-analysis.ts';
import { formatBytes } from '../lib/format.ts';
import { mappedTextToJsonl } from '../../../../shared/trace/mapped-text-reader.ts';
import { useImportMappings } from '../api/import-mappings.ts';
import { ImportMappingForm } from './import-mapping-form.tsx';
import { plural } from '../../../lib/plural.ts';

type Phase =
  | { kind: 'idle' }
  | { kind: 'uploading'; fraction: number }
  | { kind: 'analysing'; traceId: number; fraction: number | undefined }
  | { kind: 'done'; detail: TraceDetail; duplicate: boolean }
  | { kind: 'error'; title: string; message: string };

/** Why an upload failed, in words for the person who chose the file. */
function describeError(error: unknown): { title: string; message: string } {
  if (isApiError(error)) {
    if (error.code === 'request.too-large' || error.status === 413) return { title: 'The file is too large', message: error.message };
    if (error.code === 'trace.not-a-trace') return { title: 'This file is not a trace', message: error.message };
    return { title: 'The upload failed', message: error.message };
  }
  return { title: 'The upload failed', message: 'Something went wrong. Try again.' };
}

/** What the page can ask of the panel: bring it into view with the file chooser focused. */
export type UploadPanelHandle = { focus(): void };

/** Drag-and-drop or choose a trace; upload progress (XHR) then analysis progress (SSE), then the summary. */
export function UploadPanel({ ref }: { ref?: Ref<UploadPanelHandle> }) {
  const queryClient = useQueryClient();
  const devices = useDevices();
  const inputId = useId();
  const fileInput = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [dragging, setDragging] = useState(false);
  const [deviceId, setDeviceId] = useState('');
  const [customerRef, setCustomerRef] = useState('');
  const [title, setTitle] = useState('');
  const [notes, setNotes] = useState('');
  const [phase, setPhase] = useState<Phase>({ kind: 'idle' });
  const mappings = useImportMappings();
  const [mappingId, setMappingId] = useState('');
  const [mappingOpen, setMappingOpen] = useState(false);
  const [mappedNote, setMappedNote] = useState<string | null>(null);
  const stopWatching = useRef<(() => void) | null>(null);
  useEffect(() => () => stopWatching.current?.(), []);
  const panel = useRef<HTMLElement>(null);
  useImperativeHandle(ref, () => ({
    focus() {
      panel.current?.scrollIntoView({ behavior: 'smooth', block: 'start' });
      // The file input is visually hidden inside the drop zone, which shows its focus.
      fileInput.current?.focus({ preventScroll: true });
    },
  }));

  const busy = phase.kind === 'uploading' || phase.kind === 'analysing';

  const finish = async (traceId: number, duplicate: boolean) => {
    const detail = await getTrace(traceId);
    queryClient.setQueryData(traceKeys.detail(traceId), detail);
    await queryClient.invalidateQueries({ queryKey: traceKeys.lists() });
    setPhase({ kind: 'done', detail, duplicate });
  };

  /** With a mapping chosen, the log is read in the browser and uploaded as the JSON Lines trace it maps to. */
  const fileToSend = async (chosen: File): Promise<File | null> => {
    setMappedNote(null);
    const saved = mappings.data?.items.find((m) => String(m.id) === mappingId);
    if (!saved) return chosen;
    const mapped = mappedTextToJsonl(await chosen.text(), saved.mapping, title.trim() || chosen.name);
    if (!mapped.ok) {
      setPhase({ kind: 'error', title: 'The log could not be read with this mapping', message: mapped.error.message });
      return null;
    }
    setMappedNote(
      `Read with “${saved.name}”: ${plural(mapped.messages, 'message')}${mapped.skipped.length > 0 ? `, ${plural(mapped.skipped.length, 'line')} without a message left out (first: line ${mapped.skipped[0]!.line}, ${mapped.skipped[0]!.reason})` : ''}.`,
    );
    return new File([mapped.jsonl], `${chosen.name.replace(/\.[^.]*$/, '')}.trace.jsonl`, { type: 'application/x-ndjson' });
  };

  const start = async () => {
    if (!file) return;
    const sending = await fileToSend(file);
    if (!sending) return;
    setPhase({ kind: 'uploading', fraction: 0 });
    try {
      const stored = await uploadTrace({ file: sending, title, deviceId, customerRef, notes }, { onProgress: (fraction) => setPhase({ kind: 'uploading', fraction }) });
      if (stored.duplicate || stored.trace.status === 'done' || stored.trace.status === 'failed') {
        await finish(stored.trace.id, Boolean(stored.duplicate));
        return;
      }
      setPhase({ kind: 'analysing', traceId: stored.trace.id, fraction: 0 });
      stopWatching.current = watchAnalysis(stored.trace.id, (event) => {
        if (event.type === 'progress') setPhase({ kind: 'analysing', traceId: stored.trace.id, fraction: event.totalBytes > 0 ? event.bytesRead / event.totalBytes : undefined });
        else if (event.type === 'done') void finish(stored.trace.id, false);
        else {
          void queryClient.invalidateQueries({ queryKey: traceKeys.lists() });
          setPhase({ kind: 'error', title: event.error.code === 'trace.not-a-trace' ? 'This file is not a trace' : 'The analysis failed', message: event.error.message });
        }
      });
    } catch (error) {
      if (error instanceof DOMException && error.name === 'AbortError') return;
      setPhase({ kind: 'error', ...describeError(error) });
    }
  };

  const choose = (chosen: File | undefined) => {
    if (!chosen) return;
    setFile(chosen);
    if (phase.kind !== 'idle') setPhase({ kind: 'idle' });
  };

  const onDrop = (event: DragEvent<HTMLElement>) => {
    event.preventDefault();
    setDragging(false);
    if (!busy) choose(event.dataTransfer.files[0]);
  };

  const reset = () => {
    stopWatching.current?.();
    setFile(null);
    setTitle('');
    setCustomerRef('');
    setNotes('');
    setPhase({ kind: 'idle' });
    if (fileInput.current) fileInput.current.value = '';
  };

  const deviceOptions = [{ value: '', label: 'Not recorded' }, ...(devices.data?.items ?? []).map((d) => ({ value: String(d.id), label: d.name }))];

  return (
    <Card aria-label="Upload a trace" ref={panel} className="scroll-mt-24">
      <CardHeader title="Upload a trace" description={`JSON Lines, a plain-text console log or a VCD capture of the CC wire; up to ${MAX_TRACE_BYTES / 1024 / 1024} MB.`} />
      <CardBody className="space-y-4">
        <label
          htmlFor={inputId}
          onDragOver={(event) => {
            event.preventDefault();
            if (!busy) setDragging(true);
          }}
          onDragLeave={() => setDragging(false)}
          onDrop={onDrop}
          data-testid="trace-dropzone"
          className={cn(
            'flex cursor-pointer flex-col items-center justify-center gap-1 rounded-lg border-2 border-dashed px-4 py-6 text-center transition-colors',
            'focus-within:outline-2 focus-within:outline-offset-2 focus-within:outline-amber-500',
            dragging ? 'border-amber-500 bg-amber-50 dark:bg-amber-400/10' : 'border-slate-300 hover:border-amber-400 dark:border-slate-700',
            busy && 'cursor-not-allowed opacity-60',
          )}
        >
          <svg aria-hidden="true" viewBox="0 0 24 24" className="size-6 text-slate-400">
            <path d="M12 16V4m0 0-4 4m4-4 4 4M4 16v3a1 1 0 0 0 1 1h14a1 1 0 0 0 1-1v-3" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeLinejoin="round" />
          </svg>
          {file ? (
            <span className="text-sm font-medium text-slate-800 dark:text-slate-100">
              {file.name} <span className="font-mono text-xs text-slate-500">({formatBytes(file.size)})</span>
            </span>
          ) : (
            <span className="text-sm text-slate-700 dark:text-slate-200">Drop a trace here, or click to choose one</span>
          )}
          <span className="text-xs text-slate-500 dark:text-slate-400">The format is read from the content, not the file name.</span>
          <input ref={fileInput} id={inputId} type="file" className="sr-only" disabled={busy} data-testid="trace-file-input" onChange={(event) => choose(event.target.files?.[0])} />
        </label>

        <div className="space-y-1">
          <Select
            label="Read the file as"
            value={mappingId}
            onChange={(event) => setMappingId(event.target.value)}
            disabled={busy}
            options={[
              { value: '', label: 'Detected from the content (JSON Lines, text, VCD)' },
              ...(mappings.data?.items ?? []).map((m) => ({ value: String(m.id), label: `Console log: ${m.name}` })),
            ]}
            hint="A saved import mapping reads a firmware console log without editing it."
          />
          <button type="button" className="text-xs text-amber-800 underline underline-offset-2 dark:text-amber-300" onClick={() => setMappingOpen((open) => !open)} aria-expanded={mappingOpen}>
            {mappingOpen ? 'Close the new mapping' : 'New import mapping…'}
          </button>
          {mappingOpen && (
            <div className="rounded-md border border-slate-200 p-3 dark:border-slate-800">
              <ImportMappingForm
                onSaved={(saved) => {
                  setMappingId(String(saved.id));
                  setMappingOpen(false);
                }}
              />
            </div>
          )}
        </div>
        <Select label="Device under test" options={deviceOptions} value={deviceId} onChange={(event) => setDeviceId(event.target.value)} disabled={busy} />
        <div className="grid gap-3 sm:grid-cols-2">
          <Input label="Customer reference" value={customerRef} maxLength={120} onChange={(event) => setCustomerRef(event.target.value)} disabled={busy} placeholder="e.g. KD-CASE-2291" />
          <Input label="Title" value={title} maxLength={200} onChange={(event) => setTitle(event.target.value)} disabled={busy} hint="Default: the trace's own title or its file name" />
        </div>
        <Textarea
          label="Notes"
          rows={3}
          value={notes}
          maxLength={4000}
          onChange={(event) => setNotes(event.target.value)}
          disabled={busy}
          placeholder="What the customer saw, which cable, which firmware…"
        />

        {phase.kind === 'uploading' && <ProgressBar label="Upload" fraction={phase.fraction} />}
        {phase.kind === 'uploading' && <p className="text-xs text-slate-500">Uploading…</p>}
        {phase.kind === 'analysing' && (
          <div className="space-y-1">
            <ProgressBar label="Analysis" fraction={phase.fraction} />
            <p className="text-xs text-slate-500">Analysing on the server: decoding messages, checking timers, contracts and VBUS…</p>
          </div>
        )}
        {phase.kind === 'error' && (
          <ErrorMessage title={phase.title}>
            <p className="mt-0.5">{phase.message}</p>
          </ErrorMessage>
        )}
        {mappedNote && phase.kind !== 'idle' && phase.kind !== 'error' && (
          <p className="text-xs text-slate-600 dark:text-slate-400" data-testid="mapped-note">
            {mappedNote}
          </p>
        )}
        {phase.kind === 'done' && <UploadResult detail={phase.detail} duplicate={phase.duplicate} />}

        <div className="flex justify-end gap-2">
          {phase.kind !== 'idle' && !busy && (
            <Button variant="ghost" onClick={reset}>
              Upload another
            </Button>
          )}
          <Button onClick={() => void start()} disabled={!file || phase.kind === 'done'} loading={busy}>
            Upload and analyse
          </Button>
        </div>
      </CardBody>
    </Card>
  );
}

function UploadResult({ detail, duplicate }: { detail: TraceDetail; duplicate: boolean }) {
  const { trace, analysis } = detail;
  const malformed = analysis?.findings.filter((f) => f.rule === 'trace.malformed-line') ?? [];
  return (
    <div
      role="status"
      className="space-y-2 rounded-md border border-emerald-200 bg-emerald-50 px-4 py-3 text-sm text-emerald-950 dark:border-emerald-500/30 dark:bg-emerald-500/10 dark:text-emerald-100"
    >
      <p className="font-medium">{duplicate ? `This file was uploaded before, as “${trace.title}”.` : 'Analysed.'}</p>
      {trace.summary && <p data-testid="upload-summary">{trace.summary}</p>}
      {malformed.length > 0 && (
        <div className="rounded border border-orange-200 bg-orange-50 px-3 py-2 text-xs text-orange-900 dark:border-orange-500/30 dark:bg-orange-500/10 dark:text-orange-200">
          <p className="font-medium">
            {malformed.length} line{malformed.length === 1 ? '' : 's'} could not be read; the rest was analysed:
          </p>
          <ul className="mt-1 list-disc pl-4">
            {malformed.slice(0, 8).map((f, index) => (
              <li key={index}>{f.message}</li>
            ))}
            {malformed.length > 8 && <li>… and {malformed.length - 8} more on the trace page.</li>}
          </ul>
        </div>
      )}
      {trace.error && <p className="text-red-700 dark:text-red-300">{trace.error.message}</p>}
      <Link to={paths.traces.detail.getHref(trace.id)} className="inline-block font-medium text-amber-800 underline underline-offset-2 dark:text-amber-300">
        Open the trace
      </Link>
    </div>
  );
}
