import { existsSync } from 'node:fs';
import { rm } from 'node:fs/promises';
import { basename } from 'node:path';
import { pipeline } from 'node:stream/promises';
import type { RequestHandler } from 'express';
import multer from 'multer';
import { rateLimit } from 'express-rate-limit';
import { raw, UniqueConstraintViolationException } from '@mikro-orm/core';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { z } from 'zod';
import { MAX_TRACE_BYTES, roleGroups } from '../../../shared/api/index.ts';
import { DeviceUnderTest, type IUser } from '../../db/entities.ts';
import { Trace, TraceComment, type ITrace } from '../../db/trace-entities.ts';
import { likeOperator } from '../../db/orm.ts';
import type { AppDeps } from '../../context.ts';
import { badGateway, badRequest, conflict, forbidden, notFound, rateLimited } from '../../errors.ts';
import { currentUser, route, type RouteContext, type RouteDef } from '../../route-def.ts';
import { idParams } from '../../http/schemas.ts';
import { recordAudit } from '../audit/record.ts';
import type { Analysis, TraceFormat } from '../../../shared/trace/index.ts';
import { traceAnalysisJob, traceEvent } from './analyse.ts';
import { streamJobEvents } from '../../jobs/sse.ts';
import { createQueuedTrace } from './new-trace.ts';
import { presentComment, presentTrace, type DeviceRef } from './present.ts';
import { buildReport, diagnosisMail } from './report.ts';
import { createShareLink, shareLinkDays, shareUrl } from './share-links.ts';
import { sniffTrace } from './sniff.ts';
import { hashingStorage, type ReceivedTrace } from './store.ts';
import { traceVectorText, vectorIdOf } from './vector.ts';

/** api.md: admin, engineer, qa and support work with traces; viewers read them. */
const traceWriters = roleGroups.traceWriters;
/** Most records a `trace` vector file may hold. */
const VECTOR_RECORD_LIMIT = 100_000;

const text = (max: number) => z.string().trim().max(max, `must be at most ${max} characters`);

const uploadBody = z.object({
  title: text(200).default(''),
  /** The device under test; an empty form field means none. */
  deviceId: z
    .union([z.literal(''), z.coerce.number().int().positive('must be a device id')])
    .optional()
    .transform((v) => (v === '' || v === undefined ? null : v)),
  customerRef: text(120).default(''),
  notes: text(4000).default(''),
});

const uploadQuery = z.object({
  /** `false`: answer as soon as the file is stored; follow the analysis on `/events`. */
  wait: z.enum(['true', 'false']).default('true'),
});

