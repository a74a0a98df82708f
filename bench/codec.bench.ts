/**
 * `npm run bench:codec`: decode and encode throughput of a 7-object Source_Capabilities, against
 * JSON.parse of the same decoded message's JSON in the same run (target: decode ≤ 0.5× JSON.parse).
 * Also: a trace's mix of messages (mostly GoodCRC and control messages) per message, and the byte
 * table of hex32 against the toString(16) + padStart form it replaced, both in the same run.
 * Prints figures; asserts nothing (speed targets are never timed tests).
 */
import { decodeMessage, encodeMessage, hex32, parseHex, type Message } from '../shared/pd/index.ts';
import { report } from './report.ts';

// Kestrel Devices demo charger offers: 5/9/12/15/20 V fixed, PPS 3.3–11 V and 3.3–21 V (header 0x71a1: 7 objects).
const HEX = 'a1712c9101082cd102002cc103002cb10400454106003c21dcc03c21a4c1';
const parsed = parseHex(HEX);
if (!parsed.ok) throw new Error(parsed.error.message);
const bytes = parsed.bytes;
const first = decodeMessage(bytes);
if (!first.ok) throw new Error(first.error.message);
const message: Message = first.message;
const json = JSON.stringify(message);

function timeNs(label: string, iterations: number, fn: () => unknown): number {
  let sink: unknown;
  for (let i = 0; i < 20_000; i++) sink = fn(); // warm up the JIT
  const rounds: number[] = [];
  for (let r = 0; r < 7; r++) {
    const start = process.hrtime.bigint();
    for (let i = 0; i < iterations; i++) sink = fn();
    rounds.push(Number(process.hrtime.bigint() - start) / iterations);
  }
  rounds.sort((a, b) => a - b);
  const median = rounds[3]!;
  if (sink === undefined) throw new Error('no result');
  console.log(`${label.padEnd(34)} ${median.toFixed(0).padStart(6)} ns/op  ${(1e9 / median / 1e3).toFixed(0).padStart(6)} k msg/s`);
  return median;
}

const N = 100_000;
console.log(`7-object Source_Capabilities: ${bytes.length} bytes on the wire, ${json.length} bytes of JSON`);
const decodeNs = timeNs('decodeMessage', N, () => decodeMessage(bytes));
const encodeNs = timeNs('encodeMessage', N, () => encodeMessage(message));
const parseNs = timeNs('JSON.parse (same message)', N, () => JSON.parse(json));
const ratio = decodeNs / parseNs;
console.log(`decode / JSON.parse = ${ratio.toFixed(2)}× (target ≤ 0.50×): ${ratio <= 0.5 ? 'met' : 'NOT met'}`);
console.log(`encode / JSON.parse = ${(encodeNs / parseNs).toFixed(2)}×`);

// A negotiation as a trace holds it: Source_Capabilities, Request, Accept, PS_RDY, each with its GoodCRC.
const MIX = [HEX, '4100', '82102cb10413', '6101', 'a103', '4102', 'a605', '6103'].map((h) => {
  const p = parseHex(h);
  if (!p.ok) throw new Error(p.error.message);
  return p.bytes;
});
let m = 0;
const mixNs = timeNs('decodeMessage, negotiation mix', N, () => decodeMessage(MIX[m++ & 7]!));

const words = Uint32Array.from({ length: 1024 }, (_, i) => Math.imul(i, 0x9e37_79b1) >>> 0);
let w = 0;
const arithmetic = (value: number) => '0x' + (value >>> 0).toString(16).padStart(8, '0');
const tableNs = timeNs('hex32 (byte table)', N * 10, () => hex32(words[w++ & 1023]!));
const arithmeticNs = timeNs('hex32 as toString(16) + padStart', N * 10, () => arithmetic(words[w++ & 1023]!));
console.log(`hex32 byte table / toString form = ${(tableNs / arithmeticNs).toFixed(2)}×`);

report('codec', [
  { figure: 'decode, 7-object Source_Capabilities', unit: 'ns/msg', parley: decodeNs, peer: parseNs, peerName: 'JSON.parse of its output', target: '≤ 0.5×', met: ratio <= 0.5 },
  { figure: 'encode, 7-object Source_Capabilities', unit: 'ns/msg', parley: encodeNs, peer: parseNs, peerName: 'JSON.parse of its output' },
  { figure: 'decode, negotiation mix', unit: 'ns/msg', parley: mixNs },
  { figure: 'hex32 (byte table)', unit: 'ns', parley: tableNs, peer: arithmeticNs, peerName: 'toString(16) + padStart' },
]);
