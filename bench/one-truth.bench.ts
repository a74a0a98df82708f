/**
 * `npm run bench:one-truth`: the larger campaign of the one-truth property (tests/support/one-truth.ts;
 * `npm test` runs 40 scenarios with a fixed seed): compliant pairs and single recoverable faults, the
 * analyser run on its own over each simulated trace. Prints how many scenarios broke the property
 * (target 0) and what the independent analysis costs against simulating alone, measured in the same run.
 * PARLEY_ONE_TRUTH_RUNS sets the number of scenarios (default 1 000), PARLEY_ONE_TRUTH_SEED the seed.
 */
import fc from 'fast-check';
import { parseScenario, simulate } from '../shared/sim/index.ts';
import { judge, oneTruthScenarios } from '../tests/support/one-truth.ts';
import { report } from './report.ts';

const RUNS = Number(process.env.PARLEY_ONE_TRUTH_RUNS ?? 1_000);
const SEED = Number(process.env.PARLEY_ONE_TRUTH_SEED ?? 20_261_204);

const inputs = fc.sample(oneTruthScenarios(), { numRuns: RUNS, seed: SEED });
let simMs = 0;
let judgeMs = 0;
const broken: { input: unknown; why: string }[] = [];
for (const input of inputs) {
  const parsed = parseScenario(input);
  if (!parsed.ok) throw new Error(parsed.error.message);
  let t0 = performance.now();
  simulate(parsed.scenario, { analyze: false });
  simMs += performance.now() - t0;
  t0 = performance.now();
  const verdict = judge(input);
  judgeMs += performance.now() - t0;
  if (verdict.errors.length > 0 || verdict.mismatches.length > 0) {
    broken.push({ input, why: verdict.errors[0]?.message ?? `contract differs at ${verdict.mismatches[0]!.tUs} µs` });
  }
}
console.log(`scenarios: ${inputs.length} (seed ${SEED}); broke the property: ${broken.length}`);
for (const b of broken.slice(0, 5)) console.log(`  ${b.why}\n    ${JSON.stringify(b.input)}`);
console.log(`simulate alone: ${(simMs / inputs.length).toFixed(2)} ms a scenario; simulate + analyse + compare: ${(judgeMs / inputs.length).toFixed(2)} ms (${(judgeMs / simMs).toFixed(2)}×)`);
report('one-truth', [
  { figure: `scenarios breaking the one-truth property, of ${inputs.length}`, unit: 'scenarios', parley: broken.length, target: '0', met: broken.length === 0 },
  { figure: 'simulate + independent analysis, a scenario', unit: 'ms', parley: judgeMs / inputs.length, peer: simMs / inputs.length, peerName: 'simulate alone' },
]);
if (broken.length > 0) process.exitCode = 1;
