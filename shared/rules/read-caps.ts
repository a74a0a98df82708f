/**
 * Reads offers from user input: a Source_Capabilities or EPR_Source_Capabilities message in hex,
 * or a list of 32-bit PDOs ("0x0001912c", …). Never throws; bad input gives a "field: message" error.
 */
import type { Finding } from '../core/finding.ts';
import { fail, type Result } from '../core/result.ts';
import { decodeMessage, decodeSourcePdo, parseHex } from '../pd/index.ts';
import type { DataObject, Message, SourcePdo } from '../pd/types.ts';

export interface ReadCaps {
  pdos: SourcePdo[];
  /** True for EPR_Source_Capabilities (SPR offers in 1–7, EPR from 8). */
  epr: boolean;
  /** The decoder's warnings (reserved bits, …). */
  warnings: Finding[];
  message?: Message;
}

const CAPS_TYPES = new Set(['Source_Capabilities', 'EPR_Source_Capabilities']);
const PDO_KINDS = new Set(['fixed', 'variable', 'battery', 'pps', 'epr-avs', 'spr-avs']);

function asSourcePdos(objects: readonly DataObject[], field: string): Result<{ pdos: SourcePdo[] }> {
  const index = objects.findIndex((o) => !PDO_KINDS.has(o.kind));
  if (index !== -1) {
    return fail('input.caps', `${field}: object ${index + 1} (${objects[index]!.raw}) is of a reserved type, so the offers cannot be checked`);
  }
  return { ok: true, pdos: objects as SourcePdo[] };
}

export function readCapsHex(hex: string, field = 'caps'): Result<ReadCaps> {
  const bytes = parseHex(hex);
  if (!bytes.ok) return fail('input.caps', `${field}: ${bytes.error.message}`, { offset: bytes.error.offset });
  const decoded = decodeMessage(bytes.bytes);
  if (!decoded.ok) return fail('input.caps', `${field}: ${decoded.error.message}`, { offset: decoded.error.offset });
  const { message, warnings } = decoded;
  if (!CAPS_TYPES.has(message.header.messageType)) {
    return fail('input.caps', `${field}: the message is ${message.header.messageType}, not Source_Capabilities or EPR_Source_Capabilities`);
  }
  const pdos = asSourcePdos(message.objects, field);
  if (!pdos.ok) return pdos;
  return { ok: true, pdos: pdos.pdos, epr: message.header.messageType === 'EPR_Source_Capabilities', warnings, message };
}

export function readPdoList(words: readonly (string | number)[], options: { epr?: boolean; field?: string } = {}): Result<ReadCaps> {
  const field = options.field ?? 'pdos';
  const objects: DataObject[] = [];
  for (const [i, word] of words.entries()) {
    const text = typeof word === 'number' ? word.toString(16) : word.trim();
    if (!/^(0x)?[0-9a-f]{1,8}$/i.test(text) || (typeof word === 'number' && (!Number.isInteger(word) || word < 0 || word > 0xffff_ffff))) {
      return fail('input.pdos', `${field}: item ${i + 1} ("${String(word)}") is not a 32-bit hex word like 0x0001912c`);
    }
    objects.push(decodeSourcePdo(Number.parseInt(text, 16) >>> 0));
  }
  if (objects.length === 0) return fail('input.pdos', `${field}: give at least one PDO`);
  const pdos = asSourcePdos(objects, field);
  if (!pdos.ok) return pdos;
  return { ok: true, pdos: pdos.pdos, epr: options.epr ?? false, warnings: [] };
}
