/** JSON shapes of the vectors API: a list row, and a full vector (its file keys plus server fields). */
import type { EntityManager } from '@mikro-orm/better-sqlite';
import type { DeviceRef, LastResult, RevisionSummary, Revision, StoredVector, VectorListItem, VectorMeta } from '../../../shared/api/index.ts';
import { DeviceUnderTest } from '../../db/entities.ts';
import { RunResult, type ITeamVector, type IVectorRevision } from '../../db/library-entities.ts';
import { tagsOf } from './store.ts';

export async function deviceRefs(em: EntityManager): Promise<Map<number, DeviceRef>> {
  const devices = await em.find(DeviceUnderTest, {}, { fields: ['id', 'name'] });
  return new Map(devices.map((d) => [d.id, { id: d.id, name: d.name ?? '' }]));
}

function fileOf(row: ITeamVector): Record<string, unknown> {
  return JSON.parse(row.text) as Record<string, unknown>;
}

function metaOf(row: ITeamVector, devices: Map<number, DeviceRef>): VectorMeta {
  return {
    device: row.deviceId == null ? null : (devices.get(row.deviceId) ?? null),
    author: { id: row.authorId, name: row.authorName },
    updatedBy: { id: row.updatedById, name: row.updatedByName },
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/**
 * The vector as its file says, plus `revision`, `deviceId` and `meta`: a client can send the
 * same object back with PUT (the server strips those three before validating the file).
 */
export function presentVector(row: ITeamVector, devices: Map<number, DeviceRef>): StoredVector {
  return {
    id: row.vectorId,
    ...fileOf(row),
    revision: row.revision,
    deviceId: row.deviceId ?? null,
    meta: metaOf(row, devices),
  };
}

/** The newest stored result of each vector id. */
export async function lastResults(em: EntityManager, vectorIds: readonly string[]): Promise<Map<string, LastResult>> {
  if (vectorIds.length === 0) return new Map();
  const rows = await em
    .getConnection()
    .execute<{ id: number }[]>(`select max(id) as id from run_result where vector_id in (${vectorIds.map(() => '?').join(', ')}) group by vector_id`, [...vectorIds]);
  const results = await em.find(RunResult, { id: { $in: rows.map((r) => Number(r.id)) } });
  return new Map(results.map((r) => [r.vectorId, { runId: r.runId, ok: r.ok, message: r.message ?? null, at: r.createdAt.toISOString() }]));
}

export function presentListItem(row: ITeamVector, devices: Map<number, DeviceRef>, last: LastResult | undefined): VectorListItem {
  const file = fileOf(row);
  return {
    id: row.vectorId,
    title: row.title,
    kind: row.kind,
    tags: tagsOf(row.tags),
    ref: typeof file.ref === 'string' ? file.ref : '',
    revision: row.revision,
    deviceId: row.deviceId ?? null,
    ...metaOf(row, devices),
    lastResult: last ?? null,
  };
}

export function presentRevision(revision: Pick<IVectorRevision, 'revision' | 'message' | 'authorId' | 'authorName' | 'createdAt'> & { text?: string }, withText: boolean): RevisionSummary | Revision {
  const base: RevisionSummary = { revision: revision.revision, message: revision.message, author: { id: revision.authorId, name: revision.authorName }, createdAt: revision.createdAt.toISOString() };
  return withText && revision.text !== undefined ? { ...base, text: revision.text, vector: JSON.parse(revision.text) as Record<string, unknown> } : base;
}
