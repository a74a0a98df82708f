import type { DecodeOutcome } from '../../../../shared/pd/index.ts';

type Failure = Extract<DecodeOutcome, { ok: false }>;

/** The error, with the place it points at highlighted: a character of the text, or a byte. */
export function DecodeError({ failure, text, caps }: { failure: Failure; text: string; caps: string }) {
  const { error, stage } = failure;
  const offset = error.offset;
  let marked: { before: string; at: string; after: string; unit: string } | null = null;
  if (offset !== undefined) {
    if (stage === 'decode' && failure.hex !== undefined) {
      const bytes = failure.hex.match(/../g) ?? [];
      marked = { before: bytes.slice(0, offset).join(' '), at: bytes.slice(offset).join(' ') || '(end)', after: '', unit: `byte ${offset}` };
    } else {
      const source = stage === 'caps' ? caps : text;
      marked = { before: source.slice(0, offset), at: source.slice(offset, offset + 1) || '(end)', after: source.slice(offset + 1), unit: `character ${offset + 1}` };
    }
  }
  return (
    <div role="alert" className="rounded-lg border border-red-300 bg-red-50 px-4 py-3 text-sm text-red-900 dark:border-red-500/40 dark:bg-red-500/10 dark:text-red-200">
      <p>
        <span className="font-mono text-xs font-semibold">{error.code}</span>
        {stage === 'caps' && <span className="ml-2 text-xs">(in the Source_Capabilities given for the Request)</span>}
      </p>
      <p className="mt-1">{error.message.charAt(0).toUpperCase() + error.message.slice(1)}.</p>
      {marked && (
        <p className="mt-2 font-mono text-xs break-all">
          <span className="sr-only">The problem starts at {marked.unit}: </span>
          <span className="text-slate-600 dark:text-slate-400">{marked.before} </span>
          <mark data-testid="error-offset" className="rounded bg-red-600 px-0.5 text-white">
            {marked.at}
          </mark>
          <span className="text-slate-600 dark:text-slate-400">{marked.after}</span>
          <span className="ml-2 font-sans text-red-700 dark:text-red-300">← {marked.unit}</span>
        </p>
      )}
    </div>
  );
}
