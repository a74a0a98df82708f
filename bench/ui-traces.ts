/**
 * The captures `npm run bench:ui` opens, written with the engine's codec (shared/pd encodeMessage)
 * so the analyser reads real PD words:
 * - steady captures of a given size: a fixed 9 V contract the sink re-requests every 2 s,
 *   VBUS/IBUS read every 10 ms;
 * - the programmable ramp: a sink stepping its programmable (PPS) voltage 20 mV every 500 ms for
 *   10,000 steps (10,000 contracts), VBUS read every 100 ms, following each step.
 */
import { writeFileSync } from 'node:fs';
import { encodeMessage, toHex } from '../shared/pd/index.ts';
import { fixedPdo, ppsApdo } from '../shared/rules/pdo-builders.ts';

type Side = 'source' | 'sink';

/** Wire hex of a message built by the engine's encoder (so the analyser reads real PD words). */
function hexOf(input: Parameters<typeof encodeMessage>[0]): string {
  const encoded = encodeMessage(input);
  if (!encoded.ok) throw new Error(`encode: ${encoded.error.message}`);
  return toHex(encoded.bytes);
}

function control(messageType: string, messageId: number, from: Side): string {
  return hexOf({ header: { messageType, messageId, powerRole: from, dataRole: from === 'source' ? 'dfp' : 'ufp', specRevision: '3.0', extended: false } as never });
}

/** The K65-like offer: 5, 9, 15 V fixed and a 3.3–11 V programmable supply (object 4). */
const CAPS_HEX = hexOf({
  header: { messageType: 'Source_Capabilities', messageId: 0, powerRole: 'source', dataRole: 'dfp', specRevision: '3.0', extended: false },
  objects: [fixedPdo(5_000, 3_000), fixedPdo(9_000, 3_000), fixedPdo(15_000, 3_000), ppsApdo(3_300, 11_000, 3_000)],
} as never);

function request(messageId: number, rdo: Record<string, unknown>): string {
  return hexOf({ header: { messageType: 'Request', messageId, powerRole: 'sink', dataRole: 'ufp', specRevision: '3.0', extended: false }, objects: [rdo] } as never);
}
const rdoFlags = { capabilityMismatch: false, usbCommunicationsCapable: false, noUsbSuspend: true, unchunkedExtendedMessages: false, eprModeCapable: false };
const ppsRdo = (outputVoltageMv: number) => ({ kind: 'rdo-pps', objectPosition: 4, outputVoltageMv, operatingCurrentMa: 2_000, ...rdoFlags });

type Writer = { line(text: string): void; close(): void };

function writer(path: string): Writer {
  const parts: string[] = [];
  return {
    line: (text) => void parts.push(text),
    close: () => writeFileSync(path, parts.join('\n') + '\n'),
  };
}

/** Request, Accept and PS_RDY with their GoodCRCs (USB PD R3.2 V1.1 §8.3.2.2, from memory). */
function negotiation(w: Writer, t: number, requestHex: (id: number) => string, ids: { src: number; snk: number }): number {
  const msg = (at: number, hex: string, from: Side) => w.line(`{"t":${at},"msg":"${hex}","from":"${from}"}`);
  msg(t, requestHex(ids.snk), 'sink');
  msg(t + 700, control('GoodCRC', ids.snk, 'source'), 'source');
  msg(t + 3_000, control('Accept', ids.src, 'source'), 'source');
  msg(t + 3_600, control('GoodCRC', ids.src, 'sink'), 'sink');
  ids.src = (ids.src + 1) % 8;
  msg(t + 40_000, control('PS_RDY', ids.src, 'source'), 'source');
  msg(t + 40_600, control('GoodCRC', ids.src, 'sink'), 'sink');
  ids.src = (ids.src + 1) % 8;
  ids.snk = (ids.snk + 1) % 8;
  return t + 41_000;
}

function start(w: Writer, title: string): { t: number; ids: { src: number; snk: number } } {
  w.line(JSON.stringify({ trace: 1, title, capturedAt: '2026-11-30T09:12:00Z' }));
  w.line('{"t":0,"event":"attach","cc":"CC1","rp":"3.0A"}');
  w.line(`{"t":150000,"msg":"${CAPS_HEX}","from":"source"}`);
  w.line(`{"t":151100,"msg":"${control('GoodCRC', 0, 'sink')}","from":"sink"}`);
  return { t: 155_000, ids: { src: 1, snk: 0 } };
}

/** A fixed 9 V contract re-requested every 2 s, VBUS read every 10 ms, until the file holds about `bytes`. */
export function steadyTrace(path: string, bytes: number): void {
  const w = writer(path);
  const begun = start(w, `Kestrel K65 soak, ${Math.round(bytes / 1e6)} MB`);
  let { t } = begun;
  const { ids } = begun;
  let size = 0;
  // 9 V 2 A from object 2: the fixed RDO as the codec decodes it (kind rdo-fixed).
  const fixed = (id: number) => request(id, { kind: 'rdo-fixed', objectPosition: 2, operatingCurrentMa: 2_000, maxOperatingCurrentMa: 2_000, giveBack: false, ...rdoFlags });
  const line = w.line;
  w.line = (text) => {
    size += text.length + 1;
    line(text);
  };
  while (size < bytes) {
    const end = negotiation(w, t, fixed, ids);
    for (let r = t + 50_000; r < t + 2_000_000; r += 10_000) w.line(`{"t":${r},"vbus":{"mv":${9_000 + (Math.floor(r / 10_000) % 7) - 3},"ma":${1_950 + (Math.floor(r / 10_000) % 11)}}}`);
    t = Math.max(end, t + 2_000_000);
  }
  w.close();
}

/** The programmable ramp: 10,000 PPS steps of 20 mV every 500 ms, VBUS read every 100 ms. */
export function rampTrace(path: string): void {
  const w = writer(path);
  const begun = start(w, 'Kestrel K65 programmable ramp');
  let { t } = begun;
  const { ids } = begun;
  for (let step = 0; step < 10_000; step++) {
    const outputVoltageMv = 5_000 + (step % 300) * 20;
    const stepStart = t;
    negotiation(w, t, (id) => request(id, ppsRdo(outputVoltageMv)), ids);
    for (let r = stepStart + 100_000; r < stepStart + 500_000; r += 100_000) w.line(`{"t":${r},"vbus":{"mv":${outputVoltageMv + (r % 7)},"ma":2000}}`);
    t = stepStart + 500_000;
  }
  w.close();
}
