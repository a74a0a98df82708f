/**
 * A library run: every vector goes through the worker pool, each result is stored as it comes
 * and published to the run's event stream; at the end the run is closed, its new failures are
 * marked and their authors mailed. CI results (already run elsewhere) take only the last step.
 */
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { RunResult, TestRun, type ITestRun, type RunResultDetail } from '../../db/library-entities.ts';
import type { AppDeps } from '../../context.ts';
import { runPool, type RunPool } from '../../runner/pool.ts';
import { builtInVectorsDir } from '../vectors/seed.ts';
import type { VectorResult } from '../../../shared/vectors/index.ts';
import { mailAuthors, markNewFailures } from './notify.ts';
import { publishRun } from './progress.ts';

export interface QueuedVector {
  vectorId: string;
  revision: number | null;
  title: string | null;
  kind: string | null;
  text: string;
}

/** Evidence kept for one failure; an enormous actual output is cut rather than stored whole. */
const MAX_DETAIL_CHARS = 256 * 1024;

export function detailOf(result: Pick<VectorResult, 'expected' | 'actual' | 'mismatches' | 'counterexampleVector'>): RunResultDetail {
  const detail: RunResultDetail = { expected: result.expected, actual: result.actual, mismatches: result.mismatches, counterexampleVector: result.counterexampleVector };
  if (JSON.stringify(detail).length <= MAX_DETAIL_CHARS) return detail;
  return { expected: result.expected, mismatches: result.mismatches, actual: { note: 'the actual output was too large to keep' } };
}

const running = new Map<number, Promise<void>>();

export function runningJob(runId: number): Promise<void> | undefined {
  return running.get(runId);
}

/** Closes a run whose results are all stored: status, counts, new failures, mail, the final event. */
export async function finishRun(em: EntityManager, deps: AppDeps, runId: number, error?: string): Promise<ITestRun> {
  const run = await em.findOneOrFail(TestRun, { id: runId });
  const passed = await em.count(RunResult, { runId, ok: true });
  const failed = await em.count(RunResult, { runId, ok: false });
  em.assign(run, { status: error ? 'failed' : 'done', passed, failed, done: passed + failed, finishedAt: deps.clock.now(), errorMessage: error ?? null });
  await em.flush();
  const fresh = error ? new Map<string, string>() : await markNewFailures(em, run);
  run.newFailures = fresh.size;
  await em.flush();
  await mailAuthors(em, deps, run, fresh);
  publishRun({ type: 'done', runId, status: run.status === 'failed' ? 'failed' : 'done', done: run.done, total: run.total, passed, failed, newFailures: fresh.size, ...(error ? { error } : {}) });
  return run;
}

export function startRunJob(deps: AppDeps, runId: number, vectors: readonly QueuedVector[], pool: RunPool = runPool()): Promise<void> {
  const job = execute(deps, runId, vectors, pool)
    .catch(async (cause: unknown) => {
      const message = `The run stopped: ${cause instanceof Error ? cause.message : String(cause)}`;
      deps.logger.error({ err: cause, runId }, 'run failed');
      await finishRun(deps.orm.em.fork(), deps, runId, message).catch(() => undefined);
    })
    .finally(() => running.delete(runId));
  running.set(runId, job);
  return job;
}

async function execute(deps: AppDeps, runId: number, vectors: readonly QueuedVector[], pool: RunPool): Promise<void> {
  const total = vectors.length;
  let passed = 0;
  let failed = 0;
  publishRun({ type: 'progress', runId, done: 0, total, passed, failed });
  await Promise.all(
    vectors.map(async (vector) => {
      const result = await pool.run({ text: vector.text, vectorId: vector.vectorId, vectorsRoot: builtInVectorsDir });
      if (result.ok) passed += 1;
      else failed += 1;
      const em = deps.orm.em.fork();
      em.create(RunResult, {
        runId,
        vectorId: vector.vectorId,
        title: vector.title,
        kind: vector.kind,
        vectorRevision: vector.revision,
        ok: result.ok,
        message: result.message ?? null,
        durationMs: Math.max(0, result.durationMs),
        newFailure: false,
        detail: result.ok ? null : detailOf(result),
        createdAt: deps.clock.now(),
      });
      await em.flush();
      await em.nativeUpdate(TestRun, { id: runId }, { done: passed + failed, passed, failed });
      const last = { id: vector.vectorId, ok: result.ok, durationMs: result.durationMs, ...(result.message ? { message: result.message } : {}) };
      publishRun({ type: 'progress', runId, done: passed + failed, total, passed, failed, last });
    }),
  );
  await finishRun(deps.orm.em.fork(), deps, runId);
}
