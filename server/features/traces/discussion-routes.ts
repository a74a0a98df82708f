/** Talking about a trace: comments, and sharing its diagnosis by e-mail. */
import type { RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import { z } from 'zod';
import { TraceComment } from '../../db/trace-entities.ts';
import type { AppDeps } from '../../context.ts';
import { badGateway, rateLimited } from '../../errors.ts';
import { currentUser, route, type RouteDef } from '../../route-def.ts';
import { recordAudit } from '../audit/record.ts';
import { deviceMap, findTrace, idParams, loadAnalysis, text, traceWriters } from './lookup.ts';
import { presentComment, presentTrace } from './present.ts';
import { buildReport, diagnosisMail } from './report.ts';
import { createShareLink, shareLinkDays, shareUrl } from './share-links.ts';

const commentBody = z.object({ text: z.string().trim().min(1, 'write a comment first').max(4000, 'must be at most 4000 characters') });
const shareBody = z.object({
  to: z.email('must be an e-mail address').max(254),
  message: text(2000).optional(),
  /** Days a read-only report link in the mail stays valid (share-links.ts); none without it. */
  linkDays: shareLinkDays.optional(),
});

/** Share sends mail to any address: a per-user limit (default 30 an hour, `rateLimits.share`). */
function shareLimit(deps: AppDeps): RequestHandler[] {
  const { windowMs, limit } = deps.rateLimits.share;
  return [
    rateLimit({
      windowMs,
      limit,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      // The shared store when there are several instances (DATABASE_URL), else this process's memory.
      store: deps.rateLimitStore('share:user'),
      keyGenerator: (_req, res) => `user:${String(res.locals.user?.id ?? 'anonymous')}`,
      handler: (_req, _res, next) => next(rateLimited(`You have shared ${limit} diagnoses recently; try again later`)),
    }),
  ];
}

export const discussionRoutes: RouteDef[] = [
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
      const trace = await findTrace(em, params.id);
      const analysis = await loadAnalysis(deps.traceStore, trace);
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
];
