/**
 * A trace whose every message is known by its place (invented data at the fictional maker Kestrel
 * Devices), written with the engine's codec (shared/pd encodeMessage) so the analyser reads real
 * PD words: the source's offer (5 V and 9 V fixed, 3 A) and its GoodCRC, then once a second the
 * sink asks again for 9 V 2 A — Request, Accept, PS_RDY, each with its GoodCRC (USB PD R3.2 V1.1
 * §8.3.2.2 power negotiation; times inside tSenderResponse and tPSTransition, from memory) — and
 * VBUS is read 100 ms after each PS_RDY, after its GoodCRC (readings are records, not messages:
 * no index moves).
 * `numberedMessageAt(i)` says what message `i` is, so a test checks any row of a long list.
 */
import { writeFileSync } from 'node:fs';
import { encodeMessage, toHex } from '../../shared/pd/index.ts';
import { fixedPdo } from '../../shared/rules/pdo-builders.ts';

type Side = 'source' | 'sink';

export interface NumberedMessage {
  t: number;
  messageType: 'Source_Capabilities' | 'GoodCRC' | 'Request' | 'Accept' | 'PS_RDY';
  messageId: number;
  from: Side;
}

const CYCLE = 6;
/** The first Request 8.9 ms after the offer's GoodCRC, inside tSenderResponse (from memory). */
const FIRST_REQUEST_US = 160_000;
const EVERY_US = 1_000_000;
/** Offsets in a cycle: Request, its GoodCRC, Accept, its GoodCRC, PS_RDY, its GoodCRC. */
const STEPS: { atUs: number; messageType: NumberedMessage['messageType']; from: Side; id: 'snk' | 'src' | 'src+1' }[] = [
  { atUs: 0, messageType: 'Request', from: 'sink', id: 'snk' },
  { atUs: 700, messageType: 'GoodCRC', from: 'source', id: 'snk' },
  { atUs: 3_000, messageType: 'Accept', from: 'source', id: 'src' },
  { atUs: 3_600, messageType: 'GoodCRC', from: 'sink', id: 'src' },
  { atUs: 40_000, messageType: 'PS_RDY', from: 'source', id: 'src+1' },
  { atUs: 40_600, messageType: 'GoodCRC', from: 'sink', id: 'src+1' },
];

/** Message `index` of a numbered trace (a GoodCRC carries the MessageID it acknowledges). */
export function numberedMessageAt(index: number): NumberedMessage {
  if (index === 0) return { t: 150_000, messageType: 'Source_Capabilities', messageId: 0, from: 'source' };
  if (index === 1) return { t: 151_100, messageType: 'GoodCRC', messageId: 0, from: 'sink' };
  const cycle = Math.floor((index - 2) / CYCLE);
  const step = STEPS[(index - 2) % CYCLE]!;
  // The source sent the offer as 0, so its cycle starts at 1; the sink's first Request is 0.
  const ids = { snk: cycle % 8, src: (1 + 2 * cycle) % 8, 'src+1': (2 + 2 * cycle) % 8 };
  return { t: FIRST_REQUEST_US + cycle * EVERY_US + step.atUs, messageType: step.messageType, messageId: ids[step.id], from: step.from };
}

const rdoFlags = { capabilityMismatch: false, usbCommunicationsCapable: false, noUsbSuspend: true, unchunkedExtendedMessages: false, eprModeCapable: false };

function hexOf(m: NumberedMessage): string {
  const header = { messageType: m.messageType, messageId: m.messageId, powerRole: m.from, dataRole: m.from === 'source' ? 'dfp' : 'ufp', specRevision: '3.0', extended: false };
  const objects =
    m.messageType === 'Source_Capabilities'
      ? [fixedPdo(5_000, 3_000), fixedPdo(9_000, 3_000)]
      : m.messageType === 'Request'
        ? [{ kind: 'rdo-fixed', objectPosition: 2, operatingCurrentMa: 2_000, maxOperatingCurrentMa: 2_000, giveBack: false, ...rdoFlags }]
        : undefined;
  const encoded = encodeMessage((objects ? { header, objects } : { header }) as never);
  if (!encoded.ok) throw new Error(`encode ${m.messageType}: ${encoded.error.message}`);
  return toHex(encoded.bytes);
}

/** Writes a JSON Lines trace of `messages` messages (attach first); returns its bytes. */
export function writeNumberedTrace(path: string, messages: number, title = 'Kestrel K65 on bench 3, numbered soak'): number {
  const hexCache = new Map<string, string>();
  const lines = [JSON.stringify({ trace: 1, title, capturedAt: '2026-11-30T09:12:00Z' }), '{"t":0,"event":"attach","cc":"CC1","rp":"3.0A"}'];
  for (let index = 0; index < messages; index++) {
    const m = numberedMessageAt(index);
    const key = `${m.messageType} ${m.messageId} ${m.from}`;
    let hex = hexCache.get(key);
    if (hex === undefined) {
      hex = hexOf(m);
      hexCache.set(key, hex);
    }
    lines.push(`{"t":${m.t},"msg":"${hex}","from":"${m.from}"}`);
    if (m.messageType === 'GoodCRC' && index >= 2 && (index - 2) % CYCLE === CYCLE - 1) lines.push(`{"t":${m.t + 60_000},"vbus":{"mv":${9_000 + (index % 5) * 10},"ma":2000}}`);
  }
  const text = `${lines.join('\n')}\n`;
  writeFileSync(path, text);
  return Buffer.byteLength(text);
}
