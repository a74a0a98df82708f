/** Adding and removing traces: the multipart upload (sniff, dedupe, store, analyse) and delete. */
import { existsSync } from 'node:fs';
import { rm } from 'node:fs/promises';
import { basename } from 'node:path';
import type { RequestHandler } from 'express';
import multer from 'multer';
import { UniqueConstraintViolationException } from '@mikro-orm/core';
import { z } from 'zod';
import { MAX_TRACE_BYTES } from '../../../shared/api/index.ts';
import { DeviceUnderTest, type IUser } from '../../db/entities.ts';
import { Trace, TraceChunk, TraceComment, TraceItem, type ITrace } from '../../db/trace-entities.ts';
import type { AppDeps } from '../../context.ts';
import { badGateway, badRequest, conflict, forbidden } from '../../errors.ts';
import { currentUser, route, type RouteContext, type RouteDef } from '../../route-def.ts';
import { recordAudit } from '../audit/record.ts';
import { traceAnalysisJob } from './analyse.ts';
import { deviceMap, findTrace, idParams, text, traceWriters } from './lookup.ts';
import { createQueuedTrace } from './new-trace.ts';
import { presentTrace } from './present.ts';
import { sendWithStoredAnalysis } from './send-analysis.ts';
import { sniffTrace } from './sniff.ts';
import { hashingStorage, type ReceivedTrace } from './store.ts';

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

/** The file name as the uploader's system gave it, reduced to something safe to show and send back. */
export function cleanFileName(name: string | undefined): string {
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
    // Browsers send file names as UTF-8; multer's default reads them as Latin-1.
    defParamCharset: 'utf8',
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

function mayDelete(user: IUser, trace: ITrace): boolean {
  return user.role === 'admin' || user.id === trace.uploaderId;
}

type UploadContext = RouteContext<z.infer<typeof uploadBody>, z.infer<typeof uploadQuery>, undefined>;

/** Answers with the trace and its stored analysis (null until done). */
async function answer(ctx: UploadContext, trace: ITrace, extra: Record<string, unknown> = {}) {
  const store = ctx.deps.traceStore;
  const presented = presentTrace(trace, await deviceMap(ctx.em));
  return sendWithStoredAnalysis(ctx.req, ctx.res, { trace: presented, ...extra }, trace.status === 'done' ? await store.readAnalysis(trace.sha256) : null);
}

/** Sniff, dedupe, store, analyse: the upload once multer has the file on disk. */
async function receiveUpload(ctx: UploadContext, file: ReceivedTrace & { originalname?: string }) {
  const { res, body, query, em, deps } = ctx;
  const me = currentUser(ctx);
  const sniffed = sniffTrace(file.head, file.size <= file.head.length);
  if (!sniffed.ok) throw badRequest(sniffed.error.message, 'trace.not-a-trace');
  if (body.deviceId !== null && !(await em.findOne(DeviceUnderTest, { id: body.deviceId }))) {
    throw badRequest('deviceId: no device under test has that id', 'input.invalid');
  }
  const duplicateOf = async () => {
    const existing = await em.fork().findOne(Trace, { sha256: file.sha256 });
    if (!existing) return undefined;
    // The same bytes were uploaded before: that trace is the answer (200, not a new 201).
    res.status(200);
    return existing;
  };
  const earlier = await duplicateOf();
  if (earlier) return answer(ctx, earlier, { duplicate: true });

  const store = deps.traceStore;
  // The file first: a store that fails (a bucket down) leaves no row behind, and the temporary file goes either way.
  try {
    await store.keep(file.path, file.sha256);
  } catch (cause) {
    deps.logger.error({ err: cause }, 'trace store did not take an upload');
    throw badGateway('The trace store did not take the file, so nothing was kept; try again later', 'trace.not-stored');
  }
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
    createdAt: deps.clock.now(),
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
    if (error instanceof UniqueConstraintViolationException) {
      em.clear();
      // The same bytes arrived at once from two requests: the other one's trace is the answer.
      const raced = await duplicateOf();
      if (raced) return answer(ctx, raced, { duplicate: true });
    }
    // No row holds the stored file: it goes.
    await store.remove(file.sha256).catch(() => undefined);
    throw error;
  }

  const job = await deps.jobs.enqueue(traceAnalysisJob, trace.id, { traceId: trace.id });
  if (query.wait === 'false') {
    res.status(201);
    return answer(ctx, trace);
  }
  const outcome = await job.finished;
  if (outcome.type === 'failed' && outcome.error.code === 'trace.not-a-trace') throw badRequest(outcome.error.message, outcome.error.code);
  res.status(201);
  return answer(ctx, await findTrace(em.fork(), trace.id));
}

export const uploadRoutes: RouteDef[] = [
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
      await em.nativeDelete(TraceItem, { traceId: trace.id });
      await em.nativeDelete(TraceChunk, { traceId: trace.id });
      recordAudit(em, deps.clock, { actor: me, action: 'trace.deleted', target: `trace:${trace.id}`, details: { fileName: trace.fileName } });
      em.remove(trace);
      await em.flush();
      await deps.traceStore.remove(trace.sha256);
      return undefined;
    },
  }),
];
