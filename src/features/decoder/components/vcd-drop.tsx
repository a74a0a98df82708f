// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
import { useState, type DragEvent } from 'react';
import { cn } from '../../../lib/cn.ts';
import type { VcdEntry } from '../../../../workers/codec.worker.ts';
import { decodeVcdFile } from '../api/codec-worker.ts';
import { Badge } from '../../../components/badge.tsx';

const MAX_BYTES = 20 * 1024 * 1024;

/** Drop (or pick) a CC-line VCD capture: each message in it, one click to open it in the decoder. */
export function VcdDrop({ onPick }: { onPick(entry: Extract<VcdEntry, { kind: 'message' }>): void }) {
  const [over, setOver] = useState(false);
  const [state, setState] = useState<{ name: string; entries?: VcdEntry[]; error?: string; busy?: boolean } | null>(null);

  async function read(file: File | undefined) {
    if (!file) return;
    if (file.size > MAX_BYTES) {
      setState({ name: file.name, error: `The file is ${Math.round(file.size / 1024 / 1024)} MB; the decoder reads captures up to 20 MB.` });
      return;
    }
    setState({ name: file.name, busy: true });
    try {
      const outcome = await decodeVcdFile(await file.text());
      setState(outcome.ok ? { name: file.name, entries: outcome.entries } : { name: file.name, error: `${outcome.error.code}: ${outcome.error.message}` });
    } catch (error) {
      setState({ name: file.name, error: error instanceof Error ? error.message : String(error) });
    }
  }

  function onDrop(event: DragEvent) {
    event.preventDefault();
    setOver(false);
    void read(event.dataTransfer.files[0]);
  }

  return (
    <div className="space-y-3">
      <label
        onDragOver={(event) => {
          event.preventDefault();
          setOver(true);
        }}
        onDragLeave={() => setOver(false)}
        onDrop={onDrop}
        className={cn(
          'flex cursor-pointer flex-col items-center gap-1 rounded-lg border-2 border-dashed px-4 py-5 text-center text-sm',
          over ? 'border-amber-500 bg-amber-50 dark:bg-amber-400/10' : 'border-slate-300 dark:border-slate-700',
        )}
      >
        <span className="font-medium text-slate-800 dark:text-slate-100">Drop a VCD capture of the CC line</span>
        <span className="text-xs text-slate-500 dark:text-slate-400">or click to choose one · every message in it is listed</span>
        <input type="file" accept=".vcd" className="sr-only" aria-label="VCD capture" onChange={(event) => void read(event.target.files?.[0])} />
      </label>
      {state?.busy && <p className="text-xs text-slate-500">Reading {state.name}…</p>}
      {state?.error && (
        <p role="alert" className="text-sm text-red-700 dark:text-red-300">
          {state.name}: {state.error}
        </p>
      )}
      {state?.entries && (
        <ol
          className="max-h-72 divide-y divide-slate-100 overflow-y-auto rounded-md border border-slate-200 text-sm dark:divide-slate-800 dark:border-slate-800"
          aria-label={`Messages in ${state.name}`}
        >
          {state.entries.length === 0 && <li className="px-3 py-2 text-slate-500">No messages found in {state.name}.</li>}
          {state.entries.map((entry, i) => (
            <li key={i}>
              {entry.kind === 'message' ? (
                <button type="button" onClick={() => onPick(entry)} className="flex w-full flex-wrap items-baseline gap-x-3 px-3 py-1.5 text-left hover:bg-slate-50 dark:hover:bg-slate-800">
                  <span className="w-24 font-mono text-xs text-slate-500 tabular">{(entry.t / 1000).toFixed(3)} ms</span>
                  <span className="font-mono text-xs">{entry.sop}</span>
                  <span className="font-medium">{entry.messageType}</span>
                  <span className="text-xs text-slate-500">{entry.summary}</span>
                  {!entry.crcOk && (
                    <Badge tone="error" dot>
                      CRC wrong
                    </Badge>
                  )}
                </button>
              ) : (
                <p className="px-3 py-1.5">
                  <span className="w-24 font-mono text-xs text-slate-500 tabular">{(entry.t / 1000).toFixed(3)} ms</span>{' '}
                  {entry.kind === 'unreadable' ? (
                    <>
                      <Badge tone="warning">Unreadable burst</Badge> <span className="text-xs text-slate-500">{entry.reason}</span>
                    </>
                  ) : (
                    <Badge tone="info">{entry.kind === 'hard_reset' ? 'Hard Reset' : 'Cable Reset'}</Badge>
                  )}
                </p>
              )}
            </li>
          ))}
        </ol>
      )}
    </div>
  );
}
