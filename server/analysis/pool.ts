/**
 * The worker-thread pool that analyses stored traces (piscina), so a 50 MB upload never blocks
 * the request thread. The server creates one and passes it through the app's deps; idle threads
 * are unref'd and leave after `idleTimeoutMs`, and `close()` ends them at shutdown.
 */
import { availableParallelism } from 'node:os';
import { MessageChannel, type MessagePort } from 'node:worker_threads';
import { Piscina } from 'piscina';
import type { AnalyseAndStoreResult, AnalyseAndStoreTask, AnalysisProgress, AnalyseFileResult, AnalyseFileTask, ReadRecordsResult, ReadRecordsTask } from './analyse-file.ts';

export type { AnalyseAndStoreResult, AnalysisProgress, AnalyseFileResult, ReadRecordsResult } from './analyse-file.ts';

export interface AnalysisPool {
  analyze(path: string, options?: { format?: AnalyseFileTask['format']; onProgress?(progress: AnalysisProgress): void }): Promise<AnalyseFileResult>;
  /**
   * Analyses and writes the stored analysis to the new file `storeTo` in the worker, and every
   * message in compressed chunks to the new file `messagesTo`; answers its parts, never the object graph.
   */
  analyseAndStore(path: string, storeTo: string, messagesTo: string, options?: { format?: AnalyseFileTask['format']; onProgress?(progress: AnalysisProgress): void }): Promise<AnalyseAndStoreResult>;
  /** The records of a stored trace, read in a worker too (a vector export of a big file). */
  records(path: string, format: ReadRecordsTask['format'], limit: number): Promise<ReadRecordsResult>;
  close(): Promise<void>;
}

const workerUrl = new URL('./worker.mjs', import.meta.url).href;

/** On the 2-core machines Parley runs on, one analysis thread leaves a core for the requests. */
export function defaultThreads(): number {
  return Math.max(1, Math.min(4, availableParallelism() - 1));
}

export function createAnalysisPool(options: { maxThreads?: number; idleTimeoutMs?: number } = {}): AnalysisPool {
  const maxThreads = options.maxThreads ?? defaultThreads();
  const pool = new Piscina({
    filename: workerUrl,
    minThreads: 0,
    maxThreads,
    idleTimeout: options.idleTimeoutMs ?? 30_000,
  });
  return {
    analyze(path, options = {}) {
      return runWithProgress<AnalyseFileResult>(options.onProgress, (port) =>
        pool.run({ path, port, ...(options.format ? { format: options.format } : {}) } satisfies AnalyseFileTask, { transferList: [port] }),
      );
    },
    analyseAndStore(path, storeTo, messagesTo, options = {}) {
      return runWithProgress<AnalyseAndStoreResult>(options.onProgress, (port) =>
        pool.run({ path, storeTo, messagesTo, port, ...(options.format ? { format: options.format } : {}) } satisfies AnalyseAndStoreTask, { transferList: [port], name: 'analyseAndStore' }),
      );
    },
    async records(path, format, limit) {
      try {
        return (await pool.run({ path, format, limit } satisfies ReadRecordsTask, { name: 'readRecords' })) as ReadRecordsResult;
      } catch (cause) {
        return { ok: false, error: { code: 'analysis.failed', message: `the trace could not be read (${cause instanceof Error ? cause.message : String(cause)})` } };
      }
    },
    async close() {
      await pool.destroy();
    },
  };
}

/** Runs a task with a progress port; a crashed worker becomes an error value. */
async function runWithProgress<R>(
  onProgress: ((progress: AnalysisProgress) => void) | undefined,
  run: (port: MessagePort) => Promise<unknown>,
): Promise<R | { ok: false; error: { code: string; message: string } }> {
  const { port1, port2 } = new MessageChannel();
  if (onProgress) port1.on('message', (progress: AnalysisProgress) => onProgress(progress));
  try {
    return (await run(port2)) as R;
  } catch (cause) {
    return { ok: false, error: { code: 'analysis.failed', message: `the analysis stopped unexpectedly (${cause instanceof Error ? cause.message : String(cause)})` } };
  } finally {
    port1.close();
  }
}
