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
import { createRangeSplitter } from './lines.ts';
import type { TraceRecord, TraceSide } from './records.ts';
import type { TraceReader, TraceSink } from './sink.ts';

const TIME = /^(\d+(?:\.\d*)?|\.\d+)(s|ms|us|µs)?$/i;
const UNIT_US: Record<string, number> = { s: 1_000_000, ms: 1_000, us: 1, µs: 1 };
const WHO: Record<string, TraceSide | 'vbus'> = {
  src: 'source',
  source: 'source',
  snk: 'sink',
  sink: 'sink',
  cbl: 'cable',
  cable: 'cable',
  vbus: 'vbus',
};
const SOP_TOKENS: Record<string, Sop> = { sop: 'SOP', "sop'": "SOP'", "sop''": "SOP''", "sop'_debug": "SOP'_Debug", "sop''_debug": "SOP''_Debug" };
const EVENTS: Record<string, 'hard_reset' | 'cable_reset' | 'attach' | 'detach'> = {
  hard_reset: 'hard_reset',
  cable_reset: 'cable_reset',
  attach: 'attach',
  detach: 'detach',
};
const BYTE = /^(0x)?[0-9a-f]{2}$/i;
const HEX_RUN = /^(0x)?[0-9a-f]{10,}$/i;
const QUANTITY = /^(\d+(?:\.\d+)?)(mv|v|ma|a)$/i;

