/**
 * `npm run bench:codec`: decode and encode throughput of a 7-object Source_Capabilities, against
 * JSON.parse of the same decoded message's JSON in the same run (target: decode ≤ 0.5× JSON.parse).
 * Prints figures; asserts nothing (speed targets are never timed tests).
 */
import { decodeMessage, encodeMessage, parseHex, type Message } from '../shared/pd/index.ts';

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
