/**
 * Start-up of the built `parley` CLI against bare Node, measured in the same run (issue 15: target
 * ≤ 2× `node -e 0`). Also times the TypeScript source through tsx, which is what `npm run parley`
 * runs in development, to show what the bundle saves. Each command runs `RUNS` times in turn,
 * interleaved so that a busy machine slows all of them alike; the median of each is compared.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { report } from './report.ts';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
const RUNS = Number(process.env.PARLEY_BENCH_RUNS ?? 15);
const TARGET_RATIO = 2;

// Always built afresh: a bundle left from an older checkout would time yesterday's code.
execFileSync(process.execPath, [join(ROOT, 'cli', 'build.mjs')], { stdio: 'inherit' });

const tsx = join(ROOT, 'node_modules', 'tsx', 'dist', 'cli.mjs');
const subjects = [
  { name: 'node -e 0', args: ['-e', '0'] },
  { name: 'parley decode 4100 (built)', args: [join(ROOT, 'cli', 'parley.js'), 'decode', '4100'] },
  { name: 'tsx cli/main.ts decode 4100 (source)', args: [tsx, join(ROOT, 'cli', 'main.ts'), 'decode', '4100'] },
];

function timeOnceMs(args: string[]): number {
  const started = process.hrtime.bigint();
  const result = spawnSync(process.execPath, args, { cwd: ROOT, encoding: 'utf8' });
  const elapsedMs = Number(process.hrtime.bigint() - started) / 1e6;
  if (result.status !== 0) throw new Error(`${args.join(' ')} exited ${result.status}: ${result.stderr}`);
  return elapsedMs;
}

const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;

const times = subjects.map(() => [] as number[]);
for (let run = 0; run < RUNS; run += 1) {
  for (const [i, subject] of subjects.entries()) times[i]!.push(timeOnceMs(subject.args));
}
const medians = times.map(median);
const [nodeMs, builtMs, sourceMs] = medians as [number, number, number];

for (const [i, subject] of subjects.entries()) console.log(`${subject.name.padEnd(40)} median ${medians[i]!.toFixed(0).padStart(5)} ms over ${RUNS} runs`);
const ratio = builtMs / nodeMs;
console.log(`start-up ratio, built CLI / bare node: ${ratio.toFixed(2)}× (target ≤ ${TARGET_RATIO}×) ${ratio <= TARGET_RATIO ? 'met' : 'NOT met'}`);
console.log(`source through tsx / bare node: ${(sourceMs / nodeMs).toFixed(2)}×`);

report('cli', [
  { figure: 'parley decode 4100, start to exit (built CLI)', unit: 'ms', parley: builtMs, peer: nodeMs, peerName: 'node -e 0', target: `≤ ${TARGET_RATIO}× bare node`, met: ratio <= TARGET_RATIO },
  { figure: 'tsx cli/main.ts decode 4100 (development)', unit: 'ms', parley: sourceMs, peer: nodeMs, peerName: 'node -e 0' },
]);
