/**
 * `npm run bench:sweep`: fault-sweep runs per second for an SPR scenario (Kestrel Devices K27,
 * 9 V 2 A; every placement of drop/corrupt/delay and every timer edge), on one core and on all
 * cores (worker threads), against the bare `simulate()` rate of the very same scenarios measured in
 * the same run (no judging, no analyser). Target ≥ 10,000 runs/s per core. Not a test.
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { parseScenario } from '../shared/sim/index.ts';
import { simulate } from '../shared/sim/simulate.ts';
import { planSweep, runSlice, scenarioFor, type SweepOptions } from '../shared/sweep/index.ts';
import { report } from './report.ts';

const TARGET_PER_CORE = 10_000;
const SECONDS = 3;
const WARM_SECONDS = 1;

const parsed = parseScenario({ source: { caps: { pdos: ['0x0001912c', '0x0002d12c'] } }, sink: { policy: { kind: 'fixed', voltageMv: 9_000, currentMa: 2_000 } }, durationMs: 5_000, seed: 3 });
if (!parsed.ok) throw new Error(parsed.error.message);
const scenario = parsed.scenario;
const options: SweepOptions = { timerEdges: true };
const planned = planSweep(scenario, options);
if (!planned.ok) throw new Error(planned.error.message);
const { plan } = planned;
const scenarios = plan.placements.map((p) => scenarioFor(scenario, p));

function rate(seconds: number, body: () => number): number {
  let runs = 0;
  const start = performance.now();
  while (performance.now() - start < seconds * 1_000) runs += body();
  return Math.round(runs / ((performance.now() - start) / 1_000));
}

const bareRun = () => {
  for (const s of scenarios) simulate(s, { decode: false, analyze: false });
  return scenarios.length;
};
const sweepRun = () => runSlice(plan).runs.length;

rate(WARM_SECONDS, bareRun);
const bare = rate(SECONDS, bareRun);
rate(WARM_SECONDS, sweepRun);
const oneCore = rate(SECONDS, sweepRun);

const cores = availableParallelism();
const results = await Promise.all(
  Array.from(
    { length: cores },
    () =>
      new Promise<{ runs: number; ms: number }>((resolve, reject) => {
        const worker = new Worker(new URL('./sweep-worker.mjs', import.meta.url), { workerData: { scenario, options, seconds: SECONDS, warmSeconds: WARM_SECONDS } });
        worker.once('message', (m: { runs: number; ms: number }) => void worker.terminate().then(() => resolve(m)));
        worker.once('error', reject);
      }),
  ),
);
const allCores = Math.round(results.reduce((sum, r) => sum + r.runs / (r.ms / 1_000), 0));

const fmt = (n: number) => n.toLocaleString('en-US');
console.log(
  `fault sweep of a 9 V SPR negotiation: ${plan.placements.length} runs a campaign (${plan.messages.length} messages; drop, corrupt, 2 delays, ${plan.placements.filter((p) => p.timers).length} timer edges)`,
);
console.log(`  baseline, bare simulate() of the same scenarios: ${fmt(bare)}/s on one core`);
console.log(`  sweep runs (simulate + analyser + invariants):   ${fmt(oneCore)}/s on one core (${(oneCore / bare).toFixed(2)}× the baseline)`);
console.log(`  sweep runs on all ${cores} cores (worker threads):   ${fmt(allCores)}/s (${(allCores / oneCore).toFixed(2)}× one core)`);
console.log(`  target ${fmt(TARGET_PER_CORE)}/s per core: ${oneCore >= TARGET_PER_CORE ? 'met' : 'NOT met'} (${(oneCore / TARGET_PER_CORE).toFixed(2)}× the target)`);
report('sweep', [
  {
    figure: 'sweep runs, one core (9 V SPR)',
    unit: '/s',
    parley: oneCore,
    peer: bare,
    peerName: 'bare simulate()',
    higherIsBetter: true,
    target: `≥ ${fmt(TARGET_PER_CORE)}/s`,
    met: oneCore >= TARGET_PER_CORE,
  },
  { figure: `sweep runs, all ${cores} cores`, unit: '/s', parley: allCores, peer: oneCore, peerName: 'one core', higherIsBetter: true },
]);
