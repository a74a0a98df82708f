/** JSON shapes of the vectors API: a list row, and a full vector (its file keys plus server fields). */
import type { EntityManager } from '@mikro-orm/better-sqlite';
import type { DeviceRef, LastResult, RevisionSummary, Revision, StoredVector, VectorListItem, VectorMeta } from '../../../shared/api/index.ts';
import type { ITeamVector, IVectorRevision } from '../../db/library-entities.ts';
import { booleanOf, dateOf, sqlReads } from '../../db/reads.ts';
import { tagsOf } from './store.ts';

export async function deviceRefs(em: EntityManager): Promise<Map<number, DeviceRef>> {
  const devices = await sqlReads(em).all<{ id: number; name: string | null }>('select id, name from device_under_test');
  return new Map(devices.map((d) => [Number(d.id), { id: Number(d.id), name: d.name ?? '' }]));
}

/** What a list row shows: every column but the vector's revisions (the file text only for its `ref`). */
export type ListRow = Pick<
  ITeamVector,
  'id' | 'vectorId' | 'title' | 'kind' | 'tags' | 'text' | 'revision' | 'deviceId' | 'authorId' | 'authorName' | 'updatedById' | 'updatedByName' | 'createdAt' | 'updatedAt'
>;

/** The rows of these ids, in the order given (one prepared read). */
export async function listRows(em: EntityManager, ids: readonly number[]): Promise<ListRow[]> {
  if (ids.length === 0) return [];
  const rows = await sqlReads(em).all<Record<string, unknown>>(
    `select id, vector_id, title, kind, tags, text, revision, device_id, author_id, author_name, updated_by_id, updated_by_name, created_at, updated_at from team_vector where id in (${ids.map(() => '?').join(', ')})`,
    ids,
  );
  const byId = new Map(
    rows.map((r): [number, ListRow] => [
      Number(r.id),
      {
        id: Number(r.id),
        vectorId: String(r.vector_id),
        title: String(r.title),
        kind: String(r.kind),
        tags: String(r.tags),
        text: String(r.text),
        revision: Number(r.revision),
        deviceId: r.device_id == null ? null : Number(r.device_id),
        authorId: Number(r.author_id),
        authorName: String(r.author_name),
        updatedById: Number(r.updated_by_id),
        updatedByName: String(r.updated_by_name),
        createdAt: dateOf(r.created_at),
        updatedAt: dateOf(r.updated_at),
      },
    ]),
  );
  return ids.flatMap((id) => byId.get(id) ?? []);
}

function fileOf(row: Pick<ITeamVector, 'text'>): Record<string, unknown> {
  return JSON.parse(row.text) as Record<string, unknown>;
}

function metaOf(row: Omit<ListRow, 'text'>, devices: Map<number, DeviceRef>): VectorMeta {
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

/** The newest stored result of each vector id (one read through the (vector_id, id) index). */
export async function lastResults(em: EntityManager, vectorIds: readonly string[]): Promise<Map<string, LastResult>> {
  if (vectorIds.length === 0) return new Map();
  const rows = await sqlReads(em).all<{ vector_id: string; run_id: unknown; ok: unknown; message: string | null; created_at: unknown }>(
    `select r.vector_id, r.run_id, r.ok, r.message, r.created_at from run_result r join (select max(id) as id from run_result where vector_id in (${vectorIds.map(() => '?').join(', ')}) group by vector_id) newest on r.id = newest.id`,
    vectorIds,
  );
  return new Map(rows.map((r) => [r.vector_id, { runId: Number(r.run_id), ok: booleanOf(r.ok), message: r.message ?? null, at: dateOf(r.created_at).toISOString() }]));
}

export function presentListItem(row: ListRow, devices: Map<number, DeviceRef>, last: LastResult | undefined): VectorListItem {
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
