/**
 * Builds the invented demo traces (Kestrel devices only) from a few lines of script each: the
 * message hex comes from the codec (`encodeMessage`), never typed by hand, and every message but
 * GoodCRC gets its GoodCRC from the other side shortly after its end on the wire, as a capture on
 * the CC line shows it. `npx tsx server/db/demo-traces/generate.ts` writes the files; the test
 * beside this module checks the files still equal what this builds.
 */
import { decodeSourcePdo, encodeMessage, encodeRdo, hex32, toHex, type MessageInput } from '../../../shared/pd/index.ts';
import type { Rdo } from '../../../shared/pd/types.ts';
import { messageDurationUs } from '../../../shared/trace/index.ts';
import type { TraceRecord } from '../../../shared/trace/index.ts';

type Side = 'source' | 'sink';

/** A GoodCRC starts this long after the end of the message it acknowledges (well inside tReceive; invented). */
const GOODCRC_GAP_US = 80;

export interface DemoScript {
  records: TraceRecord[];
  /** Message counters per side (MessageID, 3 bits). */
  ids: Record<Side, number>;
  /** Wire-order hex of each message sent. */
  send(t: number, from: Side, messageType: string, objects?: MessageInput['objects'], options?: { ack?: boolean; keepId?: boolean }): number;
  vbus(t: number, mv: number, ma?: number): void;
  event(t: number, event: 'attach' | 'detach' | 'hard_reset', from?: Side): void;
  note(t: number, text: string): void;
  resetIds(): void;
}

function messageHex(from: Side, messageType: string, messageId: number, objects: MessageInput['objects'] = []): string {
  const encoded = encodeMessage({
    sop: 'SOP',
    header: {
      messageType,
      messageId,
      specRevision: '3.0',
      powerRole: from,
      dataRole: from === 'source' ? 'dfp' : 'ufp',
      extended: false,
    },
    objects,
  });
  if (!encoded.ok) throw new Error(`demo trace: ${messageType}: ${encoded.error.message}`);
  return toHex(encoded.bytes);
}

export function createScript(): DemoScript {
  const records: TraceRecord[] = [];
  const ids: Record<Side, number> = { source: 0, sink: 0 };
  const other = (side: Side): Side => (side === 'source' ? 'sink' : 'source');
  return {
    records,
    ids,
    send(t, from, messageType, objects = [], options = {}) {
      const id = ids[from];
      const msg = messageHex(from, messageType, id, objects);
      records.push({ t, msg, from });
      const endUs = t + messageDurationUs(msg.length / 2);
      if (options.ack !== false) {
        const goodCrc = messageHex(other(from), 'GoodCRC', id);
        records.push({ t: endUs + GOODCRC_GAP_US, msg: goodCrc, from: other(from) });
      }
      // A message that got no GoodCRC is retried with the same MessageID (USB PD R3.2 V1.1 §6.7.2, from memory).
      if (options.ack !== false && !options.keepId) ids[from] = (id + 1) % 8;
      return endUs + (options.ack !== false ? GOODCRC_GAP_US + messageDurationUs(2) : 0);
    },
    vbus(t, mv, ma) {
      records.push(ma === undefined ? { t, vbus: { mv } } : { t, vbus: { mv, ma } });
    },
    event(t, event, from) {
      records.push(from ? { t, event, from } : { t, event });
    },
    note(t, text) {
      records.push({ t, note: text });
    },
    resetIds() {
      ids.source = 0;
      ids.sink = 0;
    },
  };
}

/** The Source_Capabilities objects of a demo device's PDO words (seed.ts). */
export function capsObjects(pdoWords: readonly string[]): MessageInput['objects'] {
  return pdoWords.map((word) => decodeSourcePdo(Number.parseInt(word, 16)));
}

/** A fixed-supply Request object (USB PD R3.2 V1.1 §6.4.2, Table 6.23 Fixed and Variable RDO). */
export function fixedRdo(objectPosition: number, currentMa: number, maxCurrentMa = currentMa): Rdo {
  const rdo: Rdo = {
    kind: 'rdo-fixed',
    raw: '',
    objectPosition,
    operatingCurrentMa: currentMa,
    maxOperatingCurrentMa: maxCurrentMa,
    giveBack: false,
    capabilityMismatch: false,
    usbCommunicationsCapable: false,
    noUsbSuspend: true,
    unchunkedExtendedMessages: false,
    eprModeCapable: false,
  };
  return { ...rdo, raw: hex32(encodeRdo(rdo)) };
}

/** A programmable Request object (USB PD R3.2 V1.1 §6.4.2, Table 6.25 PPS RDO). */
export function ppsRdo(objectPosition: number, outputVoltageMv: number, operatingCurrentMa: number): Rdo {
  const rdo: Rdo = {
    kind: 'rdo-pps',
    raw: '',
    objectPosition,
    outputVoltageMv,
    operatingCurrentMa,
    capabilityMismatch: false,
    usbCommunicationsCapable: false,
    noUsbSuspend: true,
    unchunkedExtendedMessages: false,
    eprModeCapable: false,
  };
  return { ...rdo, raw: hex32(encodeRdo(rdo)) };
}

/** Deterministic jitter for invented measurements (a tiny linear congruential generator). */
export function createJitter(seed: number): (spread: number) => number {
  let state = seed >>> 0;
  return (spread) => {
    state = (Math.imul(state, 1_664_525) + 1_013_904_223) >>> 0;
    return Math.round(((state / 0x1_0000_0000) * 2 - 1) * spread);
  };
}

/** JSON Lines: the header line, then one record a line (trace.md). */
export function toJsonLines(header: Record<string, unknown>, records: readonly TraceRecord[]): string {
  return `${[{ trace: 1, ...header }, ...records].map((r) => JSON.stringify(r)).join('\n')}\n`;
}

const WHO: Record<string, string> = { source: 'SRC', sink: 'SNK', cable: 'CBL' };

/** Plain text (trace.md): time in seconds with microsecond digits, who, payload bytes. */
export function toText(title: string, records: readonly TraceRecord[]): string {
  const lines = [`# ${title}`, '# time(s)   who   payload'];
  for (const r of records) {
    const time = (r.t / 1_000_000).toFixed(6);
    if ('msg' in r) lines.push(`${time}  ${WHO[r.from ?? 'source']}  ${r.msg.match(/../g)!.join(' ')}`);
    else if ('vbus' in r) lines.push(`${time}  VBUS ${r.vbus.mv}mV${r.vbus.ma === undefined ? '' : ` ${r.vbus.ma}mA`}`);
    else if ('event' in r) lines.push(`${time}  ${WHO[r.from ?? 'source']}  ${r.event.toUpperCase()}`);
    else lines.push(`# ${(r.t / 1_000_000).toFixed(6)} ${r.note}`);
  }
  return `${lines.join('\n')}\n`;
}