export function createTextReader(sink: TraceSink): TraceReader {
  // Nearly every line is read where it stands in the chunk; only the others are copied out.
  const splitter = createRangeSplitter((text, start, end, lineNo) => {
    const read = readCommonLine(text, start, end) ?? readAnyLine(text.slice(start, end));
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
  return readCommonLine(line, 0, line.length) ?? readAnyLine(line);
}

const SPACE = 32;
const TAB = 9;
const DOT = 46;
const isDigit = (c: number): boolean => c >= 48 && c <= 57;
const isSpace = (c: number): boolean => c === SPACE || c === TAB || c === 13;
/** Lower-case hex digit of a character code, or '' when it is none. */
const HEX_OF: string[] = [];
for (let c = 0; c < 128; c++) {
  const ch = String.fromCharCode(c).toLowerCase();
  HEX_OF.push(/^[0-9a-f]$/.test(ch) ? ch : '');
}
const hexOf = (c: number): string => (c < 128 ? HEX_OF[c]! : '');

/**
 * The shapes nearly every line of a long log has — `<time> SRC|SNK|CBL <two-digit bytes…>` and
 * `<time> VBUS <n>mV [<n>mA]` — read with one pass over the characters and no regular expression
 * or token array (issue 17: text logs at most 2× their read-and-split floor). Anything else (a
 * comment, words, an SOP* token, an event, a malformed line) is left to `readAnyLine`, so both paths
 * give the same result for every line (text-reader.test.ts checks it on generated lines).
 */
function readCommonLine(line: string, from: number, to: number): TraceRecord | undefined {
  const n = to;
  let i = from;
  while (i < n && isSpace(line.charCodeAt(i))) i++;
  // Time: digits with at most one dot, then an optional unit; kept as integer and fraction digits.
  const timeStart = i;
  let whole = 0;
  let fraction = 0;
  let fractionDigits = 0;
  let digits = 0;
  let dots = 0;
  for (; i < n; i++) {
    const c = line.charCodeAt(i);
    if (isDigit(c)) {
      digits++;
      if (dots === 0) whole = whole * 10 + (c - 48);
      else {
        fraction = fraction * 10 + (c - 48);
        fractionDigits++;
      }
    } else if (c === DOT && dots === 0) dots++;
    else break;
  }
  if (digits === 0 || digits > 15) return undefined;
  const numberEnd = i;
  let unit = 1_000_000;
  let unitDigits = 6;
  const u = line.charCodeAt(i) | 32;
  if (u === 115 /* s */) i++;
  else if (u === 109 /* m */ && (line.charCodeAt(i + 1) | 32) === 115) {
    unit = 1_000;
    unitDigits = 3;
    i += 2;
  } else if (u === 117 /* u */ && (line.charCodeAt(i + 1) | 32) === 115) {
    unit = 1;
    unitDigits = 0;
    i += 2;
  }
  if (i >= n || !isSpace(line.charCodeAt(i))) return undefined;
  // Whole microseconds are exact in integers; finer fractions round as Number() would.
  const t = fractionDigits <= unitDigits ? whole * unit + fraction * 10 ** (unitDigits - fractionDigits) : Math.round(Number(line.slice(timeStart, numberEnd)) * unit);
  while (i < n && isSpace(line.charCodeAt(i))) i++;
  const whoStart = i;
  while (i < n && !isSpace(line.charCodeAt(i))) i++;
  const who = whoOfShortToken(line, whoStart, i) ?? WHO[line.slice(whoStart, i).toLowerCase()];
  if (who === undefined) return undefined;
  if (who === 'vbus') return readCommonMeasurement(line, i, n, t);
  while (i < n && isSpace(line.charCodeAt(i))) i++;
  // Bytes as two hex digits each. Printed in lower case with one space between (nearly every log),
  // the message is the payload without its spaces: one slice and one copy, no string per byte.
  const payloadStart = i;
  let plain = true;
  let bytes = 0;
  while (i < n) {
    const hi = line.charCodeAt(i);
    const lo = line.charCodeAt(i + 1);
    if (!isHexCode(hi) || !isHexCode(lo)) return undefined;
    if (isUpper(hi) || isUpper(lo)) plain = false;
    bytes++;
    i += 2;
    if (i >= n) break;
    if (!isSpace(line.charCodeAt(i))) return undefined;
    if (line.charCodeAt(i) !== SPACE) plain = false;
    i++;
    if (i < n && isSpace(line.charCodeAt(i))) {
      plain = false;
      while (i < n && isSpace(line.charCodeAt(i))) i++;
    }
  }
  if (bytes === 0) return undefined;
  return { t, msg: plain ? line.slice(payloadStart, i).replaceAll(' ', '') : hexPairs(line, payloadStart, n), from: who };
}

const isHexCode = (c: number): boolean => (c >= 48 && c <= 57) || ((c | 32) >= 97 && (c | 32) <= 102);
const isUpper = (c: number): boolean => c >= 65 && c <= 70;

/** The general case of the byte run: any white space between the bytes, digits in either case. */
function hexPairs(line: string, from: number, to: number): string {
  let msg = '';
  for (let i = from; i < to; i++) {
    const digit = hexOf(line.charCodeAt(i));
    if (digit !== '') msg += digit;
  }
  return msg;
}

/** SRC, SNK, CBL and VBUS in any case, read from the character codes; undefined for any other token. */
function whoOfShortToken(line: string, from: number, to: number): TraceSide | 'vbus' | undefined {
  const a = line.charCodeAt(from) | 32;
  const b = line.charCodeAt(from + 1) | 32;
  const c = line.charCodeAt(from + 2) | 32;
  if (to - from === 3) {
    if (a === 115 && b === 114 && c === 99) return 'source'; // src
    if (a === 115 && b === 110 && c === 107) return 'sink'; // snk
    if (a === 99 && b === 98 && c === 108) return 'cable'; // cbl
  } else if (to - from === 4 && a === 118 && b === 98 && c === 117 && (line.charCodeAt(from + 3) | 32) === 115) return 'vbus';
  return undefined;
}

/** `<n>mV [<n>mA]` (units in any case, V/A with decimals) between `from` and `to`; undefined for anything else. */
function readCommonMeasurement(line: string, from: number, to: number, t: number): TraceRecord | undefined {
  const n = to;
  let i = from;
  let mv: number | undefined;
  let ma: number | undefined;
  while (i < n) {
    while (i < n && isSpace(line.charCodeAt(i))) i++;
    if (i >= n) break;
    const start = i;
    let digits = 0;
    let dots = 0;
    let whole = 0;
    for (; i < n; i++) {
      const c = line.charCodeAt(i);
      if (isDigit(c)) {
        digits++;
        whole = whole * 10 + (c - 48);
      } else if (c === DOT && dots === 0 && digits > 0) dots++;
      else break;
    }
    if (digits === 0 || digits > 15 || line.charCodeAt(i - 1) === DOT) return undefined;
    const value = dots === 0 ? whole : Number(line.slice(start, i));
    const a = line.charCodeAt(i) | 32;
    const b = line.charCodeAt(i + 1) | 32;
    let kind: 'mv' | 'v' | 'ma' | 'a';
    if (a === 109 /* m */ && (b === 118 || b === 97)) {
      kind = b === 118 ? 'mv' : 'ma';
      i += 2;
    } else if (a === 118 || a === 97) {
      kind = a === 118 ? 'v' : 'a';
      i += 1;
    } else return undefined;
    if (i < n && !isSpace(line.charCodeAt(i))) return undefined;
    if (kind === 'mv') mv = Math.round(value);
    else if (kind === 'v') mv = Math.round(value * 1_000);
    else if (kind === 'ma') ma = Math.round(value);
    else ma = Math.round(value * 1_000);
  }
  if (mv === undefined) return undefined;
  return ma === undefined ? { t, vbus: { mv } } : { t, vbus: { mv, ma } };
}

/** Any line of the format, by tokens and regular expressions: the reference reading. */
export function readAnyLine(line: string): TraceRecord | string | undefined {
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
