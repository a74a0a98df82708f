/** What several trace routes share: the id parameter, the row lookup, devices by id, the stored analysis. */
import { buffer } from 'node:stream/consumers';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { z } from 'zod';
import { roleGroups } from '../../../shared/api/index.ts';
import { idParams } from '../../http/schemas.ts';
import { DeviceUnderTest } from '../../db/entities.ts';
import { Trace, type ITrace } from '../../db/trace-entities.ts';
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
  const devices = await em.find(DeviceUnderTest, {}, { fields: ['id', 'name'] });
  return new Map(devices.map((d) => [d.id, { id: d.id, name: d.name }]));
}

export async function findTrace(em: EntityManager, id: number): Promise<ITrace> {
  const trace = await em.findOne(Trace, { id });
  if (!trace) throw notFound('No such trace', 'trace.not-found');
  return trace;
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
