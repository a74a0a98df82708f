/**
 * A long trace for tests and benchmarks (invented data at the fictional maker Kestrel Devices): a
 * programmable (PPS) contract kept alive once a second — Request, Accept, PS_RDY and their
 * GoodCRCs — with a VBUS reading every 100 ms and a Hard Reset and new negotiation every ten
 * minutes. As JSON Lines or as a plain-text log (docs/trace.md), written in pieces until it holds
 * `bytes` or `lines` (the header counts).
 */
import { closeSync, openSync, writeSync } from 'node:fs';

/** Wire-order hex of a 16-bit header (USB PD R3.2 V1.1 Table 6.1), low byte first. */
const h16 = (v: number): string => (v & 0xff).toString(16).padStart(2, '0') + (v >> 8).toString(16).padStart(2, '0');
const CAPS = 'a1412c9101002cd102002cb104003c21dcc0';
/** PPS RDO for object 4, 8.4 V 2.5 A (0x40034832), little-endian. */
const PPS_RDO = '32480340';

export type SyntheticFormat = 'jsonl' | 'text';

export interface SyntheticTraceOptions {
  format?: SyntheticFormat;
  title?: string;
  /** Stop once the file holds this many bytes, or this many lines. */
  until: { bytes: number } | { lines: number };
}

interface SyntheticRecord {
  t: number;
  msg?: string;
  from?: string;
  event?: string;
  vbus?: { mv: number; ma: number };
}

const WHO: Record<string, string> = { source: 'SRC', sink: 'SNK' };
const seconds = (us: number): string => `${Math.floor(us / 1_000_000)}.${String(us % 1_000_000).padStart(6, '0')}`;

/** One record as a line of the format. */
function line(r: SyntheticRecord, format: SyntheticFormat): string {
  if (format === 'jsonl') {
    if (r.msg !== undefined) return `{"t": ${r.t}, "msg": "${r.msg}", "from": "${r.from}"}`;
    if (r.vbus) return `{"t": ${r.t}, "vbus": {"mv": ${r.vbus.mv}, "ma": ${r.vbus.ma}}}`;
    if (r.event === 'attach') return `{"t": ${r.t}, "event": "attach", "cc": "CC1", "rp": "3.0A"}`;
    return `{"t": ${r.t}, "event": "${r.event}", "from": "${r.from}"}`;
  }
  if (r.msg !== undefined) return `${seconds(r.t)} ${WHO[r.from!]} ${r.msg.replace(/(..)(?!$)/g, '$1 ')}`;
  if (r.vbus) return `${seconds(r.t)} VBUS ${r.vbus.mv}mV ${r.vbus.ma}mA`;
  return `${seconds(r.t)} ${r.event === 'attach' ? 'SRC' : WHO[r.from!]} ${r.event!.toUpperCase()}`;
}

/** Writes the trace; returns how many bytes and lines it holds. */
export function writeSynthetic(path: string, options: SyntheticTraceOptions): { bytes: number; lines: number } {
  const format = options.format ?? 'jsonl';
  const title = options.title ?? 'Kestrel K65 on bench 2, PPS soak';
  const maxBytes = 'bytes' in options.until ? options.until.bytes : Number.POSITIVE_INFINITY;
  const maxLines = 'lines' in options.until ? options.until.lines : Number.POSITIVE_INFINITY;
  const fd = openSync(path, 'w');
  let buffer: string[] = [];
  let bytes = 0;
  let lines = 0;
  const emit = (text: string) => {
    buffer.push(text);
    bytes += text.length + 1;
    lines++;
    if (buffer.length >= 10_000) flush();
  };
  const flush = () => {
    if (buffer.length > 0) writeSync(fd, buffer.join('\n') + '\n');
    buffer = [];
  };
  emit(format === 'jsonl' ? `{"trace": 1, "title": ${JSON.stringify(title)}, "capturedAt": "2026-11-30T09:12:00Z"}` : `# ${title}`);
  let t = 0;
  let sinkId = 0;
  let sourceId = 0;
  let cycle = 0;
  const msg = (at: number, hex: string, from: string) => emit(line({ t: at, msg: hex, from }, format));
  const negotiateStart = () => {
    emit(line({ t, event: 'attach' }, format));
    msg(t + 150_000, CAPS, 'source');
    msg(t + 151_100, h16(0x0081), 'sink');
    sinkId = 0;
    sourceId = 1;
    t += 155_000;
  };
  negotiateStart();
  while (bytes < maxBytes && lines < maxLines) {
    // Request (sink), GoodCRC, Accept, GoodCRC, PS_RDY, GoodCRC — USB PD R3.2 V1.1 §8.3.2.2 (from memory).
    msg(t, h16(0x1082 | (sinkId << 9)) + PPS_RDO, 'sink');
    msg(t + 700, h16(0x01a1 | (sinkId << 9)), 'source');
    msg(t + 3_000, h16(0x01a3 | (sourceId << 9)), 'source');
    msg(t + 3_560, h16(0x0081 | (sourceId << 9)), 'sink');
    const next = (sourceId + 1) & 7;
    msg(t + 23_000, h16(0x01a6 | (next << 9)), 'source');
    msg(t + 23_560, h16(0x0081 | (next << 9)), 'sink');
    sinkId = (sinkId + 1) & 7;
    sourceId = (next + 1) & 7;
    for (let k = 0; k < 10; k++) emit(line({ t: t + 50_000 + k * 100_000, vbus: { mv: 8_380 + ((cycle * 7 + k * 13) % 50), ma: 2_100 + ((cycle + k) % 300) } }, format));
    t += 1_000_000;
    cycle++;
    if (cycle % 600 === 0) {
      emit(line({ t, event: 'hard_reset', from: 'sink' }, format));
      t += 1_000_000;
      negotiateStart();
    }
  }
  flush();
  closeSync(fd);
  return { bytes, lines };
}

/** A JSON Lines trace of at least `targetBytes`; returns its size in bytes. */
export function writeSyntheticTrace(path: string, targetBytes: number, title?: string): number {
  return writeSynthetic(path, { until: { bytes: targetBytes }, title }).bytes;
}
