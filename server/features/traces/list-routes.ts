/** The trace list: filter, search, sort and page in plain SQL; listed rows never carry an analysis. */
import { z } from 'zod';
import { likeOperator } from '../../db/orm.ts';
import { sqlReads } from '../../db/reads.ts';
import { answerVersion } from '../../db/answer-version.ts';
import { route, type RouteDef } from '../../route-def.ts';
import { deviceMap, text, traceColumns, traceOfRow } from './lookup.ts';
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

// Titles sort the way people read them, not by code point (SQLite's default).
const sortSql: Record<(typeof sortKeys)[number], string> = { createdAt: 'created_at', title: 'lower(title)', sizeBytes: 'size_bytes', errors: 'error_count' };

const severitySql = { error: 'error_count > 0', warning: 'warning_count > 0', info: 'info_count > 0', clean: "status = 'done' and error_count = 0 and warning_count = 0" } as const;

export const listRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/traces',
    access: 'signed-in',
    query: listQuery,
    // Trace rows and device names raise the answer version.
    keep: async ({ em, query }) => `${await answerVersion(em)} ${JSON.stringify(query)}`,
    async handler({ em, query }) {
      const where: string[] = [];
      const params: unknown[] = [];
      if (query.q) {
        // A part of the title, file name, customer reference, notes, summary or a rule id, in any case.
        const like = likeOperator(em) === '$ilike' ? 'ilike' : 'like';
        where.push(`(${['title', 'file_name', 'customer_ref', 'notes', 'summary', 'rules'].map((c) => `${c} ${like} ?`).join(' or ')})`);
        params.push(...Array.from({ length: 6 }, () => `%${query.q}%`));
      }
      if (query.deviceId) {
        where.push('device_id = ?');
        params.push(query.deviceId);
      }
      if (query.uploaderId) {
        where.push('uploader_id = ?');
        params.push(query.uploaderId);
      }
      if (query.severity) where.push(severitySql[query.severity]);
      const whereSql = where.length > 0 ? `where ${where.join(' and ')}` : '';
      const direction = query.sort.startsWith('-') ? 'desc' : 'asc';
      const column = sortSql[query.sort.replace(/^-/, '') as (typeof sortKeys)[number]];
      const reads = sqlReads(em);
      const counted = await reads.get<{ total: unknown }>(`select count(*) as total from trace ${whereSql}`, params);
      const rows = await reads.all<Record<string, unknown>>(`select ${traceColumns} from trace ${whereSql} order by ${column} ${direction}, id ${direction} limit ? offset ?`, [
        ...params,
        query.pageSize,
        (query.page - 1) * query.pageSize,
      ]);
      const devices = await deviceMap(em);
      const uploaders = await reads.all<{ id: unknown; name: unknown }>('select uploader_id as id, max(uploader_name) as name from trace group by uploader_id order by name');
      return {
        items: rows.map((r) => presentTrace(traceOfRow(r), devices)),
        total: Number(counted?.total ?? 0),
        page: query.page,
        pageSize: query.pageSize,
        uploaders: uploaders.map((u) => ({ id: Number(u.id), name: String(u.name) })),
      };
    },
  }),
];
