/**
 * The vector-run job: the run's vectors go through the worker pool in batches (one worker message
 * and one database write per batch, so a run of the whole library leaves the request thread
 * free), each batch's results are stored and published as they come; at the end the run is
 * closed, its new failures are marked and their authors mailed. CI results (already run
 * elsewhere) take only the last step. A retried job (its first worker died) runs only the vectors
 * that have no stored result yet, so nothing is run or stored twice.
 */
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { RunResult, TeamVector, TestRun, type IRunResult, type ITestRun, type RunResultDetail } from '../../db/library-entities.ts';
import type { AppDeps } from '../../context.ts';
import type { RunPool } from '../../runner/pool.ts';
import { queueOwner } from '../../runner/property-sandbox.ts';
import type { RunVectorTask } from '../../runner/run-task.ts';
import { builtInVectorsDir } from '../vectors/seed.ts';
import type { VectorResult } from '../../../shared/vectors/index.ts';
import { jobKind, type JobContext, type JobHandler } from '../../jobs/types.ts';
import { mailAuthors, markNewFailures } from './notify.ts';
import type { RunEvent } from '../../../shared/api/index.ts';

export const vectorRunJob = jobKind<{ runId: number; vectorIds: string[] }, RunEvent>('vector-run');

/** Vectors per worker message and per database write. */
export const RUN_BATCH_SIZE = 48;
/** Least time between two progress events of a run (the final event always goes). */
export const PROGRESS_EVERY_MS = 250;

/** Evidence kept for one failure; an enormous actual output is cut rather than stored whole. */
const MAX_DETAIL_CHARS = 256 * 1024;

export function detailOf(result: Pick<VectorResult, 'expected' | 'actual' | 'mismatches' | 'counterexampleVector'>): RunResultDetail {
  const detail: RunResultDetail = { expected: result.expected, actual: result.actual, mismatches: result.mismatches, counterexampleVector: result.counterexampleVector };
  if (JSON.stringify(detail).length <= MAX_DETAIL_CHARS) return detail;
  return { expected: result.expected, mismatches: result.mismatches, actual: { note: 'the actual output was too large to keep' } };
}

/** The run's event as its row tells it: final once it is closed, else its progress. */
export function runEvent(run: ITestRun): RunEvent {
  if (run.status === 'running') return { type: 'progress', runId: run.id, done: run.done, total: run.total, passed: run.passed, failed: run.failed };
  return {
    type: 'done',
    runId: run.id,
    status: run.status === 'failed' ? 'failed' : 'done',
    done: run.done,
    total: run.total,
    passed: run.passed,
    failed: run.failed,
    newFailures: run.newFailures,
    ...(run.errorMessage ? { error: run.errorMessage } : {}),
  };
}

type RunDeps = Pick<AppDeps, 'orm' | 'clock' | 'mailer' | 'publicUrl' | 'logger' | 'runPool'>;

/** Closes a run whose results are all stored: status, counts, new failures, mail; returns the row. */
export async function finishRun(em: EntityManager, deps: RunDeps, runId: number, error?: string): Promise<ITestRun> {
  const run = await em.findOneOrFail(TestRun, { id: runId });
  const passed = await em.count(RunResult, { runId, ok: true });
  const failed = await em.count(RunResult, { runId, ok: false });
  em.assign(run, { status: error ? 'failed' : 'done', passed, failed, done: passed + failed, finishedAt: deps.clock.now(), errorMessage: error ?? null });
  await em.flush();
  const fresh = error ? new Map<string, string>() : await markNewFailures(em, run);
  run.newFailures = fresh.size;
  await em.flush();
  await mailAuthors(em, deps, run, fresh);
  return run;
}

export function vectorRunHandler(deps: RunDeps): JobHandler<{ runId: number; vectorIds: string[] }, RunEvent> {
  return async ({ runId, vectorIds }, job) => {
    try {
      await execute(deps, runId, vectorIds, job);
    } catch (cause) {
      if (job.signal.aborted) return;
      const message = `The run stopped: ${cause instanceof Error ? cause.message : String(cause)}`;
      deps.logger.error({ err: cause, runId }, 'run failed');
      const run = await finishRun(deps.orm.em.fork(), deps, runId, message).catch(() => undefined);
      job.publish(run ? runEvent(run) : { type: 'done', runId, status: 'failed', done: 0, total: vectorIds.length, passed: 0, failed: 0, newFailures: 0, error: message });
    }
  };
}

/** Resolves after the event loop has served what was waiting (I/O, timers). */
function nextTurn(): Promise<void> {
  return new Promise((resolve) => setImmediate(resolve));
}

function batchesOf<T>(items: readonly T[], size: number): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < items.length; i += size) out.push(items.slice(i, i + size));
  return out;
}

