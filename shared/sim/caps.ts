/**
 * The source's offers of a scenario, as 32-bit words (for the wire) and decoded PDOs (for the
 * sink's policy and the source's check of a Request). `caps` is vector.md's `{ pdos }` or `{ hex }`.
 */
import { fail, type Result } from '../core/result.ts';
import type { SourcePdo } from '../pd/types.ts';
import { decodeMessage, parseHex } from '../pd/index.ts';
import { decodeSourcePdo } from '../pd/source-pdo.ts';

export type CapsInput = { pdos: string[] } | { hex: string };

export interface ResolvedCaps {
  words: number[];
  pdos: SourcePdo[];
}

const WORD = /^(0x)?[0-9a-f]{1,8}$/i;

const memo = new WeakMap<object, Result<ResolvedCaps>>();

/** Memoised by the caps object: repeated runs of one scenario decode its offers once. */
export function resolveCaps(caps: CapsInput): Result<ResolvedCaps> {
  let resolved = memo.get(caps);
  if (!resolved) {
    resolved = resolveUncached(caps);
    memo.set(caps, resolved);
  }
  return resolved;
}

function resolveUncached(caps: CapsInput): Result<ResolvedCaps> {
  if ('pdos' in caps) {
    const words: number[] = [];
    for (const [index, text] of caps.pdos.entries()) {
      const trimmed = text.trim();
      if (!WORD.test(trimmed)) return fail('scenario.pdo', `PDO ${index + 1} "${text}" is not a 32-bit hex word`);
      words.push(Number.parseInt(trimmed.replace(/^0x/i, ''), 16) >>> 0);
    }
    if (words.length === 0 || words.length > 7) return fail('scenario.pdo', 'a Source_Capabilities message carries 1 to 7 PDOs');
    // A reserved PDO type decodes as `raw`; policies and checks skip what they cannot read.
    return { ok: true, words, pdos: words.map((word) => decodeSourcePdo(word) as SourcePdo) };
  }
  const parsed = parseHex(caps.hex);
  if (!parsed.ok) return parsed;
  const decoded = decodeMessage(parsed.bytes);
  if (!decoded.ok) return decoded;
  const message = decoded.message;
  if (message.header.messageType !== 'Source_Capabilities') {
    return fail('scenario.caps', `caps.hex is a ${message.header.messageType} message, not Source_Capabilities`);
  }
  const pdos = message.objects as SourcePdo[];
  return { ok: true, words: pdos.map((pdo) => Number.parseInt(pdo.raw.replace(/^0x/i, ''), 16) >>> 0), pdos };
}
