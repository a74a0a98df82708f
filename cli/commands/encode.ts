/**
 * `parley encode <file.json|->` (docs/cli.md): a Message as `decode --json` prints it
 * (the whole `{"ok":true,"message":…}` document is accepted too; `raw` fields may be left out) to
 * wire hex. A chunked extended message whose block needs several chunks prints each chunk; the
 * JSON then has `chunks` beside `hex` (the first chunk).
 */
import { readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { encodeChunks, encodeMessage, MAX_CHUNK_BYTES, toHex, type MessageInput } from '../../shared/pd/index.ts';
import { CliError, EXIT_OK, printJson, type CliIo } from '../io.ts';

const USAGE = 'encode <file.json|-> [--json]';

function parseUsage(args: string[]) {
  try {
    return parseArgs({ args, allowPositionals: true, options: { json: { type: 'boolean' }, help: { type: 'boolean', short: 'h' } } });
  } catch (error) {
    throw new CliError('usage', `${error instanceof Error ? error.message : String(error)}; usage: parley ${USAGE}`);
  }
}

export async function run(args: string[], io: CliIo): Promise<number> {
  const parsed = parseUsage(args);
  if (parsed.values.help) {
    io.stdout(`Usage: parley ${USAGE}\n`);
    return EXIT_OK;
  }
  const [source, ...extra] = parsed.positionals;
  if (source === undefined || extra.length > 0) throw new CliError('usage', `give one JSON file, or - for stdin; usage: parley ${USAGE}`);
  const text = source === '-' ? await io.readStdin() : await readText(resolve(io.cwd, source));
  const message = readMessage(text);
  const chunks = needsChunks(message) ? encodeChunks(message) : undefined;
  if (chunks && !chunks.ok) throw CliError.from(chunks.error);
  const hexes = chunks?.ok ? chunks.chunks.map(toHex) : [encodeOne(message)];
  if (parsed.values.json) {
    printJson(io, hexes.length > 1 ? { ok: true, hex: hexes[0], chunks: hexes } : { ok: true, hex: hexes[0] });
  } else {
    io.stdout(hexes.join('\n') + '\n');
  }
  return EXIT_OK;
}

async function readText(path: string): Promise<string> {
  try {
    return await readFile(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    throw new CliError('input.file', code === 'ENOENT' ? `${path}: no such file` : `${path}: cannot be read (${code ?? 'error'})`);
  }
}

function readMessage(text: string): MessageInput {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (error) {
    throw new CliError('input.json', `the input is not JSON (${error instanceof Error ? error.message : String(error)})`);
  }
  const candidate = typeof value === 'object' && value !== null && 'message' in value ? (value as { message: unknown }).message : value;
  if (typeof candidate !== 'object' || candidate === null || !('header' in candidate)) throw new CliError('input.message', 'header: a Message needs a "header" object');
  return candidate as MessageInput;
}

/** A chunked message whose block is longer than one chunk and that does not name a later chunk. */
function needsChunks(message: MessageInput): boolean {
  const e = message.extendedHeader;
  if (!e || e.chunked === false || e.requestChunk || (e.chunkNumber ?? 0) !== 0) return false;
  const payloadBytes = typeof message.payload === 'string' ? message.payload.length / 2 : 0;
  const objectBytes = Array.isArray(message.objects) ? 4 * message.objects.length : 0;
  return Math.max(payloadBytes, objectBytes, e.dataSize ?? 0) > MAX_CHUNK_BYTES;
}

function encodeOne(message: MessageInput): string {
  const r = encodeMessage(message);
  if (!r.ok) throw CliError.from(r.error);
  return toHex(r.bytes);
}
