/**
 * Decodes each distinct message once: a long trace repeats a handful of messages (the MessageID
 * in the header makes at most eight copies of each), so the analyser looks the hex up here and
 * decodes only what it has not seen. Bounded: the map is emptied when it grows past `limit`.
 */
import type { EngineError } from '../core/result.ts';
import type { Finding } from '../core/finding.ts';
import { decodeMessage, parseHex } from '../pd/index.ts';
import type { Message, PowerRole, Sop, SourcePdo, SpecRevision } from '../pd/types.ts';
import { remember, type AnalyserMemo } from './memo.ts';
import { messageDurationUs } from './wire-time.ts';

export interface DecodedMessage {
  bytes: Uint8Array;
  message: Message;
  /** Lower-case hex without separators. */
  hex: string;
  warnings: Finding[];
  messageType: string;
  messageId: number;
  revision: SpecRevision;
  powerRole: PowerRole | undefined;
  cablePlug: boolean;
  objectCount: number;
  durationUs: number;
}

export interface CacheEntry {
  decoded: DecodedMessage | undefined;
  error: EngineError | undefined;
  /** How many times this entry was asked for; 1 on the first look-up. */
  uses: number;
}

export interface TypedEntry {
  message: Message;
  warnings: Finding[];
  uses: number;
}

export interface DecodeCache {
  get(msg: string, sop: Sop): CacheEntry;
  /** A Request decoded against the offers in force (so its RDO is typed), keyed by those offers. */
  typed(decoded: DecodedMessage, sop: Sop, offersKey: string, offers: readonly SourcePdo[]): TypedEntry;
}

const PLAIN_HEX = /^[0-9a-f]*$/;

/** `memo` shares the decoding (not the per-trace use counts) with other analysers (memo.ts). */
export function createDecodeCache(limit = 4_096, memo?: AnalyserMemo): DecodeCache {
  const entries = new Map<string, CacheEntry>();
  const typedEntries = new Map<string, TypedEntry>();
  return {
    typed(decoded, sop, offersKey, offers) {
      const key = `${offersKey} ${sop} ${decoded.hex}`;
      let entry = typedEntries.get(key);
      if (entry === undefined) {
        if (typedEntries.size >= limit) typedEntries.clear();
        const outcome = remember(memo, 'typed', key, () => {
          const result = decodeMessage(decoded.bytes, { sop, caps: offers });
          return result.ok ? { message: result.message, warnings: result.warnings } : { message: decoded.message, warnings: [] };
        });
        entry = { ...outcome, uses: 0 };
        typedEntries.set(key, entry);
      }
      entry.uses++;
      return entry;
    },
    get(msg, sop) {
      const key = sop === 'SOP' ? msg : `${sop} ${msg}`;
      let entry = entries.get(key);
      if (entry === undefined) {
        if (entries.size >= limit) entries.clear();
        entry = { ...remember(memo, 'decoded', key, () => decodeEntry(msg, sop)), uses: 0 };
        entries.set(key, entry);
      }
      entry.uses++;
      return entry;
    },
  };
}

function decodeEntry(msg: string, sop: Sop): Omit<CacheEntry, 'uses'> {
  const parsed = parseHex(msg);
  if (!parsed.ok) return { decoded: undefined, error: parsed.error };
  const result = decodeMessage(parsed.bytes, { sop });
  if (!result.ok) return { decoded: undefined, error: result.error };
  const { message } = result;
  const header = message.header;
  const hex = PLAIN_HEX.test(msg) ? msg : toPlainHex(parsed.bytes);
  return {
    decoded: {
      bytes: parsed.bytes,
      message,
      hex,
      warnings: result.warnings,
      messageType: header.messageType,
      messageId: header.messageId,
      revision: header.specRevision,
      powerRole: header.powerRole,
      cablePlug: header.cablePlug === true,
      objectCount: header.numDataObjects,
      durationUs: messageDurationUs(parsed.bytes.length),
    },
    error: undefined,
  };
}

function toPlainHex(bytes: Uint8Array): string {
  let out = '';
  for (const b of bytes) out += b.toString(16).padStart(2, '0');
  return out;
}

/** The 32-bit data object at 1-based `position`, as sent little-endian after the 2-byte header. */
export function objectAt(bytes: Uint8Array, position: number): number | undefined {
  const at = 2 + 4 * (position - 1);
  if (at + 4 > bytes.length) return undefined;
  return (bytes[at]! | (bytes[at + 1]! << 8) | (bytes[at + 2]! << 16) | (bytes[at + 3]! << 24)) >>> 0;
}
