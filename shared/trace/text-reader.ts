/**
 * The plain-text reader (docs/trace.md, "Plain text"), for logs printed by firmware:
 *   `<time> <who> [SOP'|SOP''] <payload>`   with `#` starting a comment.
 * time: a decimal number with `s`, `ms` or `us` (no unit: seconds); who: SRC/SNK/CBL (or
 * source/sink/cable, any case), or VBUS for a measurement (`5030mV 410mA`, also `V`/`A`);
 * payload: bytes in wire order (every token two hex digits, or one unbroken run of more than
 * eight digits), or words as numbers (a 16-bit header, then 32-bit objects), or HARD_RESET,
 * CABLE_RESET, ATTACH, DETACH.
 */
import { parseWords, toHex } from '../pd/index.ts';
import type { Sop } from '../pd/types.ts';
import { createLineSplitter } from './lines.ts';
import type { TraceRecord, TraceSide } from './records.ts';
import type { TraceReader, TraceSink } from './sink.ts';

const TIME = /^(\d+(?:\.\d*)?|\.\d+)(s|ms|us|µs)?$/i;
const UNIT_US: Record<string, number> = { s: 1_000_000, ms: 1_000, us: 1, 'µs': 1 };
const WHO: Record<string, TraceSide | 'vbus'> = {
  src: 'source', source: 'source', snk: 'sink', sink: 'sink', cbl: 'cable', cable: 'cable', vbus: 'vbus',
};
const SOP_TOKENS: Record<string, Sop> = { sop: 'SOP', "sop'": "SOP'", "sop''": "SOP''", "sop'_debug": "SOP'_Debug", "sop''_debug": "SOP''_Debug" };
const EVENTS: Record<string, 'hard_reset' | 'cable_reset' | 'attach' | 'detach'> = {
  hard_reset: 'hard_reset', cable_reset: 'cable_reset', attach: 'attach', detach: 'detach',
};
const BYTE = /^(0x)?[0-9a-f]{2}$/i;
const HEX_RUN = /^(0x)?[0-9a-f]{10,}$/i;
const QUANTITY = /^(\d+(?:\.\d+)?)(mv|v|ma|a)$/i;

export function createTextReader(sink: TraceSink): TraceReader {
  const splitter = createLineSplitter((line, lineNo) => {
    const read = readTextLine(line);
    if (read === undefined) return;
    if (typeof read === 'string') sink.malformed(lineNo, read);
    else sink.push(read, lineNo);
  });
  return {
    push: (chunk) => splitter.push(chunk),
    end() {
      splitter.end();
      return { ok: true };
    },
  };
}

/** A record, `undefined` for a blank or comment line, or the reason the line cannot be read. */
export function readTextLine(line: string): TraceRecord | string | undefined {
  const hash = line.indexOf('#');
  const text = (hash === -1 ? line : line.slice(0, hash)).trim();
  if (text === '') return undefined;
  const tokens = text.split(/\s+/);
  const [timeToken, whoToken, ...rest] = tokens as [string, string | undefined, ...string[]];
  const time = TIME.exec(timeToken);
  if (!time) return `time: "${timeToken}" is not a time (a number with s, ms or us)`;
  const t = Math.round(Number(time[1]) * UNIT_US[(time[2] ?? 's').toLowerCase()]!);
  if (whoToken === undefined) return 'who: SRC, SNK, CBL or VBUS must follow the time';
  const who = WHO[whoToken.toLowerCase()];
  if (who === undefined) return `who: "${whoToken}" is none of SRC, SNK, CBL, VBUS`;
  if (who === 'vbus') return readMeasurement(t, rest);
  let payload = rest;
  let sop: Sop | undefined;
  const sopToken = payload[0] === undefined ? undefined : SOP_TOKENS[payload[0].toLowerCase()];
  if (sopToken !== undefined) {
    sop = sopToken;
    payload = payload.slice(1);
  }
  if (payload.length === 0) return 'payload: bytes, words or HARD_RESET, CABLE_RESET, ATTACH, DETACH must follow';
  const event = payload.length === 1 ? EVENTS[payload[0]!.toLowerCase()] : undefined;
  if (event !== undefined) return { t, event, from: who };
  const msg = readPayload(payload);
  if (msg.startsWith('payload:')) return msg;
  return sop === undefined || sop === 'SOP' ? { t, msg, from: who } : { t, msg, from: who, sop };
}

function readPayload(tokens: string[]): string {
  if (tokens.every((token) => BYTE.test(token))) return tokens.map((token) => token.slice(-2).toLowerCase()).join('');
  if (tokens.length === 1 && HEX_RUN.test(tokens[0]!)) {
    const digits = tokens[0]!.replace(/^0x/i, '').toLowerCase();
    if (digits.length % 2 === 0) return digits;
  }
  const words = parseWords(tokens);
  if (!words.ok) return `payload: ${words.error.message}`;
  return toHex(words.bytes);
}

function readMeasurement(t: number, tokens: string[]): TraceRecord | string {
  let mv: number | undefined;
  let ma: number | undefined;
  for (const token of tokens) {
    const q = QUANTITY.exec(token);
    if (!q) return `vbus: "${token}" is not a voltage or current (5030mV, 5.03V, 410mA, 0.41A)`;
    const unit = q[2]!.toLowerCase();
    const value = Number(q[1]);
    if (unit === 'mv') mv = Math.round(value);
    else if (unit === 'v') mv = Math.round(value * 1_000);
    else if (unit === 'ma') ma = Math.round(value);
    else ma = Math.round(value * 1_000);
  }
  if (mv === undefined) return 'vbus: a voltage (e.g. 5030mV) is required';
  return ma === undefined ? { t, vbus: { mv } } : { t, vbus: { mv, ma } };
}
