/**
 * Traces a stopped server left `queued` or `analysing` would otherwise wait forever. At start-up
 * (in-process queue only: a PostgreSQL queue keeps its jobs) every such trace goes back into the
 * job queue, in the background: start-up does not wait for them.
 */
import type { Orm } from '../../db/orm.ts';
import { Trace } from '../../db/trace-entities.ts';
import type { JobQueue } from '../../jobs/types.ts';
import { traceAnalysisJob } from './analyse.ts';
import type { AnalysisEvent } from '../../../shared/api/index.ts';

export interface ResumeInput {
  orm: Orm;
  jobs: JobQueue;
  /** Told about each trace whose analysis failed again. */
  onError?: (traceId: number, message: string) => void;
}

/** Queues the analysis of every unfinished trace; resolves with the ids queued and, later, their final events. */
export async function resumeUnfinishedTraces({ orm, jobs, onError }: ResumeInput): Promise<{ ids: number[]; done: Promise<AnalysisEvent[]> }> {
  const rows = await orm.em.fork().find(Trace, { status: { $in: ['queued', 'analysing'] } }, { orderBy: { id: 'asc' }, fields: ['id'] });
  const finals = await Promise.all(rows.map((row) => jobs.enqueue(traceAnalysisJob, row.id, { traceId: row.id })));
  const done = Promise.all(
    finals.map(({ finished }, index) =>
      finished.then((event) => {
        if (event.type === 'failed') onError?.(rows[index]!.id, event.error.message);
        return event;
      }),
    ),
  );
  return { ids: rows.map((row) => row.id), done };
}
