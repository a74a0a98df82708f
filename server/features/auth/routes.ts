import { z } from 'zod';
import { User } from '../../db/entities.ts';
import { findOrganisation } from '../../db/organisation.ts';
import { conflict, notFound, unauthorized } from '../../errors.ts';
import { currentUser, route, type RouteDef } from '../../route-def.ts';
import { emailSchema } from '../../http/schemas.ts';
import { resetMail } from '../../mail/templates.ts';
import { recordAudit } from '../audit/record.ts';
import { checkPassword, decoyHash, hashPassword, needsRehash, passwordSchema } from './passwords.ts';
import { presentUser } from './present.ts';
import { forgotLimits, signInLimits } from './rate-limit.ts';
import { endSession, startSession } from './session.ts';
import { findLiveToken, issueToken, redeemToken, resetValidMinutes, retireTokens } from './tokens.ts';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import type { AppDeps } from '../../context.ts';

function recordFailedSignIn(em: EntityManager, deps: AppDeps, email: string, reason: string): void {
  // A flood from many addresses is summarised: the next row written says how many were left out.
  const { write, suppressed } = deps.failedSignInAudit.take(deps.clock.now().getTime());
  if (!write) return;
  recordAudit(em, deps.clock, { actor: null, action: 'auth.sign_in_failed', target: email, details: suppressed > 0 ? { reason, notRecorded: suppressed } : { reason } });
}

const tokenParams = z.object({ token: z.string().min(10).max(200) });

