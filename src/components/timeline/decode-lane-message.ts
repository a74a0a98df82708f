/**
 * Decoding a timeline message on demand from its wire hex (the stored analysis keeps no decoded
 * form): only the rows on screen and the selected message are decoded. A Request is typed by the
 * last Source_Capabilities before it, as the analyser does (USB PD R3.2 V1.1 §6.4.2: an RDO's
 * layout depends on the PDO it names).
 */
import { decodeMessage, parseHex, summarizeObject, type Message, type Sop } from '../../../shared/pd/index.ts';
import type { LaneMessage } from './message-lanes.tsx';

/** For each message, the index of the last Source_Capabilities at or before it (-1: none). */
export function lastCapsIndex(messages: readonly LaneMessage[]): Int32Array {
  const out = new Int32Array(messages.length);
  let last = -1;
  for (let index = 0; index < messages.length; index++) {
    if (messages[index]!.messageType === 'Source_Capabilities' && messages[index]!.crcOk) last = index;
    out[index] = last;
  }
  return out;
}

export function decodeLaneMessage(messages: readonly LaneMessage[], capsBefore: Int32Array, index: number): Message | null {
  const m = messages[index];
  if (!m) return null;
  const capsAt = capsBefore[index] ?? -1;
  return decodeWithOffer(m, capsAt >= 0 ? messages[capsAt] : undefined);
}

/** One message decoded, a Request against `offer` (the last Source_Capabilities before it). */
export function decodeWithOffer(m: LaneMessage, offer: LaneMessage | undefined): Message | null {
  if (!m.hex) return null;
  const bytes = parseHex(m.hex);
  if (!bytes.ok) return null;
  let caps: Message['objects'] | undefined;
  if (m.messageType === 'Request' && offer?.hex) {
    const offerBytes = parseHex(offer.hex);
    const decoded = offerBytes.ok ? decodeMessage(offerBytes.bytes) : null;
    if (decoded?.ok) caps = decoded.message.objects;
  }
  const decoded = decodeMessage(bytes.bytes, { sop: (m.sop ?? 'SOP') as Sop, ...(caps ? { caps } : {}) });
  return decoded.ok ? decoded.message : null;
}

/** One line for a list row: the data objects in words, or the header's essentials. */
export function oneLineDecode(message: Message | null): string {
  if (!message) return 'not decoded';
  if (message.objects.length > 0) return message.objects.map((object, index) => `#${index + 1} ${summarizeObject(object)}`).join(' · ');
  if (message.data)
    return Object.entries(message.data)
      .slice(0, 4)
      .map(([key, value]) => `${key} ${String(value)}`)
      .join(', ');
  return `${message.header.category} message, revision ${message.header.specRevision}`;
}
