/**
 * The codec off the main thread (the Decoder page): pasted text → decoded message, and a CC-line
 * VCD capture → each message in it. Both return values, never throw.
 */
import type { Result } from '../shared/core/result.ts';
import { decodeInput, decodeMessage, toHex, type Sop } from '../shared/pd/index.ts';
import { decodeVcd } from '../shared/wire/index.ts';
import { exposeEngine } from './expose.ts';

export type VcdEntry =
  | { kind: 'message'; t: number; sop: Sop; hex: string; crcOk: boolean; messageType: string; summary: string }
  | { kind: 'hard_reset' | 'cable_reset'; t: number }
  | { kind: 'unreadable'; t: number; reason: string };

export type VcdOutcome = Result<{ entries: VcdEntry[] }>;

function decodeVcdText(text: string): VcdOutcome {
  const result = decodeVcd(text);
  if (!result.ok) return { ok: false, error: result.error };
  const entries = result.events.map((event): VcdEntry => {
    if (event.kind === 'unreadable') return { kind: 'unreadable', t: event.t, reason: event.reason };
    if (event.kind !== 'message') return { kind: event.kind, t: event.t };
    const decoded = decodeMessage(event.bytes, { sop: event.sop });
    const count = decoded.ok ? decoded.message.objects.length : 0;
    return {
      kind: 'message',
      t: event.t,
      sop: event.sop,
      hex: toHex(event.bytes),
      crcOk: event.crcOk,
      messageType: decoded.ok ? decoded.message.header.messageType : 'not decodable',
      summary: decoded.ok ? `${count} object${count === 1 ? '' : 's'}` : decoded.error.message,
    };
  });
  return { ok: true, entries };
}

const api = { decodeInput, decodeVcdText };
exposeEngine(api);
export type CodecApi = typeof api;
