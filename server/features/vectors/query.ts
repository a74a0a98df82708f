/**
 * The library's filter (search words, tag, kind, device) as SQL, shared by the list, the zip export
 * and "Run filtered". Search words go through the full-text index (SQLite FTS5 `team_vector_search`,
 * kept in step with `team_vector` by triggers; migration TeamVectorSearch): each word matches a
 * token that starts with it, in the id, title, tags or file text; on PostgreSQL the same question
 * goes to a generated tsvector column with a GIN index (`tsQuery`). Everything else is an indexed
 * column, in SQL both dialects read alike.
 */
import { z } from 'zod';
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { VECTOR_KINDS } from '../../../shared/vectors/index.ts';
import { likeOperator } from '../../db/orm.ts';

const text = (max: number) => z.string().trim().max(max, `must be at most ${max} characters`);

export const vectorFilterFields = {
  q: text(200).optional(),
  tag: text(80).optional(),
  kind: z.enum(VECTOR_KINDS as [string, ...string[]]).optional(),
  deviceId: z.coerce.number().int().positive('must be a device id').optional(),
};

export const vectorFilterSchema = z.object(vectorFilterFields).strict();
export type VectorFilter = z.infer<typeof vectorFilterSchema>;

/** Words of a search, at most eight; each as an FTS5 string (quotes doubled) matching tokens that start with it. */
export function ftsQuery(q: string): string | null {
  const words = q
    .split(/\s+/)
    .map((w) => w.replace(/[\u0000-\u001f]/g, ''))
    .filter((w) => /[\p{L}\p{N}]/u.test(w))
    .slice(0, 8);
  return words.length === 0 ? null : words.map((w) => `"${w.replace(/"/g, '""')}"*`).join(' AND ');
}

/**
 * The same words for PostgreSQL's full-text search (migration TeamVectorSearch there): each word
 * cut into its letters-and-digits runs as unicode61 cuts it, the runs of one word in sequence
 * (`<->`, as FTS5 reads a quoted word as a phrase), the last a prefix (`:*`), words joined by `&`.
 */
export function tsQuery(q: string): string | null {
  const words = q
    .split(/\s+/)
    .map((w) => w.split(/[^\p{L}\p{N}]+/u).filter((part) => part !== ''))
    .filter((parts) => parts.length > 0)
    .slice(0, 8);
  return words.length === 0 ? null : words.map((parts) => `(${parts.map((part, i) => (i === parts.length - 1 ? `${part}:*` : part)).join(' <-> ')})`).join(' & ');
}

type Dialect = 'sqlite' | 'postgresql';

/** Which SQL the filter is written in (server/db/orm.ts opens either). */
export function dialectOf(em: EntityManager): Dialect {
  return likeOperator(em) === '$ilike' ? 'postgresql' : 'sqlite';
}

/** `where` text (with `v` as the team_vector alias) and its parameters; `?` placeholders in both dialects. */
export function vectorWhereSql(filter: VectorFilter, dialect: Dialect): { sql: string; params: unknown[] } {
  const parts: string[] = [];
  const params: unknown[] = [];
  const query = filter.q ? (dialect === 'postgresql' ? tsQuery(filter.q) : ftsQuery(filter.q)) : null;
  if (filter.q && query === null) parts.push('1 = 0');
  if (query !== null) {
    // The dialect-specific part: rows whose search document matches.
    parts.push(dialect === 'postgresql' ? "v.search @@ to_tsquery('simple', ?)" : 'v.id in (select rowid from team_vector_search where team_vector_search match ?)');
    params.push(query);
  }
  if (filter.tag) {
    // The column holds the tags between spaces: an exact tag, not a part of one (any case, as SQLite's LIKE).
    parts.push(`v.tags ${dialect === 'postgresql' ? 'ilike' : 'like'} ? escape '\\'`);
    params.push(`% ${filter.tag.replace(/[\\%_]/g, (c) => `\\${c}`)} %`);
  }
  if (filter.kind) {
    parts.push('v.kind = ?');
    params.push(filter.kind);
  }
  if (filter.deviceId) {
    parts.push('v.device_id = ?');
    params.push(filter.deviceId);
  }
  return { sql: parts.length > 0 ? `where ${parts.join(' and ')}` : '', params };
}

/** Vector ids matching the filter, in id order. */
export async function matchingVectorIds(em: EntityManager, filter: VectorFilter): Promise<string[]> {
  const where = vectorWhereSql(filter, dialectOf(em));
  const rows = await em.getConnection().execute<{ vector_id: string }[]>(`select v.vector_id from team_vector v ${where.sql} order by v.vector_id`, where.params);
  return rows.map((r) => r.vector_id);
}

/** The filter in words, for a run's "what was run". */
export function describeFilter(filter: VectorFilter): string {
  const parts: string[] = [];
  if (filter.q) parts.push(`"${filter.q}"`);
  if (filter.kind) parts.push(`kind ${filter.kind}`);
  if (filter.tag) parts.push(`tag ${filter.tag}`);
  if (filter.deviceId) parts.push(`device #${filter.deviceId}`);
  return parts.length > 0 ? parts.join(', ') : 'everything';
}
