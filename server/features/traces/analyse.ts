/**
 * Runs the analysis of one stored trace through the worker pool and records the outcome on its
 * row: the analysis, its counts and rule ids, or the error. Progress goes to the SSE hub as it
 * comes. A file in which nothing at all could be read is not a trace: its row and file go.
 */
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { Trace } from '../../db/trace-entities.ts';
import type { Clock } from '../../context.ts';
import { analysisPool, type AnalysisPool } from '../../analysis/pool.ts';
import type { TraceFormat } from '../../../shared/trace/index.ts';
import { publishProgress } from './progress.ts';
import type { TraceStore } from './store.ts';

export type AnalysisOutcome = { ok: true } | { ok: false; code: string; message: string; removed: boolean };

const running = new Map<number, Promise<AnalysisOutcome>>();

/** The analysis of that trace still running in this process, if any. */
export function runningAnalysis(traceId: number): Promise<AnalysisOutcome> | undefined {
  return running.get(traceId);
}

export interface AnalyseInput {
  /** A fresh entity manager for the job (it outlives the request). */
  fork(): EntityManager;
  clock: Clock;
  store: TraceStore;
  trace: { id: number; sha256: string; format: string; sizeBytes: number };
  pool?: AnalysisPool;
}

export function analyseTrace(input: AnalyseInput): Promise<AnalysisOutcome> {
  const existing = running.get(input.trace.id);
  if (existing) return existing;
  const job = run(input)
    .catch((cause: unknown): AnalysisOutcome => {
      // A database failure mid-job: the row stays as it was and the caller hears why.
      const message = `The analysis could not be stored (${cause instanceof Error ? cause.message : String(cause)}).`;
      publishProgress(input.trace.id, { type: 'failed', status: 'failed', error: { code: 'analysis.failed', message } });
      return { ok: false, code: 'analysis.failed', message, removed: false };
    })
    .finally(() => running.delete(input.trace.id));
  running.set(input.trace.id, job);
  return job;
}

async function run({ fork, clock, store, trace, pool = analysisPool() }: AnalyseInput): Promise<AnalysisOutcome> {
  const em = fork();
  const { id, sizeBytes } = trace;
  await em.nativeUpdate(Trace, { id }, { status: 'analysing' });
  publishProgress(id, { type: 'progress', status: 'analysing', bytesRead: 0, totalBytes: sizeBytes });
  const result = await pool.analyze(store.pathOf(trace.sha256), {
    format: trace.format as TraceFormat,
    onProgress: (p) => publishProgress(id, { type: 'progress', status: 'analysing', bytesRead: p.bytesRead, totalBytes: p.totalBytes }),
  });
  if (!result.ok) {
    const { code } = result.error;
    if (code === 'trace.empty') {
      // Nothing readable in the whole file: it is not a trace, so nothing of it is kept.
      await em.nativeDelete(Trace, { id });
      await store.remove(trace.sha256);
      const message = `This is not a trace: ${result.error.message}.`;
      publishProgress(id, { type: 'failed', status: 'failed', error: { code: 'trace.not-a-trace', message } });
      return { ok: false, code: 'trace.not-a-trace', message, removed: true };
    }
    const message = `The analysis failed: ${result.error.message}.`;
    await em.nativeUpdate(Trace, { id }, { status: 'failed', errorCode: code, errorMessage: message, analysedAt: clock.now() });
    publishProgress(id, { type: 'failed', status: 'failed', error: { code, message } });
    return { ok: false, code, message, removed: false };
  }
  const { analysis } = result;
  const rules = [...new Set(analysis.findings.map((f) => f.rule))].sort();
  const row = await em.findOneOrFail(Trace, { id }, { populate: ['analysis'] });
  const headerTitle = typeof analysis.header?.title === 'string' ? analysis.header.title.trim().slice(0, 200) : '';
  em.assign(row, {
    // A title left empty at upload becomes the header's title, else the file name (lists sort by it).
    ...(row.title === '' ? { title: headerTitle || row.fileName } : {}),
    status: 'done',
    format: analysis.format ?? trace.format,
    summary: analysis.summary,
    messages: analysis.messages,
    errorCount: analysis.counts.error,
    warningCount: analysis.counts.warning,
    infoCount: analysis.counts.info,
    rules: rules.length > 0 ? ` ${rules.join(' ')} ` : '',
    analysis,
    errorCode: null,
    errorMessage: null,
    analysedAt: clock.now(),
  });
  await em.flush();
  publishProgress(id, { type: 'done', status: 'done', summary: analysis.summary, counts: analysis.counts });
  return { ok: true };
}