export const authRoutes: RouteDef[] = [
  route({
    method: 'post',
    path: '/api/auth/login',
    access: 'anyone',
    middleware: signInLimits,
    body: z.object({ email: emailSchema, password: z.string().min(1, 'is required').max(200) }),
    async handler({ em, body, res, deps }) {
      const user = await em.findOne(User, { email: body.email });
      // Compare against a decoy when there is no such account, so timing does not tell.
      const matches = await checkPassword(body.password, user?.passwordHash ?? decoyHash);
      if (!user?.passwordHash || !matches) {
        recordFailedSignIn(em, deps, body.email, user ? 'wrong_password' : 'unknown_email');
        await em.flush();
        throw unauthorized('The e-mail address or the password is wrong', 'auth.invalid-credentials');
      }
      if (!user.active) {
        recordFailedSignIn(em, deps, body.email, 'deactivated');
        await em.flush();
        throw unauthorized('This account is deactivated; ask an administrator to reactivate it', 'account.deactivated');
      }
      user.lastSignInAt = deps.clock.now();
      if (needsRehash(user.passwordHash)) user.passwordHash = await hashPassword(body.password);
      recordAudit(em, deps.clock, { actor: user, action: 'auth.sign_in', target: user.email });
      await em.flush();
      startSession(res, user, deps);
      return { user: presentUser(user) };
    },
  }),
  route({
    method: 'post',
    path: '/api/auth/logout',
    access: 'signed-in',
    async handler(ctx) {
      // The signed-in user is a plain read; the account itself is loaded to be changed.
      const user = await ctx.em.findOneOrFail(User, { id: currentUser(ctx).id });
      // Server-side: every session cookie of this account signed before now stops working.
      user.sessionVersion += 1;
      recordAudit(ctx.em, ctx.deps.clock, { actor: user, action: 'auth.sign_out', target: user.email });
      await ctx.em.flush();
      endSession(ctx.res, ctx.deps);
      return undefined;
    },
  }),
  route({
    // The client's session probe: signed out is an answer (user null), not a 401 the browser logs.
    method: 'get',
    path: '/api/session',
    access: 'anyone',
    async handler(ctx) {
      if (!ctx.user) return { user: null, organisation: null };
      const organisation = await findOrganisation(ctx.em);
      return { user: presentUser(ctx.user), organisation: organisation ? { name: organisation.name } : null };
    },
  }),
  route({
    method: 'get',
    path: '/api/me',
    access: 'signed-in',
    async handler(ctx) {
      const organisation = await findOrganisation(ctx.em);
      return { user: presentUser(currentUser(ctx)), organisation: organisation ? { name: organisation.name } : null };
    },
  }),
  route({
    method: 'post',
    path: '/api/auth/forgot',
    access: 'anyone',
    middleware: forgotLimits,
    body: z.object({ email: emailSchema }),
    async handler({ body, res, deps }) {
      // The answer goes at once and is the same for every address; the lookup and the mail come after.
      res.status(202).json({ ok: true });
      const em = deps.orm.em.fork();
      try {
        const user = await em.findOne(User, { email: body.email });
        if (!user?.active || user.invitePending) return undefined;
        await retireTokens(em, deps.clock, user.id, 'reset');
        const token = issueToken(em, deps.clock, { userId: user.id, kind: 'reset', validMs: resetValidMinutes * 60_000 });
        recordAudit(em, deps.clock, { actor: null, action: 'auth.reset_requested', target: user.email });
        await em.flush();
        const mail = resetMail({ to: user.email, name: user.name, link: `${deps.publicUrl}/reset/${token}`, validMinutes: resetValidMinutes });
        await deps.mailer.send(mail);
      } catch (err) {
        deps.logger.error({ err }, 'reset request failed after the answer');
      }
      return undefined;
    },
  }),
  route({
    method: 'post',
    path: '/api/auth/reset',
    access: 'anyone',
    body: z.object({ token: z.string().min(10).max(200), password: passwordSchema }),
    async handler({ em, body, res, deps }) {
      const token = await redeemToken(em, deps.clock, body.token, 'reset');
      const user = token ? await em.findOne(User, { id: token.userId }) : null;
      if (!token || !user?.active) throw notFound('This reset link is invalid, used or expired; ask for a new one', 'token.invalid');
      user.passwordHash = await hashPassword(body.password);
      user.sessionVersion += 1;
      user.lastSignInAt = deps.clock.now();
      await retireTokens(em, deps.clock, user.id, 'reset');
      recordAudit(em, deps.clock, { actor: user, action: 'auth.password_reset', target: user.email });
      await em.flush();
      startSession(res, user, deps);
      return { user: presentUser(user) };
    },
  }),
  route({
    method: 'get',
    path: '/api/invites/:token',
    access: 'anyone',
    params: tokenParams,
    async handler({ em, params, deps }) {
      const token = await findLiveToken(em, deps.clock, params.token, 'invite');
      const user = token ? await em.findOne(User, { id: token.userId }) : null;
      if (!token || !user?.invitePending) throw notFound('This invitation is invalid, used or expired', 'token.invalid');
      return { email: user.email, name: user.name, role: user.role };
    },
  }),
  route({
    method: 'post',
    path: '/api/invites/:token/accept',
    access: 'anyone',
    params: tokenParams,
    body: z.object({ password: passwordSchema, name: z.string().trim().min(1).max(120).optional() }),
    async handler({ em, params, body, res, deps }) {
      const token = await redeemToken(em, deps.clock, params.token, 'invite');
      const user = token ? await em.findOne(User, { id: token.userId }) : null;
      if (!token || !user) throw notFound('This invitation is invalid, used or expired', 'token.invalid');
      if (!user.invitePending) throw conflict('This invitation was already accepted; sign in instead', 'invite.used');
      if (!user.active) throw unauthorized('This account is deactivated; ask an administrator to reactivate it', 'account.deactivated');
      user.passwordHash = await hashPassword(body.password);
      user.invitePending = false;
      if (body.name) user.name = body.name;
      user.lastSignInAt = deps.clock.now();
      await retireTokens(em, deps.clock, user.id, 'invite');
      recordAudit(em, deps.clock, { actor: user, action: 'user.invite_accepted', target: user.email });
      await em.flush();
      startSession(res, user, deps);
      return { user: presentUser(user) };
    },
  }),
];
