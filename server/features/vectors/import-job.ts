/**
 * Importing a zip of vectors as a background job (server/jobs): the zip is inflated as a stream with
 * a byte budget, each file is checked in small batches that give the event loop back between them,
 * and the library is written in batched transactions (one read of the existing rows per batch,
 * multi-row inserts), so a 5,000-vector import takes seconds and every other request keeps being served.
 * Nothing is written unless every file is a valid vector.
 */
import { readFile, rm } from 'node:fs/promises';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { TeamVector, VectorRevision, type ITeamVector, type IVectorRevision } from '../../db/library-entities.ts';
import { HttpError } from '../../errors.ts';
import type { ApiErrorCode } from '../../../shared/api/index.ts';
import { jobKind, type JobContext, type JobHandler } from '../../jobs/types.ts';
import type { Clock } from '../../context.ts';
import { recordAudit } from '../audit/record.ts';
import { checkVectorFile, tagsColumn, type CheckedVector } from './store.ts';
import { readLibraryZip } from './zip.ts';

export interface ImportIssue {
  file: string;
  message: string;
}

export type ImportEvent =
  | { type: 'progress'; phase: 'reading' | 'checking' | 'writing'; done: number; total: number }
  | { type: 'done'; created: number; updated: number; unchanged: number; total: number }
  | { type: 'failed'; error: { code: Extract<ApiErrorCode, `vector.${string}`>; message: string; details?: ImportIssue[] } };

export interface ImportPayload {
  /** The uploaded zip, kept in the data folder until the job has read it. */
  zipPath: string;
  fileName: string;
  user: { id: number; name: string; email: string };
}

export const vectorImportJob = jobKind<ImportPayload, ImportEvent>('vector-import');

/** Files checked between two yields to the event loop, and rows per write transaction. */
const CHECK_BATCH = 50;
const WRITE_BATCH = 250;

const yieldToLoop = () => new Promise<void>((resolve) => setImmediate(resolve));

export function vectorImportHandler(deps: { fork(): EntityManager; clock: Clock; logger?: { error(obj: object, msg: string): void } }): JobHandler<ImportPayload, ImportEvent> {
  return async (payload, job) => {
    try {
      job.publish(await importZip(deps, payload, job));
    } catch (cause) {
      // The cause (SQL, paths) goes to the log, not to the user.
      deps.logger?.error({ err: cause }, 'vector import failed');
      job.publish({ type: 'failed', error: { code: 'vector.import-failed', message: 'The import stopped on a server error; nothing after the last completed batch was written. Try again.' } });
    } finally {
      await rm(payload.zipPath, { force: true });
    }
  };
}

async function importZip(deps: { fork(): EntityManager; clock: Clock }, payload: ImportPayload, job: JobContext<ImportEvent>): Promise<ImportEvent> {
  job.publish({ type: 'progress', phase: 'reading', done: 0, total: 0 });
  const read = await readLibraryZip(new Uint8Array(await readFile(payload.zipPath)));
  if (!read.ok) return { type: 'failed', error: { code: 'vector.bad-zip', message: read.error.message } };

  const issues: ImportIssue[] = [];
  const checked = new Map<string, { file: string; checked: CheckedVector }>();
  for (let first = 0; first < read.files.length; first += CHECK_BATCH) {
    for (const file of read.files.slice(first, first + CHECK_BATCH)) {
      let json: unknown;
      try {
        json = JSON.parse(file.text);
      } catch (error) {
        issues.push({ file: file.name, message: `not valid JSON (${error instanceof Error ? error.message : String(error)})` });
        continue;
      }
      try {
        const one = checkVectorFile(json, file.name);
        const earlier = checked.get(one.vector.id);
        if (earlier) issues.push({ file: file.name, message: `id "${one.vector.id}" is also the id of ${earlier.file}` });
        else checked.set(one.vector.id, { file: file.name, checked: one });
      } catch (error) {
        if (!(error instanceof HttpError)) throw error;
        issues.push({ file: file.name, message: error.message });
      }
    }
    job.publish({ type: 'progress', phase: 'checking', done: Math.min(read.files.length, first + CHECK_BATCH), total: read.files.length });
    await yieldToLoop();
  }
  if (issues.length > 0) {
    const first = issues
      .slice(0, 3)
      .map((i) => `${i.file}: ${i.message}`)
      .join('; ');
    return { type: 'failed', error: { code: 'vector.import-invalid', message: `Nothing was imported: ${issues.length} file(s) are not valid vectors. ${first}`, details: issues } };
  }

  const note = `Imported from ${payload.fileName.replace(/[\u0000-\u001f]/g, '').slice(0, 120) || 'a zip'}`;
  const all = [...checked.values()].map((c) => c.checked);
  let created = 0;
  let updated = 0;
  let unchanged = 0;
  for (let first = 0; first < all.length; first += WRITE_BATCH) {
    const batch = all.slice(first, first + WRITE_BATCH);
    const counts = await writeBatch(deps, payload, batch, note);
    created += counts.created;
    updated += counts.updated;
    unchanged += counts.unchanged;
    job.publish({ type: 'progress', phase: 'writing', done: first + batch.length, total: all.length });
    await yieldToLoop();
  }
  const em = deps.fork();
  recordAudit(em, deps.clock, { actor: { ...payload.user } as never, action: 'vector.imported', target: `vectors:${all.length}`, details: { created, updated, unchanged } });
  await em.flush();
  return { type: 'done', created, updated, unchanged, total: all.length };
}

