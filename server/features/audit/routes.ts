import { AuditEvent } from '../../db/entities.ts';
import { route, type RouteDef } from '../../route-def.ts';
import { pageQuery } from '../../http/schemas.ts';

export const auditRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/audit',
    access: ['admin'],
    query: pageQuery,
    async handler({ em, query }) {
      const [events, total] = await em.findAndCount(AuditEvent, {}, { orderBy: { id: 'desc' }, limit: query.pageSize, offset: (query.page - 1) * query.pageSize });
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
