/**
 * Read-only report links (issue 13): a sharer makes a link to one trace's report that opens without
 * an account, valid for the days they chose (1–90), until they (or an admin) revoke it. The token is
 * `<link id>.<expiry, s>.<HMAC-SHA256 of both and the trace id under the server secret>`, so a
 * guessed or altered token fails before any lookup of its trace; the row makes it revocable.
 */
import { createHmac, timingSafeEqual } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { z } from 'zod';
import { DeviceUnderTest, type IUser } from '../../db/entities.ts';
import { Trace, type ITrace } from '../../db/trace-entities.ts';
import type { AppDeps } from '../../context.ts';
import { conflict, forbidden, notFound } from '../../errors.ts';
import { currentUser, route, type RouteDef } from '../../route-def.ts';
import { recordAudit } from '../audit/record.ts';
import { loadAnalysis } from './lookup.ts';
import { presentTrace } from './present.ts';
import type { TraceStore } from './store.ts';
import { buildReport } from './report.ts';
import { messagesAroundFindings } from './views.ts';
import type { SharedReport } from '../../../shared/api/index.ts';
import { ReportShareLink, type IReportShareLink } from './share-link-entity.ts';

const sharers = ['admin', 'engineer', 'qa', 'support'] as const;
export const SHARE_LINK_MAX_DAYS = 90;
const DAY_MS = 86_400_000;

export const shareLinkDays = z.coerce.number().int().min(1, 'at least 1 day').max(SHARE_LINK_MAX_DAYS, `at most ${SHARE_LINK_MAX_DAYS} days`);
const createBody = z.object({ expiresInDays: shareLinkDays });
const traceParams = z.object({ id: z.coerce.number().int().positive() });
const linkParams = z.object({ id: z.coerce.number().int().positive(), linkId: z.coerce.number().int().positive() });
const tokenParams = z.object({
  token: z
    .string()
    .min(1)
    .max(200)
    .regex(/^\d+\.\d+\.[A-Za-z0-9_-]+$/, 'not a report link'),
});

function signature(secret: string, linkId: number, traceId: number, expiresSec: number): string {
  return createHmac('sha256', secret).update(`report-share:${linkId}:${traceId}:${expiresSec}`).digest('base64url');
}

export function shareToken(secret: string, link: Pick<IReportShareLink, 'id' | 'traceId' | 'expiresAt'>): string {
  const expiresSec = Math.floor(link.expiresAt.getTime() / 1_000);
  return `${link.id}.${expiresSec}.${signature(secret, link.id, link.traceId, expiresSec)}`;
}

export const shareUrl = (deps: Pick<AppDeps, 'publicUrl' | 'secret'>, link: IReportShareLink) => `${deps.publicUrl}/shared/reports/${shareToken(deps.secret, link)}`;

function presentLink(deps: AppDeps, link: IReportShareLink) {
  const now = deps.clock.now().getTime();
  const state = link.revokedAt ? 'revoked' : link.expiresAt.getTime() <= now ? 'expired' : 'active';
  return {
    id: link.id,
    traceId: link.traceId,
    createdBy: { id: link.createdById, name: link.createdByName },
    createdAt: link.createdAt.toISOString(),
    expiresAt: link.expiresAt.toISOString(),
    revokedAt: link.revokedAt?.toISOString() ?? null,
    state,
    url: state === 'active' ? shareUrl(deps, link) : null,
  };
}

async function analysedTrace(em: EntityManager, id: number): Promise<ITrace> {
  const trace = await em.findOne(Trace, { id });
  if (!trace) throw notFound('No such trace', 'trace.not-found');
  if (trace.status !== 'done') throw conflict('The trace is not analysed yet; share it when the analysis is done', 'trace.not-analysed');
  return trace;
}

/** Makes a link (also used by "Share diagnosis", whose e-mail then carries it). */
export async function createShareLink(em: EntityManager, deps: AppDeps, me: IUser, trace: ITrace, days: number): Promise<IReportShareLink> {
  const now = deps.clock.now();
  const link = em.create(ReportShareLink, { traceId: trace.id, createdById: me.id, createdByName: me.name, createdAt: now, expiresAt: new Date(now.getTime() + days * DAY_MS), revokedAt: null });
  await em.flush();
  recordAudit(em, deps.clock, { actor: me, action: 'trace.link_created', target: `trace:${trace.id}`, details: { linkId: link.id, expiresAt: link.expiresAt.toISOString() } });
  return link;
}

