/**
 * Writing the team library: every save is a revision row holding the formatted file text, and
 * a save names the revision it edits, so two people editing the same vector cannot overwrite
 * each other (the second gets 409 with the stored version to merge against).
 */
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { storedVectorKeys } from '../../../shared/api/index.ts';
import { DeviceUnderTest, type IUser } from '../../db/entities.ts';
import { TeamVector, VectorRevision, type ITeamVector } from '../../db/library-entities.ts';
import type { Clock } from '../../context.ts';
import { badRequest, conflict, fromZod, notFound } from '../../errors.ts';
import { formatVector, vectorSchema, type Vector } from '../../../shared/vectors/index.ts';

/** Top-level keys of a request body that belong to the server, not to the vector file. */
const META_KEYS = storedVectorKeys;

export interface CheckedVector {
  /** The file as the caller wrote it (defaults not filled in): what gets formatted and stored. */
  file: Record<string, unknown>;
  vector: Vector;
  text: string;
}

/** Splits server fields off a body and validates the rest as a vector file ("field: message" on failure). */
export function checkVectorFile(raw: unknown, location = 'body'): CheckedVector {
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) throw badRequest(`${location}: must be a vector file (a JSON object)`, 'input.invalid');
  const file: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(raw)) if (!(META_KEYS as readonly string[]).includes(key)) file[key] = value;
  const parsed = vectorSchema.safeParse(file);
  if (!parsed.success) throw fromZod(parsed.error, location);
  return { file, vector: parsed.data, text: formatVector(file) };
}

export function tagsColumn(tags: readonly string[]): string {
  const unique = [...new Set(tags.map((t) => t.trim()).filter((t) => t !== ''))];
  return unique.length > 0 ? ` ${unique.join(' ')} ` : '';
}

export function tagsOf(column: string): string[] {
  return column.split(' ').filter((t) => t !== '');
}

export async function checkDevice(em: EntityManager, deviceId: number | null | undefined): Promise<void> {
  if (deviceId === null || deviceId === undefined) return;
  if (!(await em.findOne(DeviceUnderTest, { id: deviceId }))) throw badRequest('deviceId: no device under test has that id', 'input.invalid');
}

export async function findVector(em: EntityManager, vectorId: string): Promise<ITeamVector> {
  const row = await em.findOne(TeamVector, { vectorId });
  if (!row) throw notFound(`No vector "${vectorId}" in the library`, 'vector.not-found');
  return row;
}

interface WriteInput {
  checked: CheckedVector;
  deviceId?: number | null;
  message: string;
}

/** Creates a vector at revision 1; 409 `vector.exists` when the id is taken. */
export async function createVector(em: EntityManager, clock: Clock, user: Pick<IUser, 'id' | 'name'>, input: WriteInput): Promise<ITeamVector> {
  const { vector, text } = input.checked;
  if (await em.findOne(TeamVector, { vectorId: vector.id })) {
    throw conflict(`A vector with the id "${vector.id}" is already in the library; open it and edit it instead`, 'vector.exists');
  }
  const now = clock.now();
  const row = em.create(TeamVector, {
    vectorId: vector.id,
    title: vector.title,
    kind: vector.kind,
    tags: tagsColumn(vector.tags),
    text,
    revision: 1,
    deviceId: input.deviceId ?? null,
    authorId: user.id,
    authorName: user.name,
    updatedById: user.id,
    updatedByName: user.name,
    createdAt: now,
    updatedAt: now,
  });
  await em.flush();
  em.create(VectorRevision, { vectorRowId: row.id, revision: 1, text, message: input.message, authorId: user.id, authorName: user.name, createdAt: now });
  await em.flush();
  return row;
}

export interface StaleDetails {
  revision: number;
  vector: Record<string, unknown>;
  text: string;
  updatedBy: string;
  updatedAt: string;
}

export function staleDetails(row: ITeamVector): StaleDetails {
  return { revision: row.revision, vector: JSON.parse(row.text) as Record<string, unknown>, text: row.text, updatedBy: row.updatedByName, updatedAt: row.updatedAt.toISOString() };
}

/**
 * A new revision on top of `baseRevision`. The row is updated only while it still holds that
 * revision (a conditional UPDATE), so of two concurrent saves exactly one wins; the other gets
 * 409 `vector.stale` with the stored vector in `details`.
 */
export async function reviseVector(em: EntityManager, clock: Clock, user: Pick<IUser, 'id' | 'name'>, row: ITeamVector, input: WriteInput & { baseRevision: number }): Promise<ITeamVector> {
  const { vector, text } = input.checked;
  if (vector.id !== row.vectorId) {
    throw badRequest(`id: a saved vector keeps its id ("${row.vectorId}"); to rename, create a new vector and delete this one`, 'input.invalid');
  }
  const next = input.baseRevision + 1;
  const now = clock.now();
  const deviceId = input.deviceId === undefined ? row.deviceId : input.deviceId;
  const changed = await em.transactional(async (tx) => {
    const updated = await tx.nativeUpdate(
      TeamVector,
      { id: row.id, revision: input.baseRevision },
      { title: vector.title, kind: vector.kind, tags: tagsColumn(vector.tags), text, revision: next, deviceId, updatedById: user.id, updatedByName: user.name, updatedAt: now },
    );
    if (updated === 0) return false;
    tx.create(VectorRevision, { vectorRowId: row.id, revision: next, text, message: input.message, authorId: user.id, authorName: user.name, createdAt: now });
    return true;
  });
  const fresh = await em.fork().findOneOrFail(TeamVector, { id: row.id });
  if (!changed) {
    throw conflict(
      `Revision ${input.baseRevision} is not the latest: ${fresh.updatedByName} saved revision ${fresh.revision} meanwhile. Merge your change into it and save again.`,
      'vector.stale',
      staleDetails(fresh),
    );
  }
  return fresh;
}
