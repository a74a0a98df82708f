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
  type VcdTimescale,
  type WireEvent,
  type WirePacket,
} from '../../shared/wire/index.ts';
import { CliError, EXIT_OK, formatTable, paint, printJson, type CliIo } from '../io.ts';

const USAGE = 'usage: parley wire encode <hex>… --vcd <out.vcd> [--bitrate 300000] [--gap-us 500] [--json] | parley wire decode <in.vcd> [--signal NAME] [--json]';
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

/** Runs the decoder over the file in chunks. */
async function readEvents(path: string, signal: string | undefined): Promise<WireEvent[]> {
  const decoder = createVcdDecoder({ signal });
  const events: WireEvent[] = [];
  const stream = createReadStream(path, { encoding: 'utf8', highWaterMark: 1 << 16 });
  for await (const chunk of stream) {
    events.push(...decoder.push(chunk as string));
    if (decoder.failure()) {
      stream.destroy();
      break;
    }
  }
  const end = decoder.end();
  if (!end.ok) throw CliError.from(end.error);
  return [...events, ...end.events];
}

function describe(events: WireEvent[]): { messages: DecodedEntry[]; events: { t: number; event: string }[] } {
  const messages: DecodedEntry[] = [];
  const resets: { t: number; event: string }[] = [];
  let caps: Message['objects'] | undefined;
  for (const e of events) {
    if (e.kind !== 'message') {
      resets.push({ t: e.t, event: e.kind });
      continue;
    }
    const framed = new Uint8Array(e.bytes.length + 4);
    framed.set(e.bytes);
    new DataView(framed.buffer).setUint32(e.bytes.length, e.crc, true);
    const decoded = decodeMessage(framed, { sop: e.sop, crc: true, caps });
    const hex = toHex(e.bytes);
    const entry: DecodedEntry = { t: e.t, sop: e.sop, hex, crc: e.crc.toString(16).padStart(8, '0'), crcOk: e.crcOk, eop: e.eop, bitrateBps: e.bitrateBps, message: decoded.ok ? decoded.message : null };
    if (!decoded.ok) entry.error = { code: decoded.error.code, message: decoded.error.message };
    // A Request refers to the offers in force: the last good Source_Capabilities on SOP.
    if (decoded.ok && e.crcOk && e.sop === 'SOP' && decoded.message.header.messageType === 'Source_Capabilities') caps = decoded.message.objects;
    messages.push(entry);
  }
  return { messages, events: resets };
}

async function decode(positionals: string[], values: ReturnType<typeof parse>['values'], io: CliIo): Promise<number> {
  const [file, ...extra] = positionals;
  if (!file || extra.length > 0) throw new CliError('usage', `wire decode takes one VCD file; ${USAGE}`);
  const path = resolve(io.cwd, file);
  const info = await stat(path).catch(() => undefined);
  if (!info || !info.isFile()) throw new CliError('input.file', `no such file: ${file}`);
  const { messages, events } = describe(await readEvents(path, values.signal));
  if (values.json) {
    printJson(io, { ok: true, messages, events });
    return EXIT_OK;
  }
  const rows = [['t (µs)', 'SOP*', 'message', 'CRC', 'hex']];
  const lines = [
    ...messages.map((m) => ({ t: m.t, row: [String(m.t), m.sop, m.message?.header.messageType ?? `(${m.error?.code ?? 'undecodable'})`, m.crcOk ? 'ok' : paint(io, 'red', 'BAD'), m.hex] })),
    ...events.map((e) => ({ t: e.t, row: [String(e.t), '', paint(io, 'yellow', e.event === 'hard_reset' ? 'Hard Reset' : 'Cable Reset'), '', ''] })),
  ].sort((a, b) => a.t - b.t);
  io.stdout(formatTable([...rows, ...lines.map((l) => l.row)]));
  io.stdout(`${messages.length} message(s), ${events.length} reset(s)\n`);
  return EXIT_OK;
}

export async function run(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parse(args);
  const [sub, ...rest] = positionals;
  if (sub === 'encode') return encode(rest, values, io);
  if (sub === 'decode') return decode(rest, values, io);
  throw new CliError('usage', sub === undefined ? USAGE : `unknown wire command "${sub}"; ${USAGE}`);
}
