/**
 * Is an upload a trace at all? Decided from its first kilobyte, never from the file name:
 * `detectFormat` picks the reader, then the complete lines of that kilobyte go through the
 * reader. A file is turned away when it is empty, binary, or when its first lines are all
 * unreadable (a spreadsheet, a photo, a pretty-printed JSON document). Whatever passes is
 * analysed in full; lines broken further down become `trace.malformed-line` findings.
 */
import { createReader, detectFormat, type TraceFormat } from '../../../shared/trace/index.ts';
import { fail, type Result } from '../../../shared/core/result.ts';

export const SNIFF_BYTES = 1024;

export type SniffResult = Result<{ format: TraceFormat }>;

const FORMATS_READ = 'Parley reads JSON Lines (.trace.jsonl), plain-text logs and VCD captures of the CC wire';
const VCD_KEYWORD = /^\s*\$(date|version|timescale|scope|var|comment|upscope|enddefinitions|dumpvars)\b/;

/** True when the bytes hold NUL or many control characters: an image, an archive, a program. */
function looksBinary(head: Uint8Array): boolean {
  let control = 0;
  for (const byte of head) {
    if (byte === 0) return true;
    if (byte < 0x20 && byte !== 0x09 && byte !== 0x0a && byte !== 0x0d && byte !== 0x0c) control++;
  }
  return control > head.length / 20;
}

/** `head`: the first bytes of the file; `complete`: whether that is the whole file. */
export function sniffTrace(head: Uint8Array, complete: boolean): SniffResult {
  if (head.length === 0) return fail('trace.not-a-trace', `The file is empty. ${FORMATS_READ}.`);
  if (looksBinary(head)) return fail('trace.not-a-trace', `This looks like a binary file, not a trace. ${FORMATS_READ}.`);
  let text = new TextDecoder('utf-8').decode(head);
  // A multi-byte character cut at the end of the kilobyte decodes to U+FFFD; anything else is not UTF-8.
  const bad = (text.slice(0, -1).match(/\uFFFD/g) ?? []).length;
  if (bad > 4) return fail('trace.not-a-trace', `The file is not UTF-8 text, so it is not a trace. ${FORMATS_READ}.`);
  const format = detectFormat(text);
  if (format === 'vcd') {
    return VCD_KEYWORD.test(text.replace(/^\uFEFF/, '')) ? { ok: true, format } : fail('trace.not-a-trace', `The file starts with "$" but no VCD declaration ($timescale, $var, …). ${FORMATS_READ}.`);
  }
  // Only complete lines: the last one may be cut at the kilobyte.
  if (!complete) {
    const nl = text.lastIndexOf('\n');
    if (nl === -1) return { ok: true, format };
    text = text.slice(0, nl + 1);
  }
  let records = 0;
  let headers = 0;
  let first: { line: number; reason: string } | undefined;
  const reader = createReader(format, {
    push: () => void records++,
    header: () => void headers++,
    malformed: (line, reason) => {
      first ??= { line, reason };
    },
  });
  reader.push(text);
  reader.end();
  if (records > 0 || headers > 0 || !first) return { ok: true, format };
  const what = format === 'jsonl' ? 'JSON Lines' : 'a plain-text trace';
  return fail('trace.not-a-trace', `This is not a trace: no line at the start reads as ${what} (line ${first.line}: ${first.reason}). ${FORMATS_READ}.`);
}