/** The link a token names, if it is authentic, unexpired and not revoked. */
async function linkOfToken(em: EntityManager, deps: AppDeps, token: string): Promise<IReportShareLink> {
  const gone = () => notFound('This report link is not valid: it may have expired or been withdrawn. Ask the sender for a new one.', 'share-link.invalid');
  const [idText, expiresText, given] = token.split('.');
  const id = Number(idText);
  const expiresSec = Number(expiresText);
  if (!Number.isSafeInteger(id) || !Number.isSafeInteger(expiresSec) || !given) throw gone();
  const link = await em.findOne(ReportShareLink, { id });
  if (!link) throw gone();
  const expected = Buffer.from(signature(deps.secret, link.id, link.traceId, expiresSec));
  const actual = Buffer.from(given);
  if (expected.length !== actual.length || !timingSafeEqual(expected, actual)) throw gone();
  if (Math.floor(link.expiresAt.getTime() / 1_000) !== expiresSec || link.revokedAt || link.expiresAt.getTime() <= deps.clock.now().getTime()) throw gone();
  return link;
}

/** What the shared report shows: the report (no uploader comments), the timeline for its chart and message list. */
async function sharedReport(em: EntityManager, store: TraceStore, trace: ITrace, link: IReportShareLink): Promise<SharedReport> {
  const analysis = await loadAnalysis(store, trace);
  const device = trace.deviceId ? await em.findOne(DeviceUnderTest, { id: trace.deviceId }, { fields: ['id', 'name'] }) : null;
  const presented = presentTrace(trace, new Map(device ? [[device.id, { id: device.id, name: device.name }]] : []));
  const report = buildReport(presented, analysis, '');
  const { timeline } = analysis;
  // No way into the team's Parley and no file hash for a reader without an account.
  const { sha256: _hash, ...about } = report.trace;
  return {
    report: { ...report, trace: { ...about, link: null } },
    timeline: {
      messages: timeline.messages.map((m) => ({
        t: m.t,
        durationUs: m.durationUs,
        from: m.from,
        sop: m.sop,
        messageType: m.messageType,
        messageId: m.messageId,
        hex: m.hex,
        crcOk: m.crcOk,
        ...(m.retry ? { retry: true } : {}),
        ...(m.goodCrcFor !== undefined ? { goodCrcFor: m.goodCrcFor } : {}),
      })),
      measurements: timeline.measurements,
      events: timeline.events,
      contracts: timeline.contracts,
      omitted: timeline.omitted,
      measurementStride: timeline.measurementStride,
    },
    aroundFindings: await messagesAroundFindings(em, trace.id, analysis.findings),
    expiresAt: link.expiresAt.toISOString(),
  };
}

export const shareLinkRoutes: RouteDef[] = [
  route({
    method: 'post',
    path: '/api/traces/:id/share-links',
    access: sharers,
    params: traceParams,
    body: createBody,
    async handler(ctx) {
      const { em, params, body, res, deps } = ctx;
      const trace = await analysedTrace(em, params.id);
      const link = await createShareLink(em, deps, currentUser(ctx), trace, body.expiresInDays);
      await em.flush();
      res.status(201);
      return presentLink(deps, link);
    },
  }),
  route({
    method: 'get',
    path: '/api/traces/:id/share-links',
    access: sharers,
    params: traceParams,
    async handler({ em, params, deps }) {
      if (!(await em.findOne(Trace, { id: params.id }, { fields: ['id'] }))) throw notFound('No such trace', 'trace.not-found');
      const links = await em.find(ReportShareLink, { traceId: params.id }, { orderBy: { id: 'desc' } });
      return { items: links.map((link) => presentLink(deps, link)) };
    },
  }),
  route({
    method: 'delete',
    path: '/api/traces/:id/share-links/:linkId',
    access: sharers,
    params: linkParams,
    async handler(ctx) {
      const { em, params, deps } = ctx;
      const me = currentUser(ctx);
      const link = await em.findOne(ReportShareLink, { id: params.linkId, traceId: params.id });
      if (!link) throw notFound('No such report link', 'share-link.not-found');
      if (me.role !== 'admin' && link.createdById !== me.id) throw forbidden('Only the person who made a link, or an admin, may withdraw it', 'share-link.not-yours');
      if (!link.revokedAt) {
        link.revokedAt = deps.clock.now();
        recordAudit(em, deps.clock, { actor: me, action: 'trace.link_revoked', target: `trace:${link.traceId}`, details: { linkId: link.id } });
        await em.flush();
      }
      return undefined;
    },
  }),
  route({
    method: 'get',
    path: '/api/shared/reports/:token',
    access: 'anyone',
    params: tokenParams,
    async handler({ em, params, deps, res }) {
      const link = await linkOfToken(em, deps, params.token);
      const trace = await analysedTrace(em, link.traceId);
      res.setHeader('Cache-Control', 'private, no-store');
      res.setHeader('X-Robots-Tag', 'noindex');
      return sharedReport(em, deps.traceStore, trace, link);
    },
  }),
];