async function runBatch(pool: RunPool, tasks: RunVectorTask[]): Promise<VectorResult[]> {
  if (pool.runBatch) return pool.runBatch(tasks);
  return Promise.all(tasks.map((task) => pool.run(task)));
}

async function execute(deps: RunDeps, runId: number, vectorIds: readonly string[], job: JobContext<RunEvent>): Promise<void> {
  const em = deps.orm.em.fork();
  const run = await em.findOne(TestRun, { id: runId });
  if (!run) return;
  if (run.status !== 'running') return job.publish(runEvent(run));
  const stored = new Set((await em.createQueryBuilder(RunResult).select('vectorId').where({ runId }).execute('all')).map((r) => r.vectorId));
  const pending = vectorIds.filter((id) => !stored.has(id));
  const total = vectorIds.length;
  // The property sandbox gives each user (or CI token) its turn.
  const owner = queueOwner(run);
  let passed = await em.count(RunResult, { runId, ok: true });
  let failed = stored.size - passed;
  job.publish({ type: 'progress', runId, done: passed + failed, total, passed, failed });
  // Progress at most every PROGRESS_EVERY_MS: a run of the whole library is a hundred batches,
  // and every event is a write to each open stream (a NOTIFY with PostgreSQL).
  let lastProgressMs = 0;
  let held: RunEvent | undefined;
  const publishProgress = (event: RunEvent) => {
    const nowMs = Date.now();
    held = event;
    if (nowMs - lastProgressMs < PROGRESS_EVERY_MS) return;
    lastProgressMs = nowMs;
    held = undefined;
    job.publish(event);
  };
  // As many batches in flight as the pool has threads, plus one waiting, so no thread idles.
  const batches = batchesOf(pending, RUN_BATCH_SIZE);
  let next = 0;
  const lane = async () => {
    while (next < batches.length && !job.signal.aborted) {
      const ids = batches[next++]!;
      // Each step below runs to its end without giving the event loop a turn (SQLite answers
      // synchronously), and lanes finish together: a turn first lets waiting requests go.
      await nextTurn();
      const batchEm = deps.orm.em.fork();
      // Plain rows, not entities: nothing for the identity map to hold or the collector to sweep.
      const rows = await batchEm
        .createQueryBuilder(TeamVector)
        .select(['vectorId', 'revision', 'title', 'kind', 'text'])
        .where({ vectorId: { $in: ids } })
        .execute('all');
      const byId = new Map(rows.map((r) => [r.vectorId, r]));
      const present = ids.filter((id) => byId.has(id));
      const results = await runBatch(
        deps.runPool,
        present.map((id) => ({ text: byId.get(id)!.text, vectorId: id, vectorsRoot: builtInVectorsDir, kind: byId.get(id)!.kind, owner })),
      );
      if (job.signal.aborted) return;
      const now = deps.clock.now();
      const records: Omit<IRunResult, 'id'>[] = present.map((id, i) => {
        const row = byId.get(id)!;
        const result = results[i]!;
        return {
          runId,
          vectorId: id,
          title: row.title,
          kind: row.kind,
          vectorRevision: row.revision,
          ok: result.ok,
          message: result.message ?? null,
          durationMs: Math.max(0, result.durationMs),
          newFailure: false,
          detail: result.ok ? null : detailOf(result),
          createdAt: now,
        };
      });
      // A vector deleted from the library since the run started still gets a result.
      for (const id of ids.filter((x) => !byId.has(x))) {
        records.push({
          runId,
          vectorId: id,
          title: null,
          kind: null,
          vectorRevision: null,
          ok: false,
          message: 'the vector was deleted from the library before it ran',
          durationMs: 0,
          newFailure: false,
          detail: null,
          createdAt: now,
        });
      }
      for (const record of records) {
        if (record.ok) passed += 1;
        else failed += 1;
      }
      await nextTurn();
      // One transaction per batch: its results and the run's counts.
      const counts = { done: passed + failed, passed, failed };
      // One multi-row insert (no unit of work to compute on the request thread) and the run's counts.
      await batchEm.transactional(async (tx) => {
        await tx.insertMany(RunResult, records as IRunResult[]);
        await tx.nativeUpdate(TestRun, { id: runId }, counts);
      });
      const lastRecord = records[records.length - 1]!;
      const last = { id: lastRecord.vectorId, ok: lastRecord.ok, durationMs: lastRecord.durationMs, ...(lastRecord.message ? { message: lastRecord.message } : {}) };
      publishProgress({ type: 'progress', runId, done: passed + failed, total, passed, failed, last });
    }
  };
  await Promise.all(Array.from({ length: Math.max(1, Math.min(batches.length, deps.runPool.threads ?? 2) + 1) }, lane));
  if (job.signal.aborted) return;
  // The last counts before the final event, so a progress bar reaches its end.
  if (held) job.publish(held);
  job.publish(runEvent(await finishRun(deps.orm.em.fork(), deps, runId)));
}
