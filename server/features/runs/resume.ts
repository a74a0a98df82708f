/**
 * A run the last process left `running` with the in-process queue has nobody to finish it: its
 * vectors were in that process's memory. At start-up it is closed as failed, with the results it
 * stored, so its page and event stream end instead of waiting. (A PostgreSQL queue retries it.)
 */
import type { Orm } from '../../db/orm.ts';
import { RunResult, TestRun } from '../../db/library-entities.ts';
import type { Clock } from '../../context.ts';

export async function closeOrphanedRuns(orm: Orm, clock: Clock): Promise<number> {
  const em = orm.em.fork();
  const runs = await em.find(TestRun, { status: 'running' });
  for (const run of runs) {
    const passed = await em.count(RunResult, { runId: run.id, ok: true });
    const failed = await em.count(RunResult, { runId: run.id, ok: false });
    em.assign(run, { status: 'failed', passed, failed, done: passed + failed, finishedAt: clock.now(), errorMessage: 'The server stopped during the run; start it again to run the rest.' });
  }
  await em.flush();
  return runs.length;
}
