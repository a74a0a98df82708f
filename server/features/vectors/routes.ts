import multer from 'multer';
import { z } from 'zod';
import { MAX_IMPORT_ZIP_BYTES, roleGroups } from '../../../shared/api/index.ts';
import { createTwoFilesPatch, diffLines } from 'diff';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { TeamVector, VectorRevision, type ITeamVector } from '../../db/library-entities.ts';
import { likeOperator } from '../../db/orm.ts';
import { badRequest, HttpError, notFound } from '../../errors.ts';
import { currentUser, route, type RouteDef } from '../../route-def.ts';
import { recordAudit } from '../audit/record.ts';
import { VECTOR_ID_PATTERN } from '../../../shared/vectors/index.ts';
import { deviceRefs, lastResults, presentListItem, presentRevision, presentVector } from './present.ts';
import { vectorFilterFields, vectorWhere } from './query.ts';
import { checkDevice, checkVectorFile, createVector, findVector, reviseVector, type CheckedVector } from './store.ts';
import { libraryZip, readLibraryZip } from './zip.ts';

/** api.md: admin, engineer and qa write vectors; everyone signed in reads them. */
const vectorWriters = roleGroups.editors;
const vectorDeleters = roleGroups.vectorDeleters;

const idParams = z.object({ id: z.string().regex(VECTOR_ID_PATTERN, 'must be a vector id such as caps/power-rules/45w-without-9v (URL-encode "/" as %2F)') });
const revisionParams = idParams.extend({ n: z.coerce.number({ error: 'must be a revision number' }).int().positive('must be a revision number') });

const sortKeys = ['id', 'title', 'kind', 'updatedAt', 'revision'] as const;
const sortColumn: Record<(typeof sortKeys)[number], keyof ITeamVector> = { id: 'vectorId', title: 'title', kind: 'kind', updatedAt: 'updatedAt', revision: 'revision' };

const listQuery = z.object({
  ...vectorFilterFields,
  sort: z.enum([...sortKeys, ...sortKeys.map((k) => `-${k}` as const)]).default('id'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});
const exportQuery = z.object(vectorFilterFields);

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
  return [multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_IMPORT_ZIP_BYTES, files: 1, fields: 5 } }).single('file')];
}

interface ImportIssue {
  file: string;
  message: string;
}

export const vectorsRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/vectors',
    access: 'signed-in',
    query: listQuery,
    async handler({ em, query }) {
      const { sort, page, pageSize, ...filter } = query;
      const direction = sort.startsWith('-') ? 'desc' : 'asc';
      const column = sortColumn[sort.replace(/^-/, '') as (typeof sortKeys)[number]];
      const [rows, total] = await em.findAndCount(TeamVector, vectorWhere(filter, likeOperator(em)), {
        orderBy: [{ [column]: direction }, { vectorId: 'asc' }],
        limit: pageSize,
        offset: (page - 1) * pageSize,
      });
      const devices = await deviceRefs(em);
      const last = await lastResults(
        em,
        rows.map((r) => r.vectorId),
      );
      // Every tag in the library with its count, for the filter menu.
      const tagCounts = new Map<string, number>();
      for (const { tags } of await em.find(TeamVector, {}, { fields: ['tags'] })) {
        for (const tag of tags.split(' ').filter((t) => t !== '')) tagCounts.set(tag, (tagCounts.get(tag) ?? 0) + 1);
      }
      return {
        items: rows.map((row) => presentListItem(row, devices, last.get(row.vectorId))),
        total,
        page,
        pageSize,
        tags: [...tagCounts].map(([tag, count]) => ({ tag, count })).sort((a, b) => (a.tag < b.tag ? -1 : 1)),
      };
    },
  }),
  route({
    method: 'get',
    path: '/api/vectors/export',
    access: 'signed-in',
    query: exportQuery,
    async handler({ em, query, res }) {
      const rows = await em.find(TeamVector, vectorWhere(query, likeOperator(em)), { fields: ['vectorId', 'text'], orderBy: { vectorId: 'asc' } });
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
    async handler(ctx) {
      const { req, em, deps } = ctx;
      const me = currentUser(ctx);
      const upload = req.file;
      if (!upload) throw badRequest('file: choose a zip of *.vector.json files (the multipart field "file")', 'vector.no-file');
      const read = readLibraryZip(new Uint8Array(upload.buffer));
      if (!read.ok) throw badRequest(read.error.message, 'vector.bad-zip');
      const issues: ImportIssue[] = [];
      const checked = new Map<string, { file: string; checked: CheckedVector }>();
      for (const file of read.files) {
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
      if (issues.length > 0) {
        const first = issues
          .slice(0, 3)
          .map((i) => `${i.file}: ${i.message}`)
          .join('; ');
        throw badRequest(`Nothing was imported: ${issues.length} file(s) are not valid vectors. ${first}`, 'vector.import-invalid', issues);
      }
      const note = `Imported from ${(upload.originalname || 'a zip').replace(/[\u0000-\u001f]/g, '').slice(0, 120)}`;
      let created = 0;
      let updated = 0;
      let unchanged = 0;
      for (const { checked: one } of checked.values()) {
        const row = await em.findOne(TeamVector, { vectorId: one.vector.id });
        if (!row) {
          await createVector(em, deps.clock, me, { checked: one, message: note });
          created += 1;
        } else if (row.text === one.text) {
          unchanged += 1;
        } else {
          await reviseVector(em, deps.clock, me, row, { checked: one, message: note, baseRevision: row.revision });
          updated += 1;
        }
      }
      recordAudit(em, deps.clock, { actor: me, action: 'vector.imported', target: `vectors:${checked.size}`, details: { created, updated, unchanged } });
      await em.flush();
      return { created, updated, unchanged, total: checked.size };
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
