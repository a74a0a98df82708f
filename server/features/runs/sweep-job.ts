/**
 * The sweep-run job: a fault sweep run on the server for the team (`POST /api/runs/sweep`). Its
 * campaign runs in a worker thread of its own (./sweep-worker.mjs), at most as many at once as the
 * run pool has threads; progress updates the run's counts and is published as the vector runs'
 * is, so the Runs pages and the event stream serve both kinds. At the end the broken runs are
 * stored as the run's results (with their evidence and, for the first few, a shrunk vector) and
 * the outcome classes beside the run. A retried job (its first worker died) starts the campaign
 * again: the plan is deterministic and earlier results are replaced.
 */
import { Worker } from 'node:worker_threads';
import { INVARIANTS } from '../../../shared/sweep/index.ts';
import type { RunEvent, SweepRunSummary } from '../../../shared/api/index.ts';
import { RunResult, TestRun, type IRunResult } from '../../db/library-entities.ts';
import type { AppDeps } from '../../context.ts';
import { jobKind, type JobContext, type JobHandler } from '../../jobs/types.ts';
import { runEvent } from './job.ts';
import type { BrokenEvidence, SweepTaskInput, SweepTaskMessage } from './sweep-task.ts';

export const sweepRunJob = jobKind<{ runId: number } & SweepTaskInput, RunEvent>('sweep-run');

/** The invariants as a sweep run presents them. */
export const SWEEP_INVARIANTS: SweepRunSummary['invariants'] = INVARIANTS.map(({ id, title, explanation }) => ({ id, title, explanation }));

/** Least time between two writes of a run's counts while it runs. */
const PROGRESS_WRITE_MS = 250;

type SweepDeps = Pick<AppDeps, 'orm' | 'clock' | 'logger' | 'runPool'>;

/** Sweeps at once in this process; the others wait their turn (still `running`, at 0 done). */
function createSlots(count: number) {
  let free = count;
  const waiting: (() => void)[] = [];
  return {
    async take(): Promise<() => void> {
      if (free > 0) free--;
      else await new Promise<void>((resolve) => waiting.push(resolve));
      return () => {
        const next = waiting.shift();
        if (next) next();
        else free++;
      };
    },
  };
}

function resultOf(runId: number, evidence: BrokenEvidence, now: Date): Omit<IRunResult, 'id'> {
  return {
    runId,
    vectorId: `sweep/${evidence.run}`,
    title: evidence.description,
    kind: 'sweep',
    vectorRevision: null,
    ok: false,
    message: `${evidence.invariant}: ${evidence.message}`.slice(0, 20_000),
    durationMs: 0,
    newFailure: false,
    detail: {
      expected: { invariants: evidence.broken.map((b) => b.invariant) },
      actual: { outcome: evidence.outcome, contract: evidence.contract, endStates: evidence.endStates, faults: evidence.faults, ...(evidence.timers ? { timers: evidence.timers } : {}) },
      mismatches: evidence.broken.map((b) => ({ path: `invariants.${b.invariant}`, message: b.message })),
      ...(evidence.vector ? { counterexampleVector: evidence.vector } : {}),
    },
    createdAt: now,
  };
}

/** Runs the campaign in a worker thread; resolves with its last message (done or error). */
function runInWorker(input: SweepTaskInput, signal: AbortSignal, onProgress: (m: Extract<SweepTaskMessage, { type: 'progress' }>) => void): Promise<SweepTaskMessage> {
  return new Promise((resolve) => {
    const worker = new Worker(new URL('./sweep-worker.mjs', import.meta.url), { workerData: input, env: {}, resourceLimits: { maxOldGenerationSizeMb: 512 } });
    let settled = false;
    const settle = (message: SweepTaskMessage) => {
      if (settled) return;
      settled = true;
      signal.removeEventListener('abort', stop);
      void worker.terminate();
      resolve(message);
    };
    const stop = () => settle({ type: 'error', message: 'the server stopped during the sweep' });
    signal.addEventListener('abort', stop, { once: true });
    worker.on('message', (message: SweepTaskMessage) => {
      if (message.type === 'progress') onProgress(message);
      else settle(message);
    });
    worker.on('error', (cause) => settle({ type: 'error', message: `the sweep's worker stopped (${cause.message})` }));
    worker.on('exit', (code) => settle({ type: 'error', message: `the sweep's worker ended early (exit code ${code})` }));
  });
}

export function sweepRunHandler(deps: SweepDeps): JobHandler<{ runId: number } & SweepTaskInput, RunEvent> {
  const slots = createSlots(Math.max(1, deps.runPool.threads ?? 2));
  return async ({ runId, scenario, options }, job) => {
    const release = await slots.take();
    try {
      await execute(deps, runId, { scenario, options }, job);
    } catch (cause) {
      if (job.signal.aborted) return;
      deps.logger.error({ err: cause, runId }, 'sweep run failed');
      await close(deps, runId, job, { error: `The sweep stopped: ${cause instanceof Error ? cause.message : String(cause)}` }).catch(() => undefined);
    } finally {
      release();
    }
  };
}

async function execute(deps: SweepDeps, runId: number, input: SweepTaskInput, job: JobContext<RunEvent>): Promise<void> {
  const em = deps.orm.em.fork();
  const run = await em.findOne(TestRun, { id: runId });
  if (!run) return;
  if (run.status !== 'running') return job.publish(runEvent(run));
  await em.nativeDelete(RunResult, { runId });
  let lastWriteMs = 0;
  let writing: Promise<unknown> = Promise.resolve();
  const outcome = await runInWorker(input, job.signal, (progress) => {
    const { done, total, passed, failed } = progress;
    job.publish({ type: 'progress', runId, done, total, passed, failed });
    const now = Date.now();
    if (now - lastWriteMs < PROGRESS_WRITE_MS && done < total) return;
    lastWriteMs = now;
    writing = writing.then(() => deps.orm.em.fork().nativeUpdate(TestRun, { id: runId, status: 'running' }, { done, total, passed, failed })).catch(() => undefined);
  });
  await writing;
  if (job.signal.aborted) return;
  if (outcome.type === 'error') return close(deps, runId, job, { error: `The sweep could not run: ${outcome.message}` });
  if (outcome.type !== 'done') return;
  await close(deps, runId, job, { done: outcome });
}

/** Stores the broken runs and the outcome classes and closes the run (done, or failed with `error`); publishes its final event. */
async function close(deps: SweepDeps, runId: number, job: JobContext<RunEvent>, end: { done: Extract<SweepTaskMessage, { type: 'done' }> } | { error: string }): Promise<void> {
  const em = deps.orm.em.fork();
  const now = deps.clock.now();
  await em.transactional(async (tx) => {
    const run = await tx.findOneOrFail(TestRun, { id: runId });
    if ('error' in end) {
      tx.assign(run, { status: 'failed', finishedAt: now, errorMessage: end.error });
      return;
    }
    const { total, outcomes, brokenCount, broken } = end.done;
    for (const evidence of broken) tx.create(RunResult, resultOf(runId, evidence, now));
    const summary = run.sweep ? { ...run.sweep, outcomes, broken: brokenCount } : null;
    tx.assign(run, { status: 'done', total, done: total, passed: total - brokenCount, failed: brokenCount, newFailures: 0, finishedAt: now, errorMessage: null, sweep: summary });
  });
  job.publish(runEvent(await em.fork().findOneOrFail(TestRun, { id: runId })));
}
