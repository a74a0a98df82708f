import multer from 'multer';
import { z } from 'zod';
import { MAX_IMPORT_ZIP_BYTES, roleGroups } from '../../../shared/api/index.ts';
import { createTwoFilesPatch, diffLines } from 'diff';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { TeamVector, VectorRevision, type ITeamVector } from '../../db/library-entities.ts';
import { badRequest, notFound } from '../../errors.ts';
import { currentUser, route, type RouteDef } from '../../route-def.ts';
import { recordAudit } from '../audit/record.ts';
import { VECTOR_ID_PATTERN } from '../../../shared/vectors/index.ts';
import { deviceRefs, lastResults, listRows, presentListItem, presentRevision, presentVector } from './present.ts';
import { dialectOf, matchingVectorIds, vectorFilterFields, vectorWhereSql } from './query.ts';
import { libraryAnswer, libraryTagCounts, libraryVersion } from './library-cache.ts';
import { sqlReads } from '../../db/reads.ts';
import { checkDevice, checkVectorFile, createVector, findVector, reviseVector } from './store.ts';
import { libraryZip } from './zip.ts';
import { vectorImportJob } from './import-job.ts';
import { streamJobEvents } from '../../jobs/sse.ts';
import { randomBytes } from 'node:crypto';
import { mkdir, writeFile } from 'node:fs/promises';
import { join } from 'node:path';

/** api.md: admin, engineer and qa write vectors; everyone signed in reads them. */
const vectorWriters = roleGroups.editors;
const vectorDeleters = roleGroups.vectorDeleters;

const idParams = z.object({ id: z.string().regex(VECTOR_ID_PATTERN, 'must be a vector id such as caps/power-rules/45w-without-9v (URL-encode "/" as %2F)') });
const revisionParams = idParams.extend({ n: z.coerce.number({ error: 'must be a revision number' }).int().positive('must be a revision number') });

const sortKeys = ['id', 'title', 'kind', 'updatedAt', 'revision'] as const;
const sortSql: Record<(typeof sortKeys)[number], string> = { id: 'v.vector_id', title: 'v.title', kind: 'v.kind', updatedAt: 'v.updated_at', revision: 'v.revision' };

