/**
 * The worker-thread pool that runs vectors (piscina), so a run of the whole library never blocks
 * the request thread. The server creates one and passes it through the app's deps; threads leave when idle.
 * A vector that runs longer than `timeoutMs` (a property stuck in a loop) is stopped: piscina
 * ends that worker and the vector fails with a clear message.
 *
 * Property vectors are TypeScript written by a user, so they never run in these threads: they go
 * to the property sandbox (./property-sandbox.ts: bubblewrap or the fallback launcher, OS limits,
 * Node's permission model, a fair queue per user), and the workers refuse them (./run-task.ts). The workers get an empty environment and a heap
 * limit for the other kinds.
 */
import { Piscina } from 'piscina';
import { runVectorText, toJsonSafe, type VectorResult } from '../../shared/vectors/index.ts';
import { defaultThreads } from '../analysis/pool.ts';
import { createPropertySandbox, DEFAULT_PROPERTY_TIMEOUT_MS, type PropertySandbox, type SandboxModeSetting, type SandboxStatus } from './property-sandbox.ts';
import { keptOfResult, type RunVectorTask } from './run-task.ts';

export interface RunPool {
  run(task: RunVectorTask): Promise<VectorResult>;
  /**
   * Results in the order of the tasks, as a run keeps them (`keptOfResult`: a pass without its
   * output); the engine's vectors of a batch share one worker message.
   */
  runBatch?(tasks: readonly RunVectorTask[]): Promise<VectorResult[]>;
  /** Worker threads it may use at once. */
  threads?: number;
  /** The property sandbox's mode, limits and queue as `owner` sees it. */
  sandboxStatus?(owner: string): Promise<SandboxStatus>;
  close(): Promise<void>;
}

const workerUrl = new URL('./worker.mjs', import.meta.url).href;
export const DEFAULT_VECTOR_TIMEOUT_MS = 60_000;

/** True for a vector file whose kind is `property` (a broken file goes to the pool, which reports it). */
export function isPropertyVectorText(text: string): boolean {
  try {
    const json = JSON.parse(text) as { kind?: unknown } | null;
    return typeof json === 'object' && json !== null && json.kind === 'property';
  } catch {
    return false;
  }
}

function goesToSandbox(task: RunVectorTask): boolean {
  return task.kind === undefined || task.kind === null ? isPropertyVectorText(task.text) : task.kind === 'property';
}

/** Validation and matching here (small for a property vector), the code itself in the sandbox. */
async function runInSandbox(task: RunVectorTask, sandbox: PropertySandbox): Promise<VectorResult> {
  const result = await runVectorText(task.text, task.vectorId, { checkProperty: (code, job) => sandbox.check(code, job, task.owner) });
  return toJsonSafe(result) as VectorResult;
}

export interface RunPoolOptions {
  maxThreads?: number;
  idleTimeoutMs?: number;
  /** Per vector; when given, a property's sandbox gets the same limit (else DEFAULT_PROPERTY_TIMEOUT_MS). */
  timeoutMs?: number;
  /** `PARLEY_SANDBOX`: bubblewrap, the fallback launcher, or `auto`. */
  sandboxMode?: SandboxModeSetting;
  /** Default: a sandbox with the timeout above and `maxThreads` (at least 2) children at once. */
  sandbox?: PropertySandbox;
}

export function createRunPool(options: RunPoolOptions = {}): RunPool {
  const timeoutMs = options.timeoutMs ?? DEFAULT_VECTOR_TIMEOUT_MS;
  const maxThreads = options.maxThreads ?? defaultThreads();
  // At least two properties at once: with one user at a time per slot (the fair queue), one user's
  // stuck property then never holds the only slot while another user waits.
  const sandbox =
    options.sandbox ?? createPropertySandbox({ timeoutMs: options.timeoutMs ?? DEFAULT_PROPERTY_TIMEOUT_MS, maxConcurrent: Math.max(2, maxThreads), mode: options.sandboxMode ?? 'auto' });
  const pool = new Piscina({
    filename: workerUrl,
    minThreads: 0,
    maxThreads,
    idleTimeout: options.idleTimeoutMs ?? 30_000,
    env: {},
    resourceLimits: { maxOldGenerationSizeMb: 512 },
  });
  const run = async (task: RunVectorTask): Promise<VectorResult> => {
    if (goesToSandbox(task)) return runInSandbox(task, sandbox);
    try {
      return (await pool.run(task, { signal: AbortSignal.timeout(timeoutMs) })) as VectorResult;
    } catch (cause) {
      const timedOut = cause instanceof Error && (cause.name === 'AbortError' || cause.name === 'TimeoutError' || /abort/i.test(cause.message));
      const message = timedOut
        ? `stopped after ${Math.round(timeoutMs / 1_000)} s (a vector must finish within that)`
        : `the runner stopped unexpectedly (${cause instanceof Error ? cause.message : String(cause)})`;
      return { id: task.vectorId, ok: false, message, durationMs: timedOut ? timeoutMs : 0 };
    }
  };
  return {
    run,
    threads: maxThreads,
    sandboxStatus: (owner) => sandbox.status(owner),
    async runBatch(tasks) {
      const results = new Array<VectorResult>(tasks.length);
      const inThreads = tasks.flatMap((task, index) => (goesToSandbox(task) ? [] : [{ task, index }]));
      const sandboxed = tasks.flatMap((task, index) => (goesToSandbox(task) ? [{ task, index }] : []));
      const batch = async () => {
        if (inThreads.length === 0) return;
        try {
          const out = (await pool.run(
            inThreads.map((x) => x.task),
            { name: 'runVectorBatch', signal: AbortSignal.timeout(timeoutMs) },
          )) as VectorResult[];
          for (const [i, result] of out.entries()) results[inThreads[i]!.index] = result;
        } catch {
          // One vector stuck or crashing its worker: run that batch one by one, each with its own limit.
          await Promise.all(inThreads.map(async ({ task, index }) => (results[index] = keptOfResult(await run(task)))));
        }
      };
      await Promise.all([batch(), ...sandboxed.map(async ({ task, index }) => (results[index] = keptOfResult(await runInSandbox(task, sandbox))))]);
      return results;
    },
    async close() {
      await Promise.all([pool.destroy(), sandbox.close()]);
    },
  };
}
