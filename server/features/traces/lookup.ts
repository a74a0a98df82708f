/** What several trace routes share: the id parameter, the row lookup, devices by id, the stored analysis. */
import { buffer } from 'node:stream/consumers';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { z } from 'zod';
import { roleGroups } from '../../../shared/api/index.ts';
import { idParams } from '../../http/schemas.ts';
import { Trace, type ITrace, type TraceStatus } from '../../db/trace-entities.ts';
import { dateOf, dateOrNull, sqlReads } from '../../db/reads.ts';
import { conflict, notFound } from '../../errors.ts';
import { inflateStoredFile } from '../../analysis/deflated-json.ts';
import type { StoredAnalysis } from '../../../shared/trace/views.ts';
import type { DeviceRef } from './present.ts';
import type { TraceStore } from './store.ts';

/** api.md: admin, engineer, qa and support work with traces; viewers read them. */
export const traceWriters = roleGroups.traceWriters;
export { idParams };

export const text = (max: number) => z.string().trim().max(max, `must be at most ${max} characters`);

export async function deviceMap(em: EntityManager): Promise<Map<number, DeviceRef>> {
  const devices = await sqlReads(em).all<{ id: unknown; name: string }>('select id, name from device_under_test');
  return new Map(devices.map((d) => [Number(d.id), { id: Number(d.id), name: d.name }]));
}

/** The trace row as an entity this request may change (writes, and reads that hand it on to a write). */
export async function findTrace(em: EntityManager, id: number): Promise<ITrace> {
  const trace = await em.findOne(Trace, { id });
  if (!trace) throw notFound('No such trace', 'trace.not-found');
  return trace;
}

/** Every column of the trace table, in the order of `traceOfRow`. */
export const traceColumns =
  'id, title, file_name, sha256, size_bytes, format, uploader_id, uploader_name, device_id, customer_ref, notes, status, error_code, error_message, summary, messages, error_count, warning_count, info_count, rules, analysis_bytes, created_at, analysed_at';

/** A trace row read in plain SQL as the entity's shape (not tracked: for reading only). */
export function traceOfRow(r: Record<string, unknown>): ITrace {
  return {
    id: Number(r.id),
    title: String(r.title),
    fileName: String(r.file_name),
    sha256: String(r.sha256),
    sizeBytes: Number(r.size_bytes),
    format: String(r.format),
    uploaderId: Number(r.uploader_id),
    uploaderName: String(r.uploader_name),
    deviceId: r.device_id == null ? null : Number(r.device_id),
    customerRef: String(r.customer_ref),
    notes: String(r.notes),
    status: r.status as TraceStatus,
    errorCode: (r.error_code as string | null) ?? null,
    errorMessage: (r.error_message as string | null) ?? null,
    summary: (r.summary as string | null) ?? null,
    messages: Number(r.messages),
    errorCount: Number(r.error_count),
    warningCount: Number(r.warning_count),
    infoCount: Number(r.info_count),
    rules: String(r.rules),
    analysisBytes: r.analysis_bytes == null ? null : Number(r.analysis_bytes),
    createdAt: dateOf(r.created_at),
    analysedAt: dateOrNull(r.analysed_at),
  } as ITrace;
}

/** The trace for a read-only route: one prepared read, nothing tracked; 404 when there is none. */
export async function readTrace(em: EntityManager, id: number): Promise<ITrace> {
  const row = await sqlReads(em).get<Record<string, unknown>>(`select ${traceColumns} from trace where id = ?`, [id]);
  if (!row) throw notFound('No such trace', 'trace.not-found');
  return traceOfRow(row);
}

export function analysedOrConflict(trace: ITrace): void {
  if (trace.status !== 'done') {
    throw conflict(
      trace.status === 'failed' ? `The analysis of this trace failed: ${trace.errorMessage ?? 'no reason recorded'}` : 'The trace is still being analysed; try again when it is done',
      'trace.not-analysed',
    );
  }
}

/** The whole stored analysis as an object, for the few routes that compute from it (report, share, vector). */
export async function loadAnalysis(store: TraceStore, trace: ITrace): Promise<StoredAnalysis> {
  analysedOrConflict(trace);
  const stream = await store.readAnalysis(trace.sha256);
  if (!stream) throw notFound('The stored analysis of this trace is missing', 'trace.analysis-missing');
  return JSON.parse(await inflateStoredFile(await buffer(stream))) as StoredAnalysis;
}