const listQuery = z.object({
  ...vectorFilterFields,
  sort: z.enum([...sortKeys, ...sortKeys.map((k) => `-${k}` as const)]).default('id'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});
const exportQuery = z.object(vectorFilterFields);
const importQuery = z.object({
  /** `false`: answer 202 at once and follow the import on its events stream. */
  wait: z.enum(['true', 'false']).default('true'),
});

const message = z.string().trim().max(500, 'must be at most 500 characters');
const deviceId = z.number().int().positive('must be a device id').nullable();

/** The vector file's own keys pass through; `checkVectorFile` validates them with the engine's schema. */
const createBody = z.looseObject({ deviceId: deviceId.optional(), message: message.optional() });
const updateBody = z.looseObject({
  revision: z.number({ error: 'give the revision you edited (a number)' }).int().positive(),
  deviceId: deviceId.optional(),
  message: message.optional(),
});
const restoreBody = z.object({ revision: z.number({ error: 'give the revision to restore (a number)' }).int().positive(), message: message.optional() }).strict();
const diffQuery = z.object({ from: z.coerce.number().int().positive().optional(), to: z.coerce.number().int().positive().optional() });

async function findRevision(em: EntityManager, row: ITeamVector, n: number) {
  const revision = await em.findOne(VectorRevision, { vectorRowId: row.id, revision: n });
  if (!revision) throw notFound(`"${row.vectorId}" has no revision ${n} (the latest is ${row.revision})`, 'vector.no-revision');
  return revision;
}

function importUpload() {
  return [multer({ storage: multer.memoryStorage(), defParamCharset: 'utf8', limits: { fileSize: MAX_IMPORT_ZIP_BYTES, files: 1, fields: 5 } }).single('file')];
}

export const vectorsRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/vectors',
    access: 'signed-in',
    query: listQuery,
    // Rows, their newest results and device names all raise the library version.
    keep: async ({ em, query }) => `${await libraryVersion(em)} ${JSON.stringify(query)}`,
    async handler({ em, query }) {
      const { sort, page, pageSize, ...filter } = query;
      const direction = sort.startsWith('-') ? 'desc' : 'asc';
      const column = sortSql[sort.replace(/^-/, '') as (typeof sortKeys)[number]];
      const where = vectorWhereSql(filter, dialectOf(em));
      const reads = sqlReads(em);
      const version = await libraryVersion(em);
      const order = `order by ${column} ${direction}, v.vector_id asc`;
      const offset = (page - 1) * pageSize;
      let total: number;
      let ids: number[];
      if (filter.q) {
        // A search costs the full-text index some milliseconds: its matches, in order, are kept while the library stands.
        const matches = await libraryAnswer(em, version, `ids ${where.sql} ${order} ${JSON.stringify(where.params)}`, async () =>
          Int32Array.from((await reads.all<{ id: number }>(`select v.id from team_vector v ${where.sql} ${order}`, where.params)).map((r) => Number(r.id))),
        );
        total = matches.length;
        ids = Array.from(matches.subarray(offset, offset + pageSize));
      } else {
        // One page through the sort column's index; the filter's total is kept while the library stands.
        total = await libraryAnswer(em, version, `total ${where.sql} ${JSON.stringify(where.params)}`, async () =>
          Number((await reads.get<{ total: unknown }>(`select count(*) as total from team_vector v ${where.sql}`, where.params))?.total ?? 0),
        );
        ids = (await reads.all<{ id: number }>(`select v.id from team_vector v ${where.sql} ${order} limit ? offset ?`, [...where.params, pageSize, offset])).map((r) => Number(r.id));
      }
      const rows = await listRows(em, ids);
      const devices = await deviceRefs(em);
      const last = await lastResults(
        em,
        rows.map((r) => r.vectorId),
      );
      return {
        items: rows.map((row) => presentListItem(row, devices, last.get(row.vectorId))),
        total,
        page,
        pageSize,
        tags: await libraryTagCounts(em, version),
      };
    },
  }),
  route({
    method: 'get',
    path: '/api/vectors/export',
    access: 'signed-in',
    query: exportQuery,
    async handler({ em, query, res }) {
      const rows = await em.find(TeamVector, { vectorId: { $in: await matchingVectorIds(em, query) } }, { fields: ['vectorId', 'text'], orderBy: { vectorId: 'asc' } });
      const zip = libraryZip(rows.map((r) => ({ vectorId: r.vectorId, text: r.text })));
      res.attachment('parley-vectors.zip');
      res.type('application/zip');
      res.send(Buffer.from(zip));
      return undefined;
    },
  }),
  route({
    method: 'post',
    path: '/api/vectors/import',
    access: vectorWriters,
    middleware: importUpload,
    query: importQuery,
    async handler(ctx) {
      const { req, res, query, deps } = ctx;
      const me = currentUser(ctx);
      const upload = req.file;
      if (!upload) throw badRequest('file: choose a zip of *.vector.json files (the multipart field "file")', 'vector.no-file');
      // The zip waits in the data folder for the job (which may run in another process).
      const folder = join(deps.dataDir, 'imports');
      await mkdir(folder, { recursive: true, mode: 0o700 });
      const key = randomBytes(12).toString('hex');
      const zipPath = join(folder, `${key}.zip`);
      await writeFile(zipPath, upload.buffer, { mode: 0o600 });
      const job = await deps.jobs.enqueue(vectorImportJob, key, { zipPath, fileName: upload.originalname || 'a zip', user: { id: me.id, name: me.name, email: me.email } });
      if (query.wait === 'false') {
        res.status(202);
        return { job: key, events: `/api/vectors/import/${key}/events` };
      }
      const outcome = await job.finished;
      if (outcome.type === 'failed') throw badRequest(outcome.error.message, outcome.error.code, outcome.error.details);
      if (outcome.type !== 'done') throw new Error('the import ended without a result');
      const { created, updated, unchanged, total } = outcome;
      return { created, updated, unchanged, total };
    },
  }),
  route({
    method: 'get',
    path: '/api/vectors/import/:key/events',
    access: vectorWriters,
    params: z.object({ key: z.string().regex(/^[0-9a-f]{24}$/, 'must be an import key') }),
    async handler({ req, res, params, deps }) {
      await streamJobEvents(req, res, deps.jobs, vectorImportJob, params.key, {
        heartbeat: 'still importing',
        snapshot: async () =>
          deps.jobs.latest(vectorImportJob, params.key) ?? { type: 'failed', error: { code: 'vector.import-unknown', message: 'No import with that key is running or recently finished.' } },
      });
      return undefined;
    },
  }),
  route({
    method: 'post',
    path: '/api/vectors',
    access: vectorWriters,
    body: createBody,
    async handler(ctx) {
      const { em, body, res, deps } = ctx;
      const me = currentUser(ctx);
      const checked = checkVectorFile(body);
      await checkDevice(em, body.deviceId);
      const row = await createVector(em, deps.clock, me, { checked, deviceId: body.deviceId ?? null, message: body.message || 'Created' });
      recordAudit(em, deps.clock, { actor: me, action: 'vector.created', target: `vector:${row.vectorId}`, details: { revision: row.revision } });
      await em.flush();
      res.status(201);
      return presentVector(row, await deviceRefs(em));
    },
  }),
  route({
    method: 'get',
    path: '/api/vectors/:id',
    access: 'signed-in',
    params: idParams,
    async handler({ em, params }) {
      return presentVector(await findVector(em, params.id), await deviceRefs(em));
    },
  }),
  route({
    method: 'put',
    path: '/api/vectors/:id',
    access: vectorWriters,
    params: idParams,
    body: updateBody,
    async handler(ctx) {
      const { em, body, params, deps } = ctx;
      const me = currentUser(ctx);
      const row = await findVector(em, params.id);
      const checked = checkVectorFile(body);
      await checkDevice(em, body.deviceId);
      const saved = await reviseVector(em, deps.clock, me, row, { checked, deviceId: body.deviceId, message: body.message || `Revision ${body.revision + 1}`, baseRevision: body.revision });
      recordAudit(em, deps.clock, { actor: me, action: 'vector.updated', target: `vector:${saved.vectorId}`, details: { revision: saved.revision } });
      await em.flush();
      return presentVector(saved, await deviceRefs(em));
    },
  }),
  route({
    method: 'delete',
    path: '/api/vectors/:id',
    access: vectorDeleters,
    params: idParams,
    async handler(ctx) {
      const { em, params, deps } = ctx;
      const me = currentUser(ctx);
      const row = await findVector(em, params.id);
      await em.nativeDelete(VectorRevision, { vectorRowId: row.id });
      recordAudit(em, deps.clock, { actor: me, action: 'vector.deleted', target: `vector:${row.vectorId}`, details: { revisions: row.revision } });
      em.remove(row);
      await em.flush();
      return undefined;
    },
  }),
  route({
    method: 'get',
    path: '/api/vectors/:id/revisions',
    access: 'signed-in',
    params: idParams,
    async handler({ em, params }) {
      const row = await findVector(em, params.id);
      const revisions = await em.find(VectorRevision, { vectorRowId: row.id }, { orderBy: { revision: 'desc' }, fields: ['revision', 'message', 'authorId', 'authorName', 'createdAt'] });
      return { items: revisions.map((r) => presentRevision(r, false)), total: revisions.length, latest: row.revision };
    },
  }),
  route({
    method: 'get',
    path: '/api/vectors/:id/revisions/:n',
    access: 'signed-in',
    params: revisionParams,
    async handler({ em, params }) {
      const row = await findVector(em, params.id);
      return presentRevision(await findRevision(em, row, params.n), true);
    },
  }),
  route({
    method: 'get',
    path: '/api/vectors/:id/diff',
    access: 'signed-in',
    params: idParams,
    query: diffQuery,
    async handler({ em, params, query }) {
      const row = await findVector(em, params.id);
      const to = query.to ?? row.revision;
      const from = query.from ?? Math.max(1, to - 1);
      const [a, b] = [await findRevision(em, row, from), await findRevision(em, row, to)];
      const name = `${row.vectorId}.vector.json`;
      return {
        from,
        to,
        patch: createTwoFilesPatch(name, name, a.text, b.text, `revision ${from}`, `revision ${to}`, { context: 3 }),
        changes: diffLines(a.text, b.text).map((c) => ({ value: c.value, added: c.added, removed: c.removed, count: c.count })),
      };
    },
  }),
  route({
    method: 'post',
    path: '/api/vectors/:id/restore',
    access: vectorWriters,
    params: idParams,
    body: restoreBody,
    async handler(ctx) {
      const { em, params, body, deps } = ctx;
      const me = currentUser(ctx);
      const row = await findVector(em, params.id);
      const old = await findRevision(em, row, body.revision);
      const checked = checkVectorFile(JSON.parse(old.text), `revision ${body.revision}`);
      const saved = await reviseVector(em, deps.clock, me, row, { checked, message: body.message || `Restored revision ${body.revision}`, baseRevision: row.revision });
      recordAudit(em, deps.clock, { actor: me, action: 'vector.restored', target: `vector:${saved.vectorId}`, details: { from: body.revision, revision: saved.revision } });
      await em.flush();
      return presentVector(saved, await deviceRefs(em));
    },
  }),
];
