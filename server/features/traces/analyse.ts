/**
 * The trace-analysis job: runs the analysis of one stored trace through the worker pool and
 * records the outcome on its row (the analysis, its counts and rule ids, or the error), publishing
 * progress as it comes. A file in which nothing at all could be read is not a trace: its row and
 * file go. The job reads everything it needs from the row, so any worker of the queue can run it,
 * and a retried job (its first worker died) simply analyses again.
 */
import { randomBytes } from 'node:crypto';
import { mkdirSync } from 'node:fs';
import { rm } from 'node:fs/promises';
import { join } from 'node:path';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { Trace, TraceChunk, TraceItem, type ITrace } from '../../db/trace-entities.ts';
import type { Clock } from '../../context.ts';
import type { AnalyseAndStoreResult, AnalysisPool } from '../../analysis/pool.ts';
import type { TraceFormat } from '../../../shared/trace/index.ts';
import { jobKind, type JobContext, type JobHandler } from '../../jobs/types.ts';
import type { AnalysisEvent } from '../../../shared/api/index.ts';
import type { TraceStore } from './store.ts';
import { readMessageChunks, type MessageChunkRow } from '../../analysis/message-chunks.ts';

/** Rows per insert statement. */
const INSERT_BATCH = 200;
/** Message chunks per insert statement (each some kilobytes of compressed text). */
const MESSAGE_CHUNK_BATCH = 20;

export const traceAnalysisJob = jobKind<{ traceId: number }, AnalysisEvent>('trace-analysis');

/** The final event of a trace's analysis as its row tells it, or its progress while it is not over. */
export function traceEvent(trace: ITrace | null): AnalysisEvent {
  if (!trace) return { type: 'failed', status: 'failed', error: { code: 'trace.not-a-trace', message: 'This is not a trace: nothing in the file could be read.' } };
  if (trace.status === 'done') return { type: 'done', status: 'done', summary: trace.summary ?? '', counts: { error: trace.errorCount, warning: trace.warningCount, info: trace.infoCount } };
  if (trace.status === 'failed') return { type: 'failed', status: 'failed', error: { code: trace.errorCode ?? 'analysis.failed', message: trace.errorMessage ?? 'The analysis failed.' } };
  return { type: 'progress', status: trace.status, bytesRead: 0, totalBytes: trace.sizeBytes };
}

export interface AnalysisJobDeps {
  /** A fresh entity manager for the job (it outlives any request). */
  fork(): EntityManager;
  clock: Clock;
  store: TraceStore;
  pool: AnalysisPool;
}

export function traceAnalysisHandler(deps: AnalysisJobDeps): JobHandler<{ traceId: number }, AnalysisEvent> {
  return async ({ traceId }, job) => {
    try {
      await analyse(deps, traceId, job);
    } catch (cause) {
      if (job.signal.aborted) return;
      // A database failure mid-job: the row stays as it was and the subscribers hear why.
      const message = `The analysis could not be stored (${cause instanceof Error ? cause.message : String(cause)}).`;
      job.publish({ type: 'failed', status: 'failed', error: { code: 'analysis.failed', message } });
    }
  };
}

async function analyse({ fork, clock, store, pool }: AnalysisJobDeps, id: number, job: JobContext<AnalysisEvent>): Promise<void> {
  const em = fork();
  const row = await em.findOne(Trace, { id });
  // Deleted, or finished by an earlier attempt: nothing to do but tell the subscribers.
  if (!row || row.status === 'done' || row.status === 'failed') return job.publish(traceEvent(row));
  const { sha256, sizeBytes } = row;
  if (!(await store.has(sha256))) {
    // The file is gone (data folder copied without it): say so on the row rather than loop.
    const message = 'The analysis failed: the stored file is missing.';
    await em.nativeUpdate(Trace, { id }, { status: 'failed', errorCode: 'trace.file-missing', errorMessage: message, analysedAt: clock.now() });
    return job.publish({ type: 'failed', status: 'failed', error: { code: 'trace.file-missing', message } });
  }
  await em.nativeUpdate(Trace, { id }, { status: 'analysing' });
  job.publish({ type: 'progress', status: 'analysing', bytesRead: 0, totalBytes: sizeBytes });
  mkdirSync(store.incomingDir, { recursive: true });
  // The worker writes the stored analysis here; the store then keeps it beside the file (or in the bucket).
  const storeTo = join(store.incomingDir, `.incoming-analysis-${randomBytes(8).toString('hex')}`);
  // Every message, in compressed chunks, spilled here as the analysis reads them; read into rows below.
  const messagesTo = `${storeTo}-messages`;
  try {
    const result = await store.withLocalFile(sha256, (path) =>
      pool.analyseAndStore(path, storeTo, messagesTo, {
        format: row.format as TraceFormat,
        onProgress: (p) => job.publish({ type: 'progress', status: 'analysing', bytesRead: p.bytesRead, totalBytes: p.totalBytes }),
      }),
    );
    if (result.ok && !job.signal.aborted) await store.keepAnalysis(storeTo, sha256);
    return await record({ em, clock, store }, row, result, messagesTo, job);
  } finally {
    await rm(storeTo, { force: true });
    await rm(messagesTo, { force: true });
  }
}

