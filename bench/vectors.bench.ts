/**
 * `npm run bench:vectors`: how long `parley run vectors` takes for the built-in library (target
 * ≤ 10 s), and 1,000 property runs over random scenarios (target ≤ 5 s). Each figure is printed with
 * its ratio to a baseline measured in the same run on the same machine: `parley --version` (process
 * start-up) for the first, 1,000 runs of a trivial property for the second.
 */
import { spawnSync } from 'node:child_process';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { engine } from '../shared/vectors/engine-facade.ts';
import { checkProperty } from '../shared/vectors/property.ts';
import { report } from './report.ts';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const cli = resolve(root, 'cli/parley.js');

function timeCli(args: string[]): { ms: number; status: number | null; lastLine: string } {
  const started = performance.now();
  const child = spawnSync(process.execPath, [cli, ...args], { cwd: root, encoding: 'utf8' });
  const ms = performance.now() - started;
  return { ms, status: child.status, lastLine: child.stdout.trimEnd().split('\n').at(-1) ?? '' };
}

const fmt = (ms: number) => `${(ms / 1_000).toFixed(2)} s`;

const startup = timeCli(['--version']);
const library = timeCli(['run', 'vectors']);
console.log(`parley run vectors: ${fmt(library.ms)} (target ≤ 10 s) — ${library.lastLine}, exit ${library.status}`);
console.log(`  baseline parley --version: ${fmt(startup.ms)}; ratio ${(library.ms / startup.ms).toFixed(1)}×`);

const trivial = `export default ({ fc }) => fc.property(fc.integer(), (n: number) => { if (n !== n) throw new Error('NaN'); });`;
const scenarios = `
export default ({ fc, engine }) =>
  fc.property(engine.arbitraries.scenario({ durationMs: 2000 }), (input) => {
    const parsed = engine.sim.parseScenario(input);
    if (!parsed.ok) throw new Error(parsed.error.message);
    engine.sim.simulate(parsed.scenario);
  });
`;
async function timeProperty(code: string): Promise<{ ms: number; holds: boolean; failure?: string }> {
  const started = performance.now();
  const outcome = await checkProperty(code, { runs: 1_000, seed: 1 }, engine);
  return { ms: performance.now() - started, holds: outcome.holds, failure: outcome.error?.message ?? outcome.failure };
}
const base = await timeProperty(trivial);
const sims = await timeProperty(scenarios);
console.log(`1,000 property runs over random scenarios: ${fmt(sims.ms)} (target ≤ 5 s)${sims.holds ? '' : ` — did not hold: ${sims.failure}`}`);
console.log(`  baseline 1,000 runs of a trivial property: ${fmt(base.ms)}; ratio ${(sims.ms / base.ms).toFixed(0)}×`);
report('vectors', [
  {
    figure: 'parley run vectors (the library)',
    unit: 's',
    parley: library.ms / 1_000,
    peer: startup.ms / 1_000,
    peerName: 'parley --version',
    target: '≤ 10 s',
    met: library.ms <= 10_000 && library.status === 0,
  },
  { figure: '1,000 property runs over scenarios', unit: 's', parley: sims.ms / 1_000, peer: base.ms / 1_000, peerName: 'trivial property', target: '≤ 5 s', met: sims.ms <= 5_000 && sims.holds },
]);
