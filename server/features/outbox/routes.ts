import { OutboxMessage } from '../../db/entities.ts';
import { notFound } from '../../errors.ts';
import { route, type RouteDef } from '../../route-def.ts';
import { idParams, pageQuery } from '../../http/schemas.ts';

export const outboxRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/outbox',
    access: ['admin'],
    query: pageQuery,
    async handler({ em, query }) {
      const [messages, total] = await em.findAndCount(OutboxMessage, {}, { orderBy: { id: 'desc' }, limit: query.pageSize, offset: (query.page - 1) * query.pageSize });
      const items = messages.map((m) => ({ id: m.id, to: m.to, subject: m.subject, sentAt: m.sentAt.toISOString() }));
      return { items, total };
    },
  }),
  route({
    method: 'get',
    path: '/api/outbox/:id',
    access: ['admin'],
    params: idParams,
    async handler({ em, params }) {
      const m = await em.findOne(OutboxMessage, { id: params.id });
      if (!m) throw notFound('No such message in the outbox');
      return { id: m.id, to: m.to, from: m.from, subject: m.subject, text: m.text, html: m.html, sentAt: m.sentAt.toISOString() };
    },
  }),
];
