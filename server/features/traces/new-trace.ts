import type { EntityManager } from '@mikro-orm/better-sqlite';
import { Trace, type ITrace } from '../../db/trace-entities.ts';

/** What an upload (or the demo seed) knows about a trace before it is analysed. */
export type NewTraceFields = Pick<ITrace, 'title' | 'fileName' | 'sha256' | 'sizeBytes' | 'format' | 'uploaderId' | 'uploaderName' | 'deviceId' | 'customerRef' | 'notes' | 'createdAt'>;

/** A trace row queued for analysis: no summary, no counts, no error yet; the caller flushes it. */
export function createQueuedTrace(em: EntityManager, fields: NewTraceFields): ITrace {
  return em.create(Trace, {
    ...fields,
    status: 'queued',
    errorCode: null,
    errorMessage: null,
    summary: null,
    messages: 0,
    errorCount: 0,
    warningCount: 0,
    infoCount: 0,
    rules: '',
    analysisBytes: null,
    analysedAt: null,
  });
}
