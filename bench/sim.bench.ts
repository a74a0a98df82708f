/**
 * `npm run bench:sim`: the simulator's two speed figures, on one core.
 *  1. Negotiations per second, attach → explicit contract, on the fast path the property tests and
 *     vector runs use (`decode: false, analyze: false, untilContract: true`); target ≥ 20,000.
 *     The full path (decoded messages, analyser) is timed in the same run as the baseline.
 *  2. The time to simulate 60 s of a programmable contract with 1 ms samples (60,001 samples).
 */
import { parseScenario, simulate, type SimulateOptions } from '../shared/sim/index.ts';
import { report } from './report.ts';

const TARGET_PER_S = 20_000;

function scenario(input: unknown) {
  const parsed = parseScenario(input);
  if (!parsed.ok) throw new Error(parsed.error.message);
  return parsed.scenario;
}

// Kestrel Devices K45 demo adapter: 5 V, 9 V, 15 V at 3 A and PPS 3.3–11 V 3 A.
const caps = { pdos: ['0x0001912c', '0x0002d12c', '0x0004b12c', '0xc0dc213c'] };
const fixed = scenario({ source: { caps }, sink: { policy: { kind: 'max-power' } }, durationMs: 2_000 });
const programmable = scenario({ source: { caps }, sink: { policy: { kind: 'pps', voltageMv: 9_000, currentMa: 2_000 } }, durationMs: 60_000 });

function negotiationsPerSecond(options: SimulateOptions, seconds: number): { perS: number; contracts: number; runs: number } {
  let runs = 0;
  let contracts = 0;
  const warmEnd = performance.now() + 300;
  while (performance.now() < warmEnd) simulate({ ...fixed, seed: runs++ }, options);
  runs = 0;
  const start = performance.now();
  let now = start;
  while (now - start < seconds * 1_000) {
    for (let i = 0; i < 100; i++) if (simulate({ ...fixed, seed: runs++ }, options).contract) contracts++;
    now = performance.now();
  }
  return { perS: Math.round(runs / ((now - start) / 1_000)), contracts, runs };
}

const fast = negotiationsPerSecond({ decode: false, analyze: false, untilContract: true }, 3);
const full = negotiationsPerSecond({ untilContract: true }, 2);
const fmt = (n: number) => n.toLocaleString('en-US');
console.log(`negotiations (attach → explicit contract), one core:`);
console.log(`  fast path (no decode, no analysis): ${fmt(fast.perS)}/s  (${fast.contracts}/${fast.runs} reached a contract)`);
console.log(`  full path (decoded + analysed):     ${fmt(full.perS)}/s  (baseline; fast path is ${(fast.perS / full.perS).toFixed(1)}× it)`);
console.log(`  target ${fmt(TARGET_PER_S)}/s: ${fast.perS >= TARGET_PER_S ? 'met' : 'NOT met'} (${(fast.perS / TARGET_PER_S).toFixed(2)}× the target)`);

const timesMs: number[] = [];
let samples = 0;
for (let i = 0; i < 5; i++) {
  const start = performance.now();
  const result = simulate({ ...programmable, seed: i + 1 }, { samples: true, sampleEveryUs: 1_000 });
  timesMs.push(performance.now() - start);
  samples = result.samples?.count ?? 0;
  if (result.contract?.kind !== 'pps') throw new Error('the programmable contract was lost');
}
timesMs.sort((a, b) => a - b);
console.log(`60 s of a PPS contract with 1 ms samples (${fmt(samples)} samples, decoded + analysed): median ${timesMs[2]!.toFixed(1)} ms, best ${timesMs[0]!.toFixed(1)} ms`);
report('sim', [
  { figure: 'negotiations to contract, fast path', unit: '/s', parley: fast.perS, peer: full.perS, peerName: 'full path', higherIsBetter: true, target: `≥ ${fmt(TARGET_PER_S)}/s`, met: fast.perS >= TARGET_PER_S },
  { figure: '60 s PPS run with 1 ms samples', unit: 'ms', parley: timesMs[2]! },
]);
