/**
 * `parley wire encode <hex>… --vcd <out.vcd>` and `parley wire decode <in.vcd>`
 * (docs/cli.md): the CC wire as a Value Change Dump, through shared/wire.
 *
 * encode: each argument is one message (header + objects, wire order, without CRC), optionally
 * prefixed by its SOP* (`SOP':…`, `SOP'':…`, `SOP'_Debug:…`; `"` may stand for `''`), or the word
 * `hard_reset` / `cable_reset`. decode: streams the file through the VCD decoder, so a large
 * capture is never held in memory whole.
 */
import { createReadStream } from 'node:fs';
import { stat, writeFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { decodeMessage, parseHex, toHex, type Message, type Sop } from '../../shared/pd/index.ts';
import {
  DEFAULT_BITRATE_BPS,
  DEFAULT_GAP_US,
  createVcdDecoder,
  encodeWaveform,
  maxTickUs,
  parseTimescaleUs,
  type VcdTimescale,
  type WireEvent,
  type WireMessageEvent,
  type WirePacket,
} from '../../shared/wire/index.ts';
import { CliError, EXIT_BAD_INPUT, EXIT_OK, formatTable, paint, printJson, type CliIo } from '../io.ts';

const USAGE = 'usage: parley wire encode <hex>… --vcd <out.vcd> [--bitrate 300000] [--gap-us 500] [--json] | parley wire decode <in.vcd> [--signal NAME] [--json | --jsonl]';
const SOPS: readonly Sop[] = ['SOP', "SOP'", "SOP''", "SOP'_Debug", "SOP''_Debug"];
const TIMESCALES: readonly VcdTimescale[] = ['1 ps', '10 ps', '100 ps', '1 ns', '10 ns', '100 ns', '1 us'];

function parse(args: string[]) {
  try {
    return parseArgs({
      args,
      allowPositionals: true,
      strict: true,
      options: {
        vcd: { type: 'string' },
        bitrate: { type: 'string' },
        'gap-us': { type: 'string' },
        timescale: { type: 'string' },
        sop: { type: 'string' },
        signal: { type: 'string' },
        json: { type: 'boolean', default: false },
        jsonl: { type: 'boolean', default: false },
      },
    });
  } catch (error) {
    throw new CliError('usage', `${error instanceof Error ? error.message : String(error)}; ${USAGE}`);
  }
}

function toSop(text: string): Sop | undefined {
  const normal = text.replace(/"/g, "''").replace(/_debug$/i, '_Debug');
  return SOPS.find((sop) => sop.toLowerCase() === normal.toLowerCase());
}

function integerOption(text: string | undefined, name: string, fallback: number, min: number, max: number, why: string): number {
  if (text === undefined) return fallback;
  const value = Number(text.replace(/_/g, ''));
  if (!Number.isInteger(value) || value < min || value > max) throw new CliError('usage', `${name}: must be a whole number from ${min} to ${max} (${why}), not "${text}"`);
  return value;
}

/** One encode argument → a packet. */
function toPacket(arg: string, index: number, defaultSop: Sop): WirePacket {
  const word = arg.trim().toLowerCase().replace(/-/g, '_');
  if (word === 'hard_reset') return { orderedSet: 'Hard_Reset' };
  if (word === 'cable_reset') return { orderedSet: 'Cable_Reset' };
  let sop = defaultSop;
  let hex = arg;
  const prefixed = /^(sop[^:=]*)[:=](.*)$/is.exec(arg.trim());
  if (prefixed) {
    const named = toSop(prefixed[1]!);
    if (!named) throw new CliError('input.sop', `message ${index + 1}: "${prefixed[1]}" is not one of ${SOPS.join(', ')}`);
    sop = named;
    hex = prefixed[2]!;
  }
  const parsed = parseHex(hex);
  if (!parsed.ok) throw new CliError(parsed.error.code, `message ${index + 1}: ${parsed.error.message}`, { offset: parsed.error.offset });
  if (parsed.bytes.length < 2) throw new CliError('input.hex', `message ${index + 1}: needs at least the 2-byte header, got ${parsed.bytes.length} byte(s)`);
  return { sop, bytes: parsed.bytes };
}

async function encode(positionals: string[], values: ReturnType<typeof parse>['values'], io: CliIo): Promise<number> {
  if (!values.vcd) throw new CliError('usage', `wire encode needs --vcd <out.vcd>; ${USAGE}`);
  if (positionals.length === 0) throw new CliError('usage', `wire encode needs at least one message in hex; ${USAGE}`);
  const defaultSop = values.sop === undefined ? 'SOP' : toSop(values.sop);
  if (!defaultSop) throw new CliError('input.sop', `--sop: "${values.sop}" is not one of ${SOPS.join(', ')}`);
  // The specification's range is 270–330 kbps; wider rates are allowed for fault injection.
  const bitrate = integerOption(values.bitrate, '--bitrate', DEFAULT_BITRATE_BPS, 150_000, 500_000, 'bits per second; the specification allows 270000–330000');
  // At least tInterFrameGap (25 µs, USB PD R3.2 §5.8, from memory) so receivers see separate packets.
  const gapUs = integerOption(values['gap-us'], '--gap-us', DEFAULT_GAP_US, 25, 10_000_000, 'µs of idle between packets');
  const timescale = values.timescale === undefined ? undefined : TIMESCALES.find((t) => t.replace(' ', '') === values.timescale!.replace(/\s/g, ''));
  if (values.timescale !== undefined && !timescale) throw new CliError('usage', `--timescale: one of ${TIMESCALES.join(', ')}`);
  const tickUs = timescale ? parseTimescaleUs(timescale) : undefined;
  if (tickUs !== undefined && tickUs !== null && tickUs > maxTickUs(bitrate)) {
    const fits = TIMESCALES.filter((t) => (parseTimescaleUs(t) ?? Infinity) <= maxTickUs(bitrate));
    throw new CliError(
      'usage',
      `--timescale: ${timescale} is too coarse for ${bitrate} bit/s (a tick must be at most a quarter of a bit, ${(maxTickUs(bitrate) * 1000).toFixed(0)} ns); use ${fits[fits.length - 1]} or finer`,
    );
  }

  const packets = positionals.map((arg, i) => toPacket(arg, i, defaultSop));
  const { vcd, durationUs } = encodeWaveform(packets, { bitrate, gapUs, timescale });
  const path = resolve(io.cwd, values.vcd);
  try {
    await writeFile(path, vcd);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const why = code === 'EISDIR' ? 'it is a folder' : code === 'ENOENT' ? 'its folder does not exist' : code === 'EACCES' ? 'permission denied' : 'it could not be written';
    throw new CliError('output.file', `--vcd: cannot write "${values.vcd}": ${why}`);
  }
  if (values.json) printJson(io, { ok: true, messages: packets.length, durationUs });
  else io.stdout(`wrote ${packets.length} packet(s), ${durationUs} µs at ${bitrate} bit/s, to ${values.vcd}\n`);
  return EXIT_OK;
}

interface DecodedEntry {
  t: number;
  sop: Sop;
  hex: string;
  crc: string;
  crcOk: boolean;
  eop: boolean;
  bitrateBps: number;
  message: Message | null;
  error?: { code: string; message: string };
}

type OtherEvent = { t: number; event: string; reason?: string; line?: number };

/**
 * Turns wire events into output entries as they come. It keeps only what typing a Request needs
 * (the objects of the last good Source_Capabilities on SOP), never the messages already written.
 */
function createDescriber() {
  let caps: Message['objects'] | undefined;
  return (e: WireMessageEvent): DecodedEntry => {
    const framed = new Uint8Array(e.bytes.length + 4);
    framed.set(e.bytes);
    new DataView(framed.buffer).setUint32(e.bytes.length, e.crc, true);
    const decoded = decodeMessage(framed, { sop: e.sop, crc: true, caps });
    const entry: DecodedEntry = {
      t: e.t,
      sop: e.sop,
      hex: toHex(e.bytes),
      crc: e.crc.toString(16).padStart(8, '0'),
      crcOk: e.crcOk,
      eop: e.eop,
      bitrateBps: e.bitrateBps,
      message: decoded.ok ? decoded.message : null,
    };
    if (!decoded.ok) entry.error = { code: decoded.error.code, message: decoded.error.message };
    // A Request refers to the offers in force: the last good Source_Capabilities on SOP.
    if (decoded.ok && e.crcOk && e.sop === 'SOP' && decoded.message.header.messageType === 'Source_Capabilities') caps = decoded.message.objects;
    return entry;
  };
}

function otherEvent(e: Exclude<WireEvent, WireMessageEvent>): OtherEvent {
  return e.kind === 'unreadable' ? { t: e.t, event: 'unreadable', reason: e.reason, line: e.line } : { t: e.t, event: e.kind };
}

/** Where decoded entries go: JSON written as they come, JSON Lines, or rows of the people's table. */
interface EntryWriter {
  message(entry: DecodedEntry): void;
  event(event: OtherEvent): void;
  /** The file was read to its end (`error` when the reading stopped part-way). */
  end(error?: CliError): number;
}

/** `--json`: one document `{ messages, events, ok }`, its messages written as they are decoded. */
function jsonWriter(io: CliIo): EntryWriter {
  let opened = false;
  const events: OtherEvent[] = [];
  const indent = (text: string) => text.replace(/\n/g, '\n    ');
  return {
    message(entry) {
      io.stdout(`${opened ? ',\n' : '{\n  "messages": [\n'}    ${indent(JSON.stringify(entry, null, 2))}`);
      opened = true;
    },
    event: (event) => events.push(event),
    end(error) {
      // Nothing written yet: an error is reported the usual way.
      if (error && !opened) throw error;
      const eventsJson = JSON.stringify(events, null, 2).replace(/\n/g, '\n  ');
      const tail = error ? `,\n  "ok": false,\n  "error": ${JSON.stringify({ code: error.code, message: error.message, ...error.where })}\n}\n` : ',\n  "ok": true\n}\n';
      io.stdout(`${opened ? '\n  ],\n' : '{\n  "messages": [],\n'}  "events": ${eventsJson}${tail}`);
      return error ? EXIT_BAD_INPUT : EXIT_OK;
    },
  };
}

/** `--jsonl`: one JSON object a line, in time order: `{"kind": "message", …}` or `{"kind": "event", …}`, then a last `{"kind": "end", …}`. */
function jsonlWriter(io: CliIo): EntryWriter {
  let messages = 0;
  let events = 0;
  return {
    message(entry) {
      messages++;
      io.stdout(`${JSON.stringify({ kind: 'message', ...entry })}\n`);
    },
    event(event) {
      events++;
      io.stdout(`${JSON.stringify({ kind: 'event', ...event })}\n`);
    },
    end(error) {
      if (error && messages + events === 0) throw error;
      const last = error ? { kind: 'end', ok: false, messages, events, error: { code: error.code, message: error.message, ...error.where } } : { kind: 'end', ok: true, messages, events };
      io.stdout(`${JSON.stringify(last)}\n`);
      return error ? EXIT_BAD_INPUT : EXIT_OK;
    },
  };
}

/** The people's table: rows are short, so they are kept and printed in time order at the end. */
function tableWriter(io: CliIo): EntryWriter {
  const lines: { t: number; row: string[] }[] = [];
  let messages = 0;
  let resets = 0;
  let unreadable = 0;
  return {
    message(m) {
      messages++;
      lines.push({ t: m.t, row: [String(m.t), m.sop, m.message?.header.messageType ?? `(${m.error?.code ?? 'undecodable'})`, m.crcOk ? 'ok' : paint(io, 'red', 'BAD'), m.hex] });
    },
    event(e) {
      if (e.event === 'unreadable') unreadable++;
      else resets++;
      const what = e.event === 'hard_reset' ? 'Hard Reset' : e.event === 'cable_reset' ? 'Cable Reset' : `unreadable burst (VCD line ${e.line}): ${e.reason}`;
      lines.push({ t: e.t, row: [String(e.t), '', paint(io, 'yellow', what), '', ''] });
    },
    end(error) {
      if (error) throw error;
      lines.sort((a, b) => a.t - b.t);
      io.stdout(formatTable([['t (µs)', 'SOP*', 'message', 'CRC', 'hex'], ...lines.map((l) => l.row)]));
      io.stdout(`${messages} message(s), ${resets} reset(s)${unreadable > 0 ? `, ${unreadable} unreadable burst(s)` : ''}\n`);
      return EXIT_OK;
    },
  };
}

async function decode(positionals: string[], values: ReturnType<typeof parse>['values'], io: CliIo): Promise<number> {
  const [file, ...extra] = positionals;
  if (!file || extra.length > 0) throw new CliError('usage', `wire decode takes one VCD file; ${USAGE}`);
  if (values.json && values.jsonl) throw new CliError('usage', `wire decode: give --json or --jsonl, not both; ${USAGE}`);
  const path = resolve(io.cwd, file);
  const info = await stat(path).catch(() => undefined);
  if (!info?.isFile()) throw new CliError('input.file', `no such file: ${file}`);

  const writer = values.jsonl ? jsonlWriter(io) : values.json ? jsonWriter(io) : tableWriter(io);
  const describe = createDescriber();
  const take = (events: WireEvent[]) => {
    for (const e of events) {
      if (e.kind === 'message') writer.message(describe(e));
      else writer.event(otherEvent(e));
    }
  };
  const decoder = createVcdDecoder({ signal: values.signal });
  const stream = createReadStream(path, { encoding: 'utf8', highWaterMark: 1 << 16 });
  for await (const chunk of stream) {
    take(decoder.push(chunk as string));
    if (decoder.failure()) {
      stream.destroy();
      break;
    }
    await io.drain?.();
  }
  const end = decoder.end();
  if (!end.ok) return writer.end(CliError.from(end.error));
  take(end.events);
  return writer.end();
}

export async function run(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parse(args);
  const [sub, ...rest] = positionals;
  if (sub === 'encode') return encode(rest, values, io);
  if (sub === 'decode') return decode(rest, values, io);
  throw new CliError('usage', sub === undefined ? USAGE : `unknown wire command "${sub}"; ${USAGE}`);
}