const sortKeys = ['createdAt', 'title', 'sizeBytes', 'errors'] as const;
const listQuery = z.object({
  q: text(200).optional(),
  deviceId: z.coerce.number().int().positive().optional(),
  severity: z.enum(['error', 'warning', 'info', 'clean']).optional(),
  uploaderId: z.coerce.number().int().positive().optional(),
  sort: z.enum([...sortKeys, ...sortKeys.map((k) => `-${k}` as const)]).default('-createdAt'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});

const commentBody = z.object({ text: z.string().trim().min(1, 'write a comment first').max(4000, 'must be at most 4000 characters') });
const shareBody = z.object({
  to: z.email('must be an e-mail address').max(254),
  message: text(2000).optional(),
  /** Days a read-only report link in the mail stays valid (share-links.ts); none without it. */
  linkDays: shareLinkDays.optional(),
});

const sortColumn: Record<(typeof sortKeys)[number], keyof ITrace> = { createdAt: 'createdAt', title: 'title', sizeBytes: 'sizeBytes', errors: 'errorCount' };

async function deviceMap(em: EntityManager): Promise<Map<number, DeviceRef>> {
  const devices = await em.find(DeviceUnderTest, {}, { fields: ['id', 'name'] });
  return new Map(devices.map((d) => [d.id, { id: d.id, name: d.name }]));
}

async function findTrace(em: EntityManager, id: number, withAnalysis = false): Promise<ITrace> {
  const trace = await em.findOne(Trace, { id }, withAnalysis ? { populate: ['analysis'] } : {});
  if (!trace) throw notFound('No such trace', 'trace.not-found');
  return trace;
}

function analysedOrConflict(trace: ITrace): Analysis {
  if (trace.status !== 'done' || !trace.analysis) {
    throw conflict(
      trace.status === 'failed' ? `The analysis of this trace failed: ${trace.errorMessage ?? 'no reason recorded'}` : 'The trace is still being analysed; try again when it is done',
      'trace.not-analysed',
    );
  }
  return trace.analysis;
}

/** The file name as the uploader's system gave it, reduced to something safe to show and send back. */
function cleanFileName(name: string | undefined): string {
  const base = basename((name ?? '').replace(/\\/g, '/'))
    .replace(/[\u0000-\u001f\u007f"]/g, '')
    .trim()
    .slice(0, 200);
  return base === '' ? 'trace.txt' : base;
}

/** multer with the hashing store, and a hook that deletes the temporary file however the request ends. */
function uploadMiddleware(deps: AppDeps): RequestHandler[] {
  const store = deps.traceStore;
  const upload = multer({
    storage: hashingStorage(store),
    limits: { fileSize: MAX_TRACE_BYTES, files: 1, fields: 10, fieldSize: 8 * 1024, parts: 12 },
  }).single('file');
  const cleanup: RequestHandler = (req, res, next) => {
    res.on('close', () => {
      const file = req.file as unknown as ReceivedTrace | undefined;
      if (file && existsSync(file.path)) void rm(file.path, { force: true });
    });
    next();
  };
  return [cleanup, upload];
}

/** Share sends mail to any address: a per-user limit (default 30 an hour, `rateLimits.share`). */
function shareLimit(deps: AppDeps): RequestHandler[] {
  const { windowMs, limit } = deps.rateLimits.share;
  return [
    rateLimit({
      windowMs,
      limit,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      keyGenerator: (_req, res) => `user:${String(res.locals.user?.id ?? 'anonymous')}`,
      handler: (_req, _res, next) => next(rateLimited(`You have shared ${limit} diagnoses recently; try again later`)),
    }),
  ];
}

/** Queues the analysis of a stored trace (or joins the one queued or running). */
function startAnalysis(deps: AppDeps, trace: ITrace) {
  return deps.jobs.enqueue(traceAnalysisJob, trace.id, { traceId: trace.id });
}

function mayDelete(user: IUser, trace: ITrace): boolean {
  return user.role === 'admin' || user.id === trace.uploaderId;
}

type UploadContext = RouteContext<z.infer<typeof uploadBody>, z.infer<typeof uploadQuery>, undefined>;

/** Sniff, dedupe, store, analyse: the upload once multer has the file on disk. */
async function receiveUpload(ctx: UploadContext, file: ReceivedTrace & { originalname?: string }) {
  const { res, body, query, em, deps } = ctx;
  const me = currentUser(ctx);
  const sniffed = sniffTrace(file.head, file.size <= file.head.length);
  if (!sniffed.ok) throw badRequest(sniffed.error.message, 'trace.not-a-trace');
  if (body.deviceId !== null && !(await em.findOne(DeviceUnderTest, { id: body.deviceId }))) {
    throw badRequest('deviceId: no device under test has that id', 'input.invalid');
  }
  const devices = await deviceMap(em);
  const duplicateOf = async () => {
    const existing = await em.fork().findOne(Trace, { sha256: file.sha256 }, { populate: ['analysis'] });
    if (!existing) return undefined;
    // The same bytes were uploaded before: that trace is the answer (200, not a new 201).
    res.status(200);
    return { trace: presentTrace(existing, devices), analysis: existing.analysis ?? null, duplicate: true };
  };
  const earlier = await duplicateOf();
  if (earlier) return earlier;

  const store = deps.traceStore;
  const now = deps.clock.now();
  const trace = createQueuedTrace(em, {
    title: body.title,
    fileName: cleanFileName(file.originalname),
    sha256: file.sha256,
    sizeBytes: file.size,
    format: sniffed.format,
    uploaderId: me.id,
    uploaderName: me.name,
    deviceId: body.deviceId,
    customerRef: body.customerRef,
    notes: body.notes,
    createdAt: now,
  });
  recordAudit(em, deps.clock, {
    actor: me,
    action: 'trace.uploaded',
    target: `trace:${file.sha256.slice(0, 12)}`,
    details: { fileName: trace.fileName, sizeBytes: file.size, format: sniffed.format },
  });
  try {
    await em.flush();
  } catch (error) {
    if (!(error instanceof UniqueConstraintViolationException)) throw error;
    em.clear();
    const raced = await duplicateOf();
    if (raced) return raced;
    throw error;
  }
  await store.keep(file.path, file.sha256);

  const job = await startAnalysis(deps, trace);
  if (query.wait === 'false') {
    res.status(201);
    return { trace: presentTrace(trace, devices), analysis: null };
  }
  const outcome = await job.finished;
  if (outcome.type === 'failed' && outcome.error.code === 'trace.not-a-trace') throw badRequest(outcome.error.message, 'trace.not-a-trace');
  const fresh = await findTrace(em.fork(), trace.id, true);
  res.status(201);
  return { trace: presentTrace(fresh, devices), analysis: fresh.analysis ?? null };
}

export const tracesRoutes: RouteDef[] = [
  route({
    method: 'post',
    path: '/api/traces',
    access: traceWriters,
    middleware: uploadMiddleware,
    body: uploadBody,
    query: uploadQuery,
    async handler(ctx) {
      const file = ctx.req.file as unknown as (ReceivedTrace & { originalname?: string }) | undefined;
      if (!file) throw badRequest('file: choose a trace file to upload (the multipart field "file")', 'trace.no-file');
      try {
        return await receiveUpload(ctx, file);
      } finally {
        // Kept files were renamed away; anything left is a rejected upload's temporary copy.
        await rm(file.path, { force: true });
      }
    },
  }),
  route({
    method: 'get',
    path: '/api/traces',
    access: 'signed-in',
    query: listQuery,
    async handler({ em, query }) {
      const where: Record<string, unknown>[] = [];
      if (query.q) {
        const like = `%${query.q}%`;
        const op = likeOperator(em);
        where.push({
          $or: [{ title: { [op]: like } }, { fileName: { [op]: like } }, { customerRef: { [op]: like } }, { notes: { [op]: like } }, { summary: { [op]: like } }, { rules: { [op]: like } }],
        });
      }
      if (query.deviceId) where.push({ deviceId: query.deviceId });
      if (query.uploaderId) where.push({ uploaderId: query.uploaderId });
      if (query.severity === 'error') where.push({ errorCount: { $gt: 0 } });
      if (query.severity === 'warning') where.push({ warningCount: { $gt: 0 } });
      if (query.severity === 'info') where.push({ infoCount: { $gt: 0 } });
      if (query.severity === 'clean') where.push({ status: 'done', errorCount: 0, warningCount: 0 });
      const descending = query.sort.startsWith('-');
      const column = sortColumn[query.sort.replace(/^-/, '') as (typeof sortKeys)[number]];
      const direction = descending ? 'desc' : 'asc';
      // Titles sort the way people read them, not by code point (SQLite's default).
      const order = column === 'title' ? { [raw('lower(title)')]: direction } : { [column]: direction };
      const [traces, total] = await em.findAndCount(Trace, where.length > 0 ? { $and: where } : {}, {
        orderBy: [order, { id: direction }],
        limit: query.pageSize,
        offset: (query.page - 1) * query.pageSize,
      });
      const devices = await deviceMap(em);
      const uploaders = await em.getConnection().execute<{ id: number; name: string }[]>('select uploader_id as id, max(uploader_name) as name from trace group by uploader_id order by name');
      return {
        items: traces.map((t) => presentTrace(t, devices)),
        total,
        page: query.page,
        pageSize: query.pageSize,
        uploaders: uploaders.map((u) => ({ id: Number(u.id), name: String(u.name) })),
      };
    },
  }),
  route({
    method: 'get',
    path: '/api/traces/:id',
    access: 'signed-in',
    params: idParams,
    async handler({ em, params, deps }) {
      const trace = await findTrace(em, params.id, true);
      const progress = trace.status === 'queued' || trace.status === 'analysing' ? deps.jobs.latest(traceAnalysisJob, trace.id) : undefined;
      return {
        trace: presentTrace(trace, await deviceMap(em)),
        analysis: trace.analysis ?? null,
        progress: progress?.type === 'progress' ? { bytesRead: progress.bytesRead, totalBytes: progress.totalBytes } : null,
      };
    },
  }),
  route({
    method: 'get',
    path: '/api/traces/:id/events',
    access: 'signed-in',
    params: idParams,
    async handler({ em, params, req, res, deps }) {
      const trace = await findTrace(em, params.id);
      await streamJobEvents(req, res, deps.jobs, traceAnalysisJob, trace.id, {
        heartbeat: 'still analysing',
        snapshot: async () => traceEvent(await em.fork().findOne(Trace, { id: trace.id })),
      });
      return undefined;
    },
  }),
  route({
    method: 'get',
    path: '/api/traces/:id/download',
    access: 'signed-in',
    params: idParams,
    async handler({ em, params, res, deps }) {
      const trace = await findTrace(em, params.id);
      if (!(await deps.traceStore.has(trace.sha256))) throw notFound('The stored file of this trace is missing', 'trace.file-missing');
      const stream = await deps.traceStore.read(trace.sha256);
      res.attachment(trace.fileName);
      res.type('text/plain; charset=utf-8');
      res.setHeader('Content-Length', String(trace.sizeBytes));
      await pipeline(stream, res);
      return undefined;
    },
  }),
  route({
    method: 'delete',
    path: '/api/traces/:id',
    access: traceWriters,
    params: idParams,
    async handler(ctx) {
      const { em, params, deps } = ctx;
      const me = currentUser(ctx);
      const trace = await findTrace(em, params.id);
      if (!mayDelete(me, trace)) throw forbidden('Only the uploader or an admin may delete a trace');
      if (await deps.jobs.isActive(traceAnalysisJob, trace.id)) throw conflict('The trace is still being analysed; delete it when that is done', 'trace.busy');
      await em.nativeDelete(TraceComment, { traceId: trace.id });
      recordAudit(em, deps.clock, { actor: me, action: 'trace.deleted', target: `trace:${trace.id}`, details: { fileName: trace.fileName } });
      em.remove(trace);
      await em.flush();
      await deps.traceStore.remove(trace.sha256);
      return undefined;
    },
  }),
  route({
    method: 'get',
    path: '/api/traces/:id/comments',
    access: 'signed-in',
    params: idParams,
    async handler({ em, params }) {
      await findTrace(em, params.id);
      const comments = await em.find(TraceComment, { traceId: params.id }, { orderBy: { id: 'asc' } });
      return { items: comments.map(presentComment), total: comments.length };
    },
  }),
  route({
    method: 'post',
    path: '/api/traces/:id/comments',
    access: traceWriters,
    params: idParams,
    body: commentBody,
    async handler(ctx) {
      const { em, params, body, res, deps } = ctx;
      const me = currentUser(ctx);
      await findTrace(em, params.id);
      const comment = em.create(TraceComment, { traceId: params.id, authorId: me.id, authorName: me.name, authorRole: me.role, body: body.text, createdAt: deps.clock.now() });
      await em.flush();
      res.status(201);
      return { comment: presentComment(comment) };
    },
  }),
  route({
    method: 'post',
    path: '/api/traces/:id/share',
    access: traceWriters,
    middleware: shareLimit,
    params: idParams,
    body: shareBody,
    async handler(ctx) {
      const { em, params, body, deps } = ctx;
      const me = currentUser(ctx);
      const trace = await findTrace(em, params.id, true);
      const analysis = analysedOrConflict(trace);
      const report = buildReport(presentTrace(trace, await deviceMap(em)), analysis, `${deps.publicUrl}/traces/${trace.id}`);
      const link = body.linkDays === undefined ? null : await createShareLink(em, deps, me, trace, body.linkDays);
      const shared = link ? { url: shareUrl(deps, link), expiresAt: link.expiresAt } : undefined;
      const mail = diagnosisMail({ to: body.to, senderName: me.name, note: body.message, report, ...(shared ? { shared } : {}) });
      try {
        await deps.mailer.send(mail);
      } catch (error) {
        deps.logger.warn({ err: error }, 'diagnosis mail not sent');
        throw badGateway('The mail server did not take the message; try again later', 'mail.not-sent');
      }
      recordAudit(em, deps.clock, { actor: me, action: 'trace.shared', target: `trace:${trace.id}`, details: { to: body.to } });
      await em.flush();
      return { sent: true, to: body.to, subject: mail.subject, ...(shared ? { link: shared.url } : {}) };
    },
  }),
  route({
    method: 'get',
    path: '/api/traces/:id/report.json',
    access: 'signed-in',
    params: idParams,
    async handler({ em, params, res, deps }) {
      const trace = await findTrace(em, params.id, true);
      const analysis = analysedOrConflict(trace);
      res.attachment(`trace-${trace.id}-report.json`);
      return buildReport(presentTrace(trace, await deviceMap(em)), analysis, `${deps.publicUrl}/traces/${trace.id}`);
    },
  }),
  route({
    method: 'get',
    path: '/api/traces/:id/vector',
    access: 'signed-in',
    params: idParams,
    async handler({ em, params, res, deps }) {
      const trace = await findTrace(em, params.id, true);
      const analysis = analysedOrConflict(trace);
      const read = await deps.traceStore.withLocalFile(trace.sha256, (path) => deps.analysisPool.records(path, trace.format as TraceFormat, VECTOR_RECORD_LIMIT));
      if (!read.ok) {
        const code = read.error.code === 'trace.too-many-records' ? 'trace.too-many-records' : 'trace.unreadable';
        throw badRequest(`The trace cannot be kept as a vector: ${read.error.message}`, code, { engineCode: read.error.code });
      }
      const presented = presentTrace(trace, await deviceMap(em));
      res.attachment(`${vectorIdOf(presented).split('/').pop()}.vector.json`);
      res.type('application/json; charset=utf-8');
      res.send(traceVectorText(presented, analysis, read.records));
      return undefined;
    },
  }),
];