/**
 * One transaction: new vectors at revision 1 with their first revision row; changed ones as the next
 * revision (only while the row still holds the revision read, as a single save does); same text: unchanged.
 */
async function writeBatch(deps: { fork(): EntityManager; clock: Clock }, payload: ImportPayload, batch: CheckedVector[], note: string) {
  const em = deps.fork();
  const now = deps.clock.now();
  const { user } = payload;
  return em.transactional(async (tx) => {
    const existing = new Map<string, ITeamVector>((await tx.find(TeamVector, { vectorId: { $in: batch.map((c) => c.vector.id) } })).map((row) => [row.vectorId, row]));
    const fresh = batch.filter((c) => !existing.has(c.vector.id));
    let updated = 0;
    let unchanged = 0;
    if (fresh.length > 0) {
      await tx.insertMany(
        TeamVector,
        fresh.map(({ vector, text }) => ({
          vectorId: vector.id,
          title: vector.title,
          kind: vector.kind,
          tags: tagsColumn(vector.tags),
          text,
          revision: 1,
          deviceId: null,
          authorId: user.id,
          authorName: user.name,
          updatedById: user.id,
          updatedByName: user.name,
          createdAt: now,
          updatedAt: now,
        })),
      );
      // Row ids of the new vectors (a multi-row insert does not report them all on every database).
      const idOf = new Map((await tx.find(TeamVector, { vectorId: { $in: fresh.map((c) => c.vector.id) } }, { fields: ['id', 'vectorId'] })).map((row) => [row.vectorId, row.id]));
      const firstRevisions = fresh.map(({ vector, text }) => ({ vectorRowId: idOf.get(vector.id)!, revision: 1, text, message: note, authorId: user.id, authorName: user.name, createdAt: now }));
      await tx.insertMany<IVectorRevision>(VectorRevision, firstRevisions as IVectorRevision[]);
    }
    const revisions: { vectorRowId: number; revision: number; text: string }[] = [];
    for (const one of batch) {
      const row = existing.get(one.vector.id);
      if (!row) continue;
      if (row.text === one.text) {
        unchanged++;
        continue;
      }
      const { vector, text } = one;
      const changed = await tx.nativeUpdate(
        TeamVector,
        { id: row.id, revision: row.revision },
        { title: vector.title, kind: vector.kind, tags: tagsColumn(vector.tags), text, revision: row.revision + 1, updatedById: user.id, updatedByName: user.name, updatedAt: now },
      );
      if (changed === 1) {
        revisions.push({ vectorRowId: row.id, revision: row.revision + 1, text });
        updated++;
      }
    }
    if (revisions.length > 0) {
      const rows = revisions.map((r) => ({ vectorRowId: r.vectorRowId, revision: r.revision, text: r.text, message: note, authorId: user.id, authorName: user.name, createdAt: now }));
      await tx.insertMany<IVectorRevision>(VectorRevision, rows as IVectorRevision[]);
    }
    return { created: fresh.length, updated, unchanged };
  });
}
