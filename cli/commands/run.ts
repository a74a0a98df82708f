/**
 * `parley run <path>…` (docs/cli.md): runs vector files and folders of them
 * (recursively, every `*.vector.json`), prints one line per vector and last `N passed, M failed`,
 * or with `--json` `{ ok, passed, failed, results: [{ id, ok, message? }] }`. `--filter <glob>` on
 * vector ids, `--junit <file>` writes JUnit XML. Exit 1 when a vector fails, 2 on usage errors.
 *
 * A broken vector file (not JSON, not a vector) is a failing result naming its path, never a crash.
 * Property vectors run in a small pool of worker threads (one per core, at most their number);
 * fast-check is seeded, so a worker gives the same result as the browser's worker or this thread.
 */
import { readdir, readFile, stat, writeFile } from 'node:fs/promises';
import { availableParallelism } from 'node:os';
import { dirname, relative, resolve, sep } from 'node:path';
import { Worker } from 'node:worker_threads';
import type { PropertyOutcome } from '../../shared/vectors/property.ts';
import { formatVector } from '../../shared/vectors/format.ts';
import { matchesGlob } from '../../shared/vectors/glob.ts';
import { toJunitXml, type JunitCase } from '../../shared/vectors/junit.ts';
import { parseVector, runVector, type VectorResult } from '../../shared/vectors/run.ts';
import type { Vector } from '../../shared/vectors/schema.ts';
import { CliError, EXIT_CHECKS_FAILED, EXIT_OK, paint, printJson, type CliIo } from '../io.ts';

interface RunArgs {
  paths: string[];
  filter?: string;
  junit?: string;
  json: boolean;
}

/** Far longer than any vector id; a glob is matched in time proportional to its length times the id's. */
const FILTER_MAX_CHARS = 1_000;

function parseArgs(args: string[]): RunArgs {
  const parsed: RunArgs = { paths: [], json: false };
  for (let i = 0; i < args.length; i += 1) {
    const arg = args[i] ?? '';
    const value = (): string => {
      const next = args[i + 1];
      if (next === undefined || next.startsWith('--')) throw new CliError('usage', `${arg} needs a value`);
      i += 1;
      return next;
    };
    if (arg === '--json') parsed.json = true;
    else if (arg === '--filter') parsed.filter = value();
    else if (arg === '--junit') parsed.junit = value();
    else if (arg.startsWith('--filter=')) parsed.filter = arg.slice('--filter='.length);
    else if (arg.startsWith('--junit=')) parsed.junit = arg.slice('--junit='.length);
    else if (arg.startsWith('--')) throw new CliError('usage', `unknown option ${arg}; run takes <path>… [--filter <glob>] [--junit <file>] [--json]`);
    else parsed.paths.push(arg);
  }
  if (parsed.paths.length === 0) throw new CliError('usage', 'give at least one vector file or folder, e.g. "parley run vectors"');
  if (parsed.filter !== undefined && parsed.filter.length > FILTER_MAX_CHARS) throw new CliError('usage', `--filter: at most ${FILTER_MAX_CHARS} characters, got ${parsed.filter.length}`);
  return parsed;
}

/** Every `*.vector.json` under a folder, sorted by path so runs are repeatable. */
async function walk(folder: string): Promise<string[]> {
  const entries = await readdir(folder, { withFileTypes: true });
  const files: string[] = [];
  for (const entry of entries.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0))) {
    const path = resolve(folder, entry.name);
    if (entry.isDirectory()) files.push(...(await walk(path)));
    else if (entry.isFile() && entry.name.endsWith('.vector.json')) files.push(path);
  }
  return files;
}

async function collectFiles(paths: string[], cwd: string): Promise<string[]> {
  const files: string[] = [];
  for (const path of paths) {
    const absolute = resolve(cwd, path);
    const info = await stat(absolute).catch(() => undefined);
    if (!info) throw new CliError('input.path', `no such file or folder: ${path}`);
    if (info.isDirectory()) files.push(...(await walk(absolute)));
    else files.push(absolute);
  }
  return [...new Set(files)];
}

interface Loaded {
  file: string;
  /** Shown in results: the vector id, or for a broken file its path. */
  id: string;
  vector?: Vector;
  error?: string;
}

async function load(file: string, cwd: string): Promise<Loaded> {
  const shown = relative(cwd, file).split(sep).join('/') || file;
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch (error) {
    return { file, id: shown, error: `${shown}: cannot read: ${error instanceof Error ? error.message : String(error)}` };
  }
  const parsed = parseVector(text);
  if (!parsed.ok) return { file, id: shown, error: `${shown}: ${parsed.error.message}` };
  return { file, id: parsed.vector.id, vector: parsed.vector };
}

// ---- the property worker pool ------------------------------------------------------------------

interface Job {
  id: number;
  code: string;
  options: { runs: number; seed: number };
  resolve(outcome: PropertyOutcome): void;
}

export interface PropertyPool {
  check(code: string, options: { runs: number; seed: number }): Promise<PropertyOutcome>;
  close(): Promise<void>;
}

