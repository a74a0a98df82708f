/**
 * `npm run bench:sweep`: fault-sweep runs per second for an SPR scenario (Kestrel Devices K27,
 * 9 V 2 A; every placement of drop/corrupt/delay and every timer edge), on one core and on all
 * cores (worker threads). The baseline is the bare `simulate()` of the very same scenarios (no
 * judging, no analyser), measured in the same threads in alternating rounds so the machine's load
 * weighs on both alike. The engine is bundled first, as the CLI ships it (the development
 * transpiler wraps every closure and would measure itself). Target ≥ 10,000 runs/s per core.
 * Not a test.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { build } from 'esbuild';
import { report } from './report.ts';

const TARGET_PER_CORE = 10_000;
const ROUNDS = 6;
const ROUND_MS = 500;
const WARM_MS = 1_000;

const scenarioInput = { source: { caps: { pdos: ['0x0001912c', '0x0002d12c'] } }, sink: { policy: { kind: 'fixed', voltageMv: 9_000, currentMa: 2_000 } }, durationMs: 5_000, seed: 3 };
const options = { timerEdges: true };

const outdir = mkdtempSync(join(tmpdir(), 'parley-bench-sweep-'));
await build({
  entryPoints: [fileURLToPath(new URL('./sweep-engine.ts', import.meta.url))],
  outfile: join(outdir, 'engine.mjs'),
  bundle: true,
  format: 'esm',
  platform: 'neutral',
  target: 'node20',
  minifySyntax: true,
  logLevel: 'warning',
});
const engineUrl = pathToFileURL(join(outdir, 'engine.mjs')).href;

interface Totals {
  runs: number;
  ms: number;
  cpuMs: number;
}
interface WorkerResult {
  totals: { bare: Totals; sweep: Totals };
  campaign: { runs: number; messages: number; timerEdges: number };
}

function measure(threads: number): Promise<WorkerResult[]> {
  return Promise.all(
    Array.from(
      { length: threads },
      () =>
        new Promise<WorkerResult>((resolve, reject) => {
          const worker = new Worker(new URL('./sweep-worker.mjs', import.meta.url), { workerData: { engineUrl, scenarioInput, options, rounds: ROUNDS, roundMs: ROUND_MS, warmMs: WARM_MS } });
          worker.once('message', (m: WorkerResult) => void worker.terminate().then(() => resolve(m)));
          worker.once('error', reject);
        }),
    ),
  );
}

const perSecond = (t: Totals) => Math.round(t.runs / (t.ms / 1_000));
const perCpuSecond = (t: Totals) => Math.round(t.runs / (t.cpuMs / 1_000));

const [one] = await measure(1);
const cores = availableParallelism();
const all = await measure(cores);
rmSync(outdir, { recursive: true, force: true });
if (!one) throw new Error('no result from the one-core worker');

const sum = (results: WorkerResult[], mode: 'bare' | 'sweep') => results.reduce((total, r) => total + perSecond(r.totals[mode]), 0);
const oneCore = { sweep: perSecond(one.totals.sweep), bare: perSecond(one.totals.bare), sweepCpu: perCpuSecond(one.totals.sweep), bareCpu: perCpuSecond(one.totals.bare) };
const allCores = { sweep: sum(all, 'sweep'), bare: sum(all, 'bare') };

const fmt = (n: number) => n.toLocaleString('en-US');
const ratio = (a: number, b: number) => `${(a / b).toFixed(2)}× the baseline`;
const { campaign } = one;
console.log(`fault sweep of a 9 V SPR negotiation: ${campaign.runs} runs a campaign (${campaign.messages} messages × drop, corrupt, 2 delays; ${campaign.timerEdges} timer edges)`);
console.log(`baseline: bare simulate() of the same scenarios, in the same threads, alternating rounds of ${ROUND_MS} ms of CPU time`);
console.log(`  one core, wall clock:      sweep ${fmt(oneCore.sweep)}/s, baseline ${fmt(oneCore.bare)}/s (${ratio(oneCore.sweep, oneCore.bare)})`);
console.log(`  one core, per CPU second:  sweep ${fmt(oneCore.sweepCpu)}/s, baseline ${fmt(oneCore.bareCpu)}/s (${ratio(oneCore.sweepCpu, oneCore.bareCpu)})`);
console.log(
  `  all ${cores} cores, wall clock:   sweep ${fmt(allCores.sweep)}/s, baseline ${fmt(allCores.bare)}/s (${ratio(allCores.sweep, allCores.bare)}; ${(allCores.sweep / oneCore.sweep).toFixed(2)}× one core)`,
);
const met = oneCore.sweepCpu >= TARGET_PER_CORE;
console.log(`  target ${fmt(TARGET_PER_CORE)}/s per core (per CPU second): ${met ? 'met' : 'NOT met'} (${(oneCore.sweepCpu / TARGET_PER_CORE).toFixed(2)}× the target)`);
report('sweep', [
  {
    figure: 'sweep runs per CPU second, one core (9 V SPR)',
    unit: '/s',
    parley: oneCore.sweepCpu,
    peer: oneCore.bareCpu,
    peerName: 'bare simulate()',
    higherIsBetter: true,
    target: `≥ ${fmt(TARGET_PER_CORE)}/s`,
    met,
  },
  { figure: `sweep runs, all ${cores} cores (wall clock)`, unit: '/s', parley: allCores.sweep, peer: allCores.bare, peerName: 'bare simulate()', higherIsBetter: true },
]);
