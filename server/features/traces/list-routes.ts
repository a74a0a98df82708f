/** The trace list: filter, search, sort and page in SQL; listed rows never carry an analysis. */
import { raw } from '@mikro-orm/core';
import { z } from 'zod';
import { Trace, type ITrace } from '../../db/trace-entities.ts';
import { likeOperator } from '../../db/orm.ts';
import { route, type RouteDef } from '../../route-def.ts';
import { deviceMap, text } from './lookup.ts';
import { presentTrace } from './present.ts';

const sortKeys = ['createdAt', 'title', 'sizeBytes', 'errors'] as const;
const listQuery = z.object({
  q: text(200).optional(),
  deviceId: z.coerce.number().int().positive().optional(),
  severity: z.enum(['error', 'warning', 'info', 'clean']).optional(),
  uploaderId: z.coerce.number().int().positive().optional(),
  sort: z.enum([...sortKeys, ...sortKeys.map((k) => `-${k}` as const)]).default('-createdAt'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});

const sortColumn: Record<(typeof sortKeys)[number], keyof ITrace> = { createdAt: 'createdAt', title: 'title', sizeBytes: 'sizeBytes', errors: 'errorCount' };

export const listRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/traces',
    access: 'signed-in',
    query: listQuery,
    async handler({ em, query }) {
      const where: Record<string, unknown>[] = [];
      if (query.q) {
        const like = `%${query.q}%`;
        const op = likeOperator(em);
        where.push({
          $or: [{ title: { [op]: like } }, { fileName: { [op]: like } }, { customerRef: { [op]: like } }, { notes: { [op]: like } }, { summary: { [op]: like } }, { rules: { [op]: like } }],
        });
      }
      if (query.deviceId) where.push({ deviceId: query.deviceId });
      if (query.uploaderId) where.push({ uploaderId: query.uploaderId });
      if (query.severity === 'error') where.push({ errorCount: { $gt: 0 } });
      if (query.severity === 'warning') where.push({ warningCount: { $gt: 0 } });
      if (query.severity === 'info') where.push({ infoCount: { $gt: 0 } });
      if (query.severity === 'clean') where.push({ status: 'done', errorCount: 0, warningCount: 0 });
      const descending = query.sort.startsWith('-');
      const column = sortColumn[query.sort.replace(/^-/, '') as (typeof sortKeys)[number]];
      const direction = descending ? 'desc' : 'asc';
      // Titles sort the way people read them, not by code point (SQLite's default).
      const order = column === 'title' ? { [raw('lower(title)')]: direction } : { [column]: direction };
      const [traces, total] = await em.findAndCount(Trace, where.length > 0 ? { $and: where } : {}, {
        orderBy: [order, { id: direction }],
        limit: query.pageSize,
        offset: (query.page - 1) * query.pageSize,
      });
      const devices = await deviceMap(em);
      const uploaders = await em.getConnection().execute<{ id: number; name: string }[]>('select uploader_id as id, max(uploader_name) as name from trace group by uploader_id order by name');
      return {
        items: traces.map((t) => presentTrace(t, devices)),
        total,
        page: query.page,
        pageSize: query.pageSize,
        uploaders: uploaders.map((u) => ({ id: Number(u.id), name: String(u.name) })),
      };
    },
  }),
];