/** A pool of `size` worker threads checking property vectors; started lazily on the first job. */
export function createPropertyPool(size: number): PropertyPool {
  const workerUrl = new URL('./property-worker.mjs', import.meta.url);
  const queue: Job[] = [];
  const idle: Worker[] = [];
  const busy = new Map<Worker, Job>();
  const workers: Worker[] = [];
  let nextId = 1;
  let fatal: string | undefined;

  const failJob = (job: Job, message: string) => job.resolve({ holds: false, numRuns: 0, seed: job.options.seed, error: { code: 'property.worker', message } });
  const pump = () => {
    while (idle.length > 0 && queue.length > 0) {
      const worker = idle.pop() as Worker;
      const job = queue.shift() as Job;
      busy.set(worker, job);
      worker.postMessage({ id: job.id, code: job.code, options: job.options });
    }
  };
  const start = () => {
    const worker = new Worker(workerUrl);
    workers.push(worker);
    worker.on('message', (message: { ready?: boolean; fatal?: string; id?: number; outcome?: PropertyOutcome }) => {
      if (message.fatal !== undefined) {
        fatal = `the property worker could not load the engine: ${message.fatal.split('\n')[0]}`;
        for (const job of queue.splice(0)) failJob(job, fatal);
        return;
      }
      if (!message.ready) {
        const job = busy.get(worker);
        busy.delete(worker);
        if (job && message.outcome) job.resolve(message.outcome);
      }
      idle.push(worker);
      pump();
    });
    worker.on('error', (error) => {
      const job = busy.get(worker);
      busy.delete(worker);
      if (job) failJob(job, `the property worker stopped: ${error.message}`);
      fatal ??= `the property worker stopped: ${error.message}`;
      if (busy.size === 0 && idle.length === 0) for (const queued of queue.splice(0)) failJob(queued, fatal);
    });
    worker.on('exit', (code) => {
      const job = busy.get(worker);
      busy.delete(worker);
      if (job) failJob(job, `the property worker exited (code ${code})`);
    });
  };

  return {
    check(code, options) {
      if (workers.length < size) start();
      return new Promise((resolveJob) => {
        if (fatal !== undefined) return resolveJob({ holds: false, numRuns: 0, seed: options.seed, error: { code: 'property.worker', message: fatal } });
        queue.push({ id: nextId++, code, options, resolve: resolveJob });
        pump();
      });
    },
    async close() {
      await Promise.all(workers.map((w) => w.terminate()));
    },
  };
}

// ---- the command ---------------------------------------------------------------------------------

function line(io: CliIo, result: VectorResult): string {
  const ms = `${Math.round(result.durationMs)} ms`;
  if (result.ok) return `${paint(io, 'green', 'PASS')}  ${result.id}  ${paint(io, 'dim', ms)}\n`;
  return `${paint(io, 'red', 'FAIL')}  ${result.id}  ${result.message ?? 'failed'}\n`;
}

/** Runs the loaded vectors: properties in the pool (concurrently), the rest in this thread. */
export async function runLoaded(loaded: Loaded[], options: { pool?: PropertyPool } = {}): Promise<VectorResult[]> {
  const properties = loaded.filter((l) => l.vector?.kind === 'property').length;
  const pool = options.pool ?? (properties > 0 ? createPropertyPool(Math.max(1, Math.min(availableParallelism(), properties))) : undefined);
  const checkProperty = pool ? (code: string, o: { runs: number; seed: number }) => pool.check(code, o) : undefined;
  const seen = new Map<string, string>();
  try {
    const pending = loaded.map((item) => {
      if (!item.vector) return Promise.resolve<VectorResult>({ id: item.id, ok: false, message: item.error ?? 'broken vector file', durationMs: 0 });
      const other = seen.get(item.vector.id);
      if (other !== undefined) return Promise.resolve<VectorResult>({ id: item.vector.id, ok: false, message: `duplicate id: ${item.file} has the id of ${other}`, durationMs: 0 });
      seen.set(item.vector.id, item.file);
      const folder = dirname(item.file);
      return runVector(item.vector, { checkProperty, readFile: (path) => readFile(resolve(folder, path), 'utf8') });
    });
    return await Promise.all(pending);
  } finally {
    if (!options.pool && pool) await pool.close();
  }
}

export async function run(args: string[], io: CliIo): Promise<number> {
  const options = parseArgs(args);
  const files = await collectFiles(options.paths, io.cwd);
  if (files.length === 0) throw new CliError('input.path', `no *.vector.json files in ${options.paths.join(', ')}`);
  let loaded = await Promise.all(files.map((file) => load(file, io.cwd)));
  if (options.filter !== undefined) {
    const glob = options.filter;
    loaded = loaded.filter((item) => matchesGlob(item.id, glob));
    if (loaded.length === 0) throw new CliError('usage', `no vector id matches --filter ${glob}`);
  }
  const results = await runLoaded(loaded);
  const passed = results.filter((r) => r.ok).length;
  const failed = results.length - passed;

  if (options.junit !== undefined) {
    const cases: JunitCase[] = results.map((r, i) => ({ id: r.id, ok: r.ok, message: r.message, durationMs: r.durationMs, file: relative(io.cwd, loaded[i]?.file ?? '') }));
    try {
      await writeFile(resolve(io.cwd, options.junit), toJunitXml(cases));
    } catch (error) {
      const code = (error as NodeJS.ErrnoException).code;
      const why = code === 'EISDIR' ? 'it is a folder' : code === 'ENOENT' ? 'its folder does not exist' : code === 'EACCES' ? 'permission denied' : 'it could not be written';
      throw new CliError('output.junit', `--junit: cannot write "${options.junit}": ${why}`);
    }
  }
  if (options.json) {
    printJson(io, { ok: failed === 0, passed, failed, results: results.map((r) => (r.ok ? { id: r.id, ok: true } : { id: r.id, ok: false, message: r.message })) });
  } else {
    for (const result of results) {
      io.stdout(line(io, result));
      if (result.counterexampleVector) {
        const text = formatVector(result.counterexampleVector).trimEnd().replace(/^/gm, '      ');
        io.stdout(`${paint(io, 'dim', `      counterexample as a negotiation vector:\n${text}`)}\n`);
      }
    }
    io.stdout(`${passed} passed, ${failed} failed\n`);
  }
  return failed > 0 ? EXIT_CHECKS_FAILED : EXIT_OK;
}
