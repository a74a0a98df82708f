import { z } from 'zod';
import { AuditEvent } from '../../db/entities.ts';
import { route, type RouteDef } from '../../route-def.ts';
import { pageQuery } from '../../http/schemas.ts';

/** Filters of the audit log: an action or an action family ("vector." for all vector changes), who, and what. */
const auditQuery = pageQuery.extend({
  action: z
    .string()
    .trim()
    .max(64)
    .regex(/^[a-z_.]*$/, 'letters, "_" and "." only')
    .optional(),
  actor: z.string().trim().max(254).optional(),
  target: z.string().trim().max(200).optional(),
});

/** A `%` typed by a person is not a pattern (a `_` still matches itself, and at worst one other character). */
const literal = (text: string) => text.replace(/%/g, '');

export const auditRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/audit',
    access: ['admin'],
    query: auditQuery,
    async handler({ em, query }) {
      const where: Record<string, unknown> = {};
      if (query.action) where.action = query.action.endsWith('.') ? { $like: `${literal(query.action)}%` } : query.action;
      if (query.actor) where.actorEmail = { $like: `%${literal(query.actor)}%` };
      if (query.target) where.target = { $like: `%${literal(query.target)}%` };
      const [events, total] = await em.findAndCount(AuditEvent, where, { orderBy: { id: 'desc' }, limit: query.pageSize, offset: (query.page - 1) * query.pageSize });
      const items = events.map((e) => ({
        id: e.id,
        at: e.at.toISOString(),
        actor: e.actorEmail ? { email: e.actorEmail, name: e.actorName ?? '' } : null,
        action: e.action,
        target: e.target,
        details: e.details,
      }));
      return { items, total, page: query.page, pageSize: query.pageSize };
    },
  }),
];
