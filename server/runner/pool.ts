/**
 * The worker-thread pool that runs vectors (piscina), so a run of the whole library never blocks
 * the request thread. One pool per process, created on first use; threads leave when idle.
 * A vector that runs longer than `timeoutMs` (a property stuck in a loop) is stopped: piscina
 * ends that worker and the vector fails with a clear message.
 *
 * Property vectors are TypeScript that the runner evaluates. The workers get an empty
 * environment (no PARLEY_SECRET, no SMTP_URL) and a heap limit; the code still runs with the
 * server's file access, which is why only admin, engineer and qa may write or run vectors.
 */
import { Piscina } from 'piscina';
import type { VectorResult } from '../../shared/vectors/index.ts';
import { defaultThreads } from '../analysis/pool.ts';
import type { RunVectorTask } from './run-task.ts';

export interface RunPool {
  run(task: RunVectorTask): Promise<VectorResult>;
  close(): Promise<void>;
}

const workerUrl = new URL('./worker.mjs', import.meta.url).href;
export const DEFAULT_VECTOR_TIMEOUT_MS = 60_000;

export function createRunPool(options: { maxThreads?: number; idleTimeoutMs?: number; timeoutMs?: number } = {}): RunPool {
  const timeoutMs = options.timeoutMs ?? DEFAULT_VECTOR_TIMEOUT_MS;
  const pool = new Piscina({
    filename: workerUrl,
    minThreads: 0,
    maxThreads: options.maxThreads ?? defaultThreads(),
    idleTimeout: options.idleTimeoutMs ?? 30_000,
    env: {},
    resourceLimits: { maxOldGenerationSizeMb: 512 },
  });
  return {
    async run(task) {
      try {
        return (await pool.run(task, { signal: AbortSignal.timeout(timeoutMs) })) as VectorResult;
      } catch (cause) {
        const timedOut = cause instanceof Error && (cause.name === 'AbortError' || cause.name === 'TimeoutError' || /abort/i.test(cause.message));
        const message = timedOut ? `stopped after ${Math.round(timeoutMs / 1_000)} s (a vector must finish within that)` : `the runner stopped unexpectedly (${cause instanceof Error ? cause.message : String(cause)})`;
        return { id: task.vectorId, ok: false, message, durationMs: timedOut ? timeoutMs : 0 };
      }
    },
    async close() {
      await pool.destroy();
    },
  };
}

let shared: RunPool | undefined;

export function runPool(): RunPool {
  shared ??= createRunPool();
  return shared;
}

/** For a test that needs its own limits; the previous pool is closed. */
export async function replaceRunPool(pool: RunPool | undefined): Promise<void> {
  const old = shared;
  shared = pool;
  if (old && old !== pool) await old.close();
}

export async function closeRunPool(): Promise<void> {
  await replaceRunPool(undefined);
}
