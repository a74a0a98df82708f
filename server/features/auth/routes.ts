import { z } from 'zod';
import { User } from '../../db/entities.ts';
import { findOrganisation } from '../../db/organisation.ts';
import { conflict, notFound, unauthorized } from '../../errors.ts';
import { currentUser, route, type RouteDef } from '../../route-def.ts';
import { emailSchema } from '../../http/schemas.ts';
import { resetMail } from '../../mail/templates.ts';
import { recordAudit } from '../audit/record.ts';
import { checkPassword, decoyHash, hashPassword, passwordSchema } from './passwords.ts';
import { presentUser } from './present.ts';
import { limitByAddressAndEmail } from './rate-limit.ts';
import { endSession, startSession } from './session.ts';
import { findLiveToken, issueToken, resetValidMinutes, retireTokens } from './tokens.ts';

const tokenParams = z.object({ token: z.string().min(10).max(200) });

export const authRoutes: RouteDef[] = [
  route({
    method: 'post',
    path: '/api/auth/login',
    access: 'anyone',
    middleware: (deps) => [limitByAddressAndEmail(deps.rateLimits.login)],
    body: z.object({ email: emailSchema, password: z.string().min(1, 'is required').max(200) }),
    async handler({ em, body, res, deps }) {
      const user = await em.findOne(User, { email: body.email });
      // Compare against a decoy when there is no such account, so timing does not tell.
      const matches = await checkPassword(body.password, user?.passwordHash ?? decoyHash);
      if (!user?.passwordHash || !matches) {
        recordAudit(em, deps.clock, { actor: null, action: 'auth.sign_in_failed', target: body.email, details: { reason: user ? 'wrong_password' : 'unknown_email' } });
        await em.flush();
        throw unauthorized('The e-mail address or the password is wrong', 'auth.invalid-credentials');
      }
      if (!user.active) {
        recordAudit(em, deps.clock, { actor: null, action: 'auth.sign_in_failed', target: body.email, details: { reason: 'deactivated' } });
        await em.flush();
        throw unauthorized('This account is deactivated; ask an administrator to reactivate it', 'account.deactivated');
      }
      user.lastSignInAt = deps.clock.now();
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
      const user = currentUser(ctx);
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
    middleware: (deps) => [limitByAddressAndEmail(deps.rateLimits.forgot)],
    body: z.object({ email: emailSchema }),
    async handler({ em, body, res, deps }) {
      const user = await em.findOne(User, { email: body.email });
      if (user?.active && !user.invitePending) {
        await retireTokens(em, deps.clock, user.id, 'reset');
        const token = issueToken(em, deps.clock, { userId: user.id, kind: 'reset', validMs: resetValidMinutes * 60_000 });
        recordAudit(em, deps.clock, { actor: null, action: 'auth.reset_requested', target: user.email });
        await em.flush();
        const mail = resetMail({ to: user.email, name: user.name, link: `${deps.publicUrl}/reset/${token}`, validMinutes: resetValidMinutes });
        // Sent after the reply, so the answer takes as long whether or not the account exists.
        deps.mailer.send(mail).catch((err: unknown) => deps.logger.error({ err, to: user.email }, 'reset mail failed'));
      }
      res.status(202);
      return { ok: true };
    },
  }),
  route({
    method: 'post',
    path: '/api/auth/reset',
    access: 'anyone',
    body: z.object({ token: z.string().min(10).max(200), password: passwordSchema }),
    async handler({ em, body, res, deps }) {
      const token = await findLiveToken(em, deps.clock, body.token, 'reset');
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
      const token = await findLiveToken(em, deps.clock, params.token, 'invite');
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
