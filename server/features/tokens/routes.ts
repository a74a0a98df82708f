import { z } from 'zod';
import { ApiToken, type IApiToken } from '../../db/library-entities.ts';
import { notFound } from '../../errors.ts';
import { currentUser, route, type RouteDef } from '../../route-def.ts';
import { recordAudit } from '../audit/record.ts';
import { idParams } from '../../http/schemas.ts';
import { projectName } from '../runs/project.ts';
import { hashToken, newToken } from './verify.ts';

const createBody = z
  .object({
    project: projectName,
    name: z.string().trim().min(1, 'name the token, e.g. "firmware CI"').max(80, 'must be at most 80 characters'),
  })
  .strict();
const listQuery = z.object({ project: projectName.optional(), revoked: z.enum(['true', 'false']).default('false') });

function present(token: IApiToken) {
  return {
    id: token.id,
    project: token.project,
    name: token.name,
    prefix: token.tokenPrefix,
    createdBy: token.createdByName,
    createdAt: token.createdAt.toISOString(),
    lastUsedAt: token.lastUsedAt?.toISOString() ?? null,
    revokedAt: token.revokedAt?.toISOString() ?? null,
  };
}

export const tokensRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/tokens',
    access: ['admin'],
    query: listQuery,
    async handler({ em, query }) {
      const where = { ...(query.project ? { project: query.project } : {}), ...(query.revoked === 'false' ? { revokedAt: null } : {}) };
      const tokens = await em.find(ApiToken, where, { orderBy: { id: 'desc' } });
      return { items: tokens.map(present), total: tokens.length };
    },
  }),
  route({
    method: 'post',
    path: '/api/tokens',
    access: ['admin'],
    body: createBody,
    async handler(ctx) {
      const { em, body, res, deps } = ctx;
      const me = currentUser(ctx);
      const token = newToken();
      const row = em.create(ApiToken, {
        project: body.project,
        name: body.name,
        tokenHash: hashToken(token),
        tokenPrefix: token.slice(0, 10),
        createdById: me.id,
        createdByName: me.name,
        createdAt: deps.clock.now(),
        lastUsedAt: null,
        revokedAt: null,
      });
      recordAudit(em, deps.clock, { actor: me, action: 'token.created', target: `project:${body.project}`, details: { name: body.name, prefix: row.tokenPrefix } });
      await em.flush();
      res.status(201);
      // The only time the token itself leaves the server.
      return { token, item: present(row) };
    },
  }),
  route({
    method: 'delete',
    path: '/api/tokens/:id',
    access: ['admin'],
    params: idParams,
    async handler(ctx) {
      const { em, params, deps } = ctx;
      const me = currentUser(ctx);
      const row = await em.findOne(ApiToken, { id: params.id });
      if (!row) throw notFound('No such API token', 'token.not-found');
      if (row.revokedAt === null) {
        row.revokedAt = deps.clock.now();
        recordAudit(em, deps.clock, { actor: me, action: 'token.revoked', target: `project:${row.project}`, details: { name: row.name, prefix: row.tokenPrefix } });
        await em.flush();
      }
      return undefined;
    },
  }),
];
