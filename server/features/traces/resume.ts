/**
 * Traces a stopped server left `queued` or `analysing` would otherwise wait until someone opened
 * them. At start-up every such trace goes back through the analysis pool, one job per trace (the
 * pool queues them), in the background: start-up does not wait for them.
 */
import type { Orm } from '../../db/orm.ts';
import { Trace } from '../../db/trace-entities.ts';
import type { Clock } from '../../context.ts';
import type { AnalysisPool } from '../../analysis/pool.ts';
import { analyseTrace, runningAnalysis, type AnalysisOutcome } from './analyse.ts';
import { traceStore } from './store.ts';

export interface ResumeInput {
  orm: Orm;
  clock: Clock;
  dataDir: string;
  pool?: AnalysisPool;
  /** Told about each trace that could not be resumed (its row stays as it was). */
  onError?: (traceId: number, message: string) => void;
}

/** Starts the analysis of every unfinished trace; resolves with the ids queued and, later, all outcomes. */
export async function resumeUnfinishedTraces({ orm, clock, dataDir, pool, onError }: ResumeInput): Promise<{ ids: number[]; done: Promise<AnalysisOutcome[]> }> {
  const em = orm.em.fork();
  const rows = await em.find(Trace, { status: { $in: ['queued', 'analysing'] } }, { orderBy: { id: 'asc' } });
  const store = traceStore(dataDir);
  const jobs = rows
    .filter((row) => !runningAnalysis(row.id))
    .map((row) => {
      const trace = { id: row.id, sha256: row.sha256, format: row.format, sizeBytes: row.sizeBytes };
      if (!store.has(row.sha256)) {
        // The file is gone (data folder copied without it): say so on the row rather than loop.
        const message = 'The analysis failed: the stored file is missing.';
        onError?.(row.id, message);
        return em.nativeUpdate(Trace, { id: row.id }, { status: 'failed', errorCode: 'trace.file-missing', errorMessage: message, analysedAt: clock.now() })
          .then(
            (): AnalysisOutcome => ({ ok: false, code: 'trace.file-missing', message, removed: false }),
            (cause: unknown): AnalysisOutcome => ({ ok: false, code: 'analysis.failed', message: cause instanceof Error ? cause.message : String(cause), removed: false }),
          );
      }
      return analyseTrace({ fork: () => orm.em.fork(), clock, store, trace, ...(pool ? { pool } : {}) }).then((outcome) => {
        if (!outcome.ok) onError?.(row.id, outcome.message);
        return outcome;
      });
    });
  return { ids: rows.map((row) => row.id), done: Promise.all(jobs) };
}
