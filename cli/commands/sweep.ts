/**
 * `parley sweep <scenario.json|-> [--faults drop,corrupt,delay] [--pairs] [--timers edges|jitter]
 * [--max N] [--seed N] [--shard i/n] [--junit <file>] [--out <dir>] [--workers N] [--json]`
 * (docs/cli.md): a fault campaign over one scenario. Runs split across worker threads, one per
 * core (a small campaign runs in this thread: starting a worker costs more than it saves).
 * Exit 1 when a run breaks an invariant, 2 on bad input.
 */
import { availableParallelism } from 'node:os';
import { mkdir, writeFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { Worker } from 'node:worker_threads';
import { parseScenario, type Scenario } from '../../shared/sim/index.ts';
import {
  INVARIANTS,
  parseShard,
  planSweep,
  runSlice,
  scenarioFor,
  shrinkScenario,
  summarize,
  sweepVector,
  SWEEP_FAULT_KINDS,
  type SweepFaultKind,
  type SweepOptions,
  type SweepPlan,
  type SweepRun,
  type SweepSummary,
} from '../../shared/sweep/index.ts';
import { formatVector } from '../../shared/vectors/format.ts';
import { toJunitXml } from '../../shared/vectors/junit.ts';
import { CliError, EXIT_CHECKS_FAILED, EXIT_OK, formatTable, paint, printJson, type CliIo } from '../io.ts';
import { parseOptions } from './caps.ts';
import { readJson } from './simulate.ts';

const USAGE = 'sweep <scenario.json|-> [--faults drop,corrupt,delay] [--pairs] [--timers edges|jitter] [--max N] [--seed N] [--shard i/n] [--junit <file>] [--out <dir>] [--workers N] [--json]';
/** Below this many runs one thread is faster than starting workers (each loads the engine). */
const RUNS_PER_WORKER_MIN = 2_000;
/** Broken runs shrunk and written under --out (each shrink is up to 200 simulations). */
const VECTORS_MAX = 50;

function parseCount(text: string | undefined, option: string, min: number, max: number): number | undefined {
  if (text === undefined) return undefined;
  const value = Number(text);
  if (!/^\d+$/.test(text.trim()) || !Number.isSafeInteger(value) || value < min || value > max) throw new CliError('usage', `${option}: a whole number from ${min} to ${max}, got "${text}"`);
  return value;
}

function parseKinds(text: string | undefined): SweepFaultKind[] | undefined {
  if (text === undefined) return undefined;
  const kinds = text
    .split(',')
    .map((k) => k.trim())
    .filter(Boolean);
  if (kinds.length === 0) throw new CliError('usage', `--faults: list fault kinds separated by commas (${SWEEP_FAULT_KINDS.join(', ')})`);
  for (const kind of kinds) {
    if (!(SWEEP_FAULT_KINDS as readonly string[]).includes(kind)) throw new CliError('usage', `--faults: unknown fault kind "${kind}"; one of ${SWEEP_FAULT_KINDS.join(', ')}`);
  }
  return [...new Set(kinds)] as SweepFaultKind[];
}

function runInWorker(scenario: Scenario, options: SweepOptions, start: number, end: number): Promise<SweepRun[]> {
  return new Promise((resolveRuns, reject) => {
    const worker = new Worker(new URL('./sweep-worker.mjs', import.meta.url), { workerData: { scenario, options, start, end } });
    worker.once('message', (message: { runs?: SweepRun[]; error?: string }) => {
      void worker.terminate();
      if (message.runs) resolveRuns(message.runs);
      else reject(new Error(message.error ?? 'the sweep worker failed'));
    });
    worker.once('error', reject);
  });
}

/** The plan's runs, split in contiguous slices over `workers` threads (in order, so output is stable). */
async function runAll(plan: SweepPlan, options: SweepOptions, workers: number): Promise<SweepRun[]> {
  const total = plan.placements.length;
  if (workers <= 1) return runSlice(plan).runs;
  const size = Math.ceil(total / workers);
  const slices = Array.from({ length: workers }, (_, i) => [i * size, Math.min(total, (i + 1) * size)] as const).filter(([a, b]) => b > a);
  try {
    return (await Promise.all(slices.map(([start, end]) => runInWorker(plan.scenario, options, start, end)))).flat();
  } catch (error) {
    throw new CliError('sweep.worker', `a sweep worker failed: ${error instanceof Error ? error.message : String(error)}`);
  }
}

export async function run(args: string[], io: CliIo): Promise<number> {
  const parsed = parseOptions(args, { values: ['--faults', '--timers', '--max', '--seed', '--shard', '--junit', '--out', '--workers'], flags: ['--json', '--pairs'], usage: USAGE });
  const [file, extra] = parsed.positional;
  if (file === undefined) throw new CliError('usage', `give a scenario file (or - for stdin); usage: parley ${USAGE}`);
  if (extra !== undefined) throw new CliError('usage', `unexpected argument "${extra}"; usage: parley ${USAGE}`);
  const timers = parsed.values['--timers'];
  if (timers !== undefined && timers !== 'edges' && timers !== 'jitter') throw new CliError('usage', `--timers: edges or jitter, got "${timers}"`);
  const shardText = parsed.values['--shard'];
  const shard = shardText === undefined ? undefined : parseShard(shardText);
  if (shard && !shard.ok) throw new CliError('usage', shard.error.message);
  const seedText = parsed.values['--seed'];
  if (seedText !== undefined && !/^-?\d{1,9}$/.test(seedText.trim())) throw new CliError('usage', `--seed: a whole number, got "${seedText}"`);
  const options: SweepOptions = {
    kinds: parseKinds(parsed.values['--faults']),
    pairs: parsed.flags.has('--pairs'),
    timerEdges: timers === 'edges',
    max: parseCount(parsed.values['--max'], '--max', 1, 10_000_000),
    seed: seedText === undefined ? undefined : Number(seedText),
  };
  const workersWanted = parseCount(parsed.values['--workers'], '--workers', 1, 256);

  const scenario = parseScenario(await readJson(file, io));
  if (!scenario.ok) throw CliError.from(scenario.error);
  const planned = planSweep(scenario.scenario, { ...options, shard: shard?.shard });
  if (!planned.ok) throw CliError.from(planned.error);
  const { plan } = planned;
  const workers = workersWanted ?? (plan.placements.length >= RUNS_PER_WORKER_MIN ? availableParallelism() : 1);

  const started = performance.now();
  const runs = await runAll(plan, { ...options, shard: shard?.shard }, Math.min(workers, Math.max(1, plan.placements.length)));
  const elapsedMs = performance.now() - started;
  const summary = summarize(runs);

  const vectors = new Map<string, string>();
  const outDir = parsed.values['--out'];
  if (outDir !== undefined && summary.brokenCount > 0) await writeVectors(io, outDir, plan, runs, vectors);
  const junit = parsed.values['--junit'];
  if (junit !== undefined) await writeJunit(io, junit, runs, elapsedMs);

  if (parsed.flags.has('--json')) {
    printJson(io, {
      ok: summary.ok,
      runs: summary.runs,
      brokenCount: summary.brokenCount,
      campaignRuns: plan.campaignRuns,
      ...(shard?.ok ? { shard: `${shard.shard.index}/${shard.shard.count}` } : {}),
      messages: plan.messages.map(({ index, t, from, messageType, nth }) => ({ index, t, from, messageType, nth })),
      outcomes: summary.outcomes,
      broken: summary.broken.map((b) => ({ ...b, ...(vectors.has(b.run) ? { vector: vectors.get(b.run) } : {}) })),
    });
  } else io.stdout(describe(io, plan, summary, vectors, elapsedMs, workers));
  return summary.ok ? EXIT_OK : EXIT_CHECKS_FAILED;
}

async function writeVectors(io: CliIo, outDir: string, plan: SweepPlan, runs: readonly SweepRun[], written: Map<string, string>): Promise<void> {
  const dir = resolve(io.cwd, outDir);
  try {
    await mkdir(dir, { recursive: true });
  } catch {
    throw new CliError('output.out', `--out: cannot create the folder "${outDir}"`);
  }
  const broken = runs.filter((r) => r.broken.length > 0).slice(0, VECTORS_MAX);
  for (const r of broken) {
    const invariant = r.broken[0]!.invariant;
    const shrunk = shrinkScenario(scenarioFor(plan.scenario, { faults: r.faults, timers: r.timers }), invariant);
    const vector = sweepVector(shrunk.scenario, invariant, { message: r.broken[0]!.message });
    const name = `${String(vector.id).split('/').slice(1).join('-')}.vector.json`;
    const path = join(outDir, name);
    try {
      await writeFile(join(dir, name), formatVector(vector));
    } catch {
      throw new CliError('output.out', `--out: cannot write "${path}"`);
    }
    written.set(r.placement, path);
  }
}

async function writeJunit(io: CliIo, path: string, runs: readonly SweepRun[], elapsedMs: number): Promise<void> {
  const perRunMs = runs.length > 0 ? elapsedMs / runs.length : 0;
  const cases = runs.map((r) => ({
    id: `sweep/${r.placement}`,
    ok: r.broken.length === 0,
    message: r.broken.map((b) => `${b.invariant}: ${b.message}`).join('; ') || undefined,
    durationMs: perRunMs,
  }));
  try {
    await writeFile(resolve(io.cwd, path), toJunitXml(cases, 'parley sweep'));
  } catch {
    throw new CliError('output.junit', `--junit: cannot write "${path}"`);
  }
}

function describe(io: CliIo, plan: SweepPlan, summary: SweepSummary, vectors: Map<string, string>, elapsedMs: number, workers: number): string {
  const rate = elapsedMs > 0 ? Math.round((summary.runs / elapsedMs) * 1_000) : summary.runs;
  const lines = [
    `${paint(io, 'bold', 'Fault sweep')}  ${summary.runs} runs${plan.campaignRuns !== summary.runs ? ` of ${plan.campaignRuns} in the campaign` : ''} over ${plan.messages.length} messages of the fault-free run, ${(elapsedMs / 1_000).toFixed(2)} s (${rate.toLocaleString('en-US')} runs/s, ${workers} thread${workers === 1 ? '' : 's'})`,
    '',
    paint(io, 'bold', 'Outcomes'),
    formatTable(summary.outcomes.map((o) => [o.label, String(o.runs), `e.g. ${o.example.run}`])).trimEnd(),
    '',
  ];
  if (summary.brokenCount === 0) lines.push(paint(io, 'green', `Every invariant held in every run (${INVARIANTS.map((i) => i.id).join(', ')}).`));
  else {
    lines.push(paint(io, 'red', `${summary.brokenCount} run${summary.brokenCount === 1 ? '' : 's'} broke an invariant:`));
    for (const b of summary.broken.slice(0, 30)) {
      lines.push(`  ${paint(io, 'bold', b.run)}  ${b.invariant}: ${b.message}${vectors.has(b.run) ? paint(io, 'dim', `  → ${vectors.get(b.run)}`) : ''}`);
    }
    if (summary.broken.length > 30) lines.push(`  … and ${summary.broken.length - 30} more (--json lists them all)`);
  }
  return `${lines.join('\n')}\n`;
}