async function record(
  { em, clock, store }: { em: EntityManager; clock: Clock; store: TraceStore },
  row: ITrace,
  result: AnalyseAndStoreResult,
  messagesTo: string,
  job: JobContext<AnalysisEvent>,
): Promise<void> {
  const { id, sha256 } = row;
  // Stopped by a shutdown: the row stays `analysing` for the next worker (or start-up) to take.
  if (job.signal.aborted) return;
  if (!result.ok) {
    const { code } = result.error;
    if (code === 'trace.empty') {
      // Nothing readable in the whole file: it is not a trace, so nothing of it is kept.
      await em.nativeDelete(Trace, { id });
      await store.remove(sha256);
      return job.publish({ type: 'failed', status: 'failed', error: { code: 'trace.not-a-trace', message: `This is not a trace: ${result.error.message}.` } });
    }
    const message = `The analysis failed: ${result.error.message}.`;
    await em.nativeUpdate(Trace, { id }, { status: 'failed', errorCode: code, errorMessage: message, analysedAt: clock.now() });
    return job.publish({ type: 'failed', status: 'failed', error: { code, message } });
  }
  const { summary: analysis, findings, contracts, chunks, storedBytes } = result.stored;
  const rules = [...new Set(findings.map((f) => f.rule ?? ''))].filter(Boolean).sort();
  const headerTitle = typeof analysis.header?.title === 'string' ? analysis.header.title.trim().slice(0, 200) : '';
  // The parts the trace page reads, written with the row's new state in one transaction.
  await em.transactional(async (tx) => {
    await tx.nativeDelete(TraceItem, { traceId: id });
    await tx.nativeDelete(TraceChunk, { traceId: id });
    const items = [
      { traceId: id, kind: 'summary' as const, index: 0, t: null, severity: null, rule: null, body: JSON.stringify(analysis) },
      ...findings.map((f) => ({ traceId: id, kind: 'finding' as const, index: f.index, t: f.t, severity: f.severity, rule: f.rule, body: f.body })),
      ...contracts.map((c) => ({ traceId: id, kind: 'contract' as const, index: c.index, t: c.t, severity: null, rule: null, body: c.body })),
    ];
    for (let first = 0; first < items.length; first += INSERT_BATCH) await tx.insertMany(TraceItem, items.slice(first, first + INSERT_BATCH));
    const rows = chunks.map((c) => ({ traceId: id, ...c }));
    for (let first = 0; first < rows.length; first += INSERT_BATCH) await tx.insertMany(TraceChunk, rows.slice(first, first + INSERT_BATCH));
    // Message chunks a few at a time from the spill file: a huge trace's are never all in memory.
    let batch: (MessageChunkRow & { traceId: number })[] = [];
    for await (const chunk of readMessageChunks(messagesTo)) {
      batch.push({ traceId: id, ...chunk });
      if (batch.length >= MESSAGE_CHUNK_BATCH) {
        await tx.insertMany(TraceChunk, batch);
        batch = [];
      }
    }
    if (batch.length > 0) await tx.insertMany(TraceChunk, batch);
    const fresh = await tx.findOneOrFail(Trace, { id });
    tx.assign(fresh, {
      // A title left empty at upload becomes the header's title, else the file name (lists sort by it).
      ...(fresh.title === '' ? { title: headerTitle || fresh.fileName } : {}),
      status: 'done',
      format: analysis.format ?? fresh.format,
      summary: analysis.summary,
      messages: analysis.messages,
      errorCount: analysis.counts.error,
      warningCount: analysis.counts.warning,
      infoCount: analysis.counts.info,
      rules: rules.length > 0 ? ` ${rules.join(' ')} ` : '',
      analysisBytes: storedBytes,
      errorCode: null,
      errorMessage: null,
      analysedAt: clock.now(),
    });
  });
  job.publish({ type: 'done', status: 'done', summary: analysis.summary, counts: analysis.counts });
}
