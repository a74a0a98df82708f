/**
 * `parley decode <hex>…` (docs/cli.md): decodes one message. `--words` reads a 16-bit
 * header and 32-bit objects as numbers, `--crc` checks the last 4 bytes as the CRC-32,
 * `--sop SOP|SOP'|SOP''`, `--caps <hex>` types a Request's RDO by the offer it references.
 */
import { parseArgs } from 'node:util';
import type { Finding } from '../../shared/core/finding.ts';
import { decodeMessage, parseHex, parseWords, summarizeObject, type Message, type Sop, type SourcePdo } from '../../shared/pd/index.ts';
import { CliError, EXIT_OK, formatTable, paint, printJson, type CliIo } from '../io.ts';

const USAGE = "decode <hex>… [--words] [--crc] [--sop SOP|SOP'|SOP''] [--caps <hex>] [--json]";
const SOPS: readonly Sop[] = ['SOP', "SOP'", "SOP''", "SOP'_Debug", "SOP''_Debug"];

export async function run(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parse(args);
  if (values.help) {
    io.stdout(`Usage: parley ${USAGE}\n`);
    return EXIT_OK;
  }
  if (positionals.length === 0) throw new CliError('usage', `give the message as hex; usage: parley ${USAGE}`);
  const sop = (values.sop ?? 'SOP') as Sop;
  if (!SOPS.includes(sop)) throw new CliError('input.sop', `--sop: "${values.sop}" is not one of ${SOPS.join(', ')}`);
  const input = values.words ? parseWords(positionals) : parseHex(positionals.join(''));
  if (!input.ok) throw CliError.from(input.error);
  const caps = values.caps === undefined ? undefined : readCaps(values.caps);
  const result = decodeMessage(input.bytes, { sop, crc: values.crc ?? false, caps });
  if (!result.ok) throw CliError.from(result.error);
  if (values.json) {
    printJson(io, { ok: true, message: result.message, warnings: result.warnings });
    return EXIT_OK;
  }
  io.stdout(describeMessage(io, result.message, result.warnings));
  return EXIT_OK;
}

function parse(args: string[]) {
  try {
    return parseArgs({
      args,
      allowPositionals: true,
      options: {
        words: { type: 'boolean' },
        crc: { type: 'boolean' },
        sop: { type: 'string' },
        caps: { type: 'string' },
        json: { type: 'boolean' },
        help: { type: 'boolean', short: 'h' },
      },
    });
  } catch (error) {
    throw new CliError('usage', `${error instanceof Error ? error.message : String(error)}; usage: parley ${USAGE}`);
  }
}

/** The offers of a Source_Capabilities (or a one-chunk EPR_Source_Capabilities) given as hex. */
function readCaps(hex: string): SourcePdo[] {
  const bytes = parseHex(hex);
  if (!bytes.ok) throw new CliError(bytes.error.code, `--caps: ${bytes.error.message}`, { offset: bytes.error.offset });
  const caps = decodeMessage(bytes.bytes);
  if (!caps.ok) throw new CliError(caps.error.code, `--caps: ${caps.error.message}`, { offset: caps.error.offset });
  const type = caps.message.header.messageType;
  if (type !== 'Source_Capabilities' && type !== 'EPR_Source_Capabilities') throw new CliError('input.caps', `--caps: expected a Source_Capabilities message, got ${type}`);
  return caps.message.objects as SourcePdo[];
}

export function describeMessage(io: CliIo, message: Message, warnings: Finding[]): string {
  const h = message.header;
  const who = h.cablePlug !== undefined ? (h.cablePlug ? 'from a cable plug' : 'to a cable plug') : `from ${h.powerRole}/${h.dataRole?.toUpperCase()}`;
  const lines = [`${paint(io, 'bold', h.messageType)}  ${message.sop}  ${h.category}, ${who}, revision ${h.specRevision}, MessageID ${h.messageId}, header ${h.raw}`];
  const e = message.extendedHeader;
  if (e) {
    const what = e.requestChunk ? `request for chunk ${e.chunkNumber}` : e.chunked ? `chunk ${e.chunkNumber} of a ${e.dataSize}-byte block` : `unchunked, ${e.dataSize} bytes`;
    lines.push(`extended header ${e.raw}: ${what}${message.payload ? `; data ${message.payload}` : ''}`);
  }
  let out = lines.join('\n') + '\n';
  if (message.objects.length > 0) {
    const rows = [['#', 'kind', 'raw', 'fields'].map((c) => paint(io, 'dim', c))];
    for (const [i, o] of message.objects.entries()) rows.push([String(i + 1), o.kind, o.raw, summarizeObject(o)]);
    out += formatTable(rows);
  }
  if (message.data) {
    const rows = Object.entries(message.data).map(([k, v]) => [`  ${k}`, v === null ? 'not supported' : String(v)]);
    out += 'data:\n' + formatTable(rows);
  }
  if (message.crc) out += `CRC ${message.crc.value}: ${message.crc.ok ? paint(io, 'green', 'ok') : paint(io, 'red', 'wrong')}\n`;
  for (const w of warnings) {
    const colour = w.severity === 'error' ? 'red' : w.severity === 'warning' ? 'yellow' : 'dim';
    out += `${paint(io, colour, w.severity)} ${w.rule}${w.object ? ` (object ${w.object})` : ''}: ${w.message}\n`;
  }
  return out;
}
