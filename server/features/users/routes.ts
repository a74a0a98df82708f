import { z } from 'zod';
import { User, roles } from '../../db/entities.ts';
import { findOrganisation } from '../../db/organisation.ts';
import { badGateway, badRequest, conflict, notFound } from '../../errors.ts';
import { currentUser, route, type RouteDef } from '../../route-def.ts';
import { inviteMail } from '../../mail/templates.ts';
import { recordAudit } from '../audit/record.ts';
import { emailSchema } from '../../http/schemas.ts';
import { presentUserAdmin } from '../auth/present.ts';
import { inviteValidDays, issueToken, retireTokens } from '../auth/tokens.ts';
import { idParams } from '../../http/schemas.ts';

const nameSchema = z.string().trim().min(1, 'is required').max(120);

export const usersRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/users',
    access: ['admin'],
    async handler({ em }) {
      const [users, total] = await em.findAndCount(User, {}, { orderBy: { id: 'asc' } });
      return { items: users.map(presentUserAdmin), total };
    },
  }),
  route({
    method: 'post',
    path: '/api/users/invite',
    access: ['admin'],
    body: z.object({ email: emailSchema, name: nameSchema, role: z.enum(roles) }),
    async handler(ctx) {
      const { em, body, deps, res } = ctx;
      const admin = currentUser(ctx);
      const organisation = await findOrganisation(em);
      let user = await em.findOne(User, { email: body.email });
      if (user && !user.invitePending) throw conflict(`email: ${body.email} already has an account`, 'user.exists');
      if (user) {
        // Inviting a pending address again replaces its earlier link.
        user.name = body.name;
        user.role = body.role;
        await retireTokens(em, deps.clock, user.id, 'invite');
      } else {
        user = em.create(User, {
          email: body.email,
          name: body.name,
          role: body.role,
          passwordHash: null,
          active: true,
          invitePending: true,
          sessionVersion: 1,
          createdAt: deps.clock.now(),
          lastSignInAt: null,
        });
        await em.flush();
      }
      const token = issueToken(em, deps.clock, { userId: user.id, kind: 'invite', validMs: inviteValidDays * 86_400_000 });
      recordAudit(em, deps.clock, { actor: admin, action: 'user.invited', target: user.email, details: { role: user.role } });
      await em.flush();
      const mail = inviteMail({
        to: user.email,
        name: user.name,
        role: user.role,
        inviterName: admin.name,
        organisation: organisation?.name ?? 'your team',
        link: `${deps.publicUrl}/invite/${token}`,
        validDays: inviteValidDays,
      });
      try {
        await deps.mailer.send(mail);
      } catch (err) {
        deps.logger.error({ err, to: user.email }, 'invite mail failed');
        throw badGateway('The invitation was saved but the mail could not be sent; invite again to retry', 'mail.not-sent');
      }
      res.status(201);
      return { user: presentUserAdmin(user) };
    },
  }),
  route({
    method: 'patch',
    path: '/api/users/:id',
    access: ['admin'],
    params: idParams,
    body: z
      .object({ role: z.enum(roles).optional(), active: z.boolean().optional(), name: nameSchema.optional() })
      .refine((b) => b.role !== undefined || b.active !== undefined || b.name !== undefined, 'give role, active or name'),
    async handler(ctx) {
      const { em, body, params, deps } = ctx;
      const admin = currentUser(ctx);
      const user = await em.findOne(User, { id: params.id });
      if (!user) throw notFound('No such user');
      const self = user.id === admin.id;
      if (self && body.active === false) throw badRequest('active: you cannot deactivate your own account', 'user.self-change');
      if (self && body.role !== undefined && body.role !== user.role) throw badRequest('role: you cannot change your own role', 'user.self-change');
      if (body.role !== undefined && body.role !== user.role) {
        recordAudit(em, deps.clock, { actor: admin, action: 'user.role_changed', target: user.email, details: { from: user.role, to: body.role } });
        user.role = body.role;
      }
      if (body.active !== undefined && body.active !== user.active) {
        recordAudit(em, deps.clock, { actor: admin, action: body.active ? 'user.reactivated' : 'user.deactivated', target: user.email });
        user.active = body.active;
      }
      if (body.name !== undefined && body.name !== user.name) {
        recordAudit(em, deps.clock, { actor: admin, action: 'user.renamed', target: user.email, details: { from: user.name, to: body.name } });
        user.name = body.name;
      }
      await em.flush();
      return { user: presentUserAdmin(user) };
    },
  }),
];
