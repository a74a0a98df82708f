/**
 * The library's filter (search words, tag, kind, device) as a MikroORM where clause, shared by
 * the list, the zip export and "Run filtered".
 */
import { z } from 'zod';
import type { FilterQuery } from '@mikro-orm/core';
import type { ITeamVector } from '../../db/library-entities.ts';
import { VECTOR_KINDS } from '../../../shared/vectors/index.ts';

const text = (max: number) => z.string().trim().max(max, `must be at most ${max} characters`);

export const vectorFilterFields = {
  q: text(200).optional(),
  tag: text(80).optional(),
  kind: z.enum(VECTOR_KINDS as [string, ...string[]]).optional(),
  deviceId: z.coerce.number().int().positive('must be a device id').optional(),
};

export const vectorFilterSchema = z.object(vectorFilterFields).strict();
export type VectorFilter = z.infer<typeof vectorFilterSchema>;

/** SQLite's LIKE ignores ASCII case; a `%` or `_` typed in a search widens it, which is harmless. */
function likeText(value: string): string {
  return `%${value}%`;
}

/** `op`: `$like` on SQLite, `$ilike` on PostgreSQL (server/db/orm.ts `likeOperator`). */
export function vectorWhere(filter: VectorFilter, op: '$like' | '$ilike' = '$like'): FilterQuery<ITeamVector> {
  const and: FilterQuery<ITeamVector>[] = [];
  if (filter.q) {
    for (const word of filter.q
      .split(/\s+/)
      .filter((w) => w !== '')
      .slice(0, 8)) {
      const like = likeText(word);
      and.push({ $or: [{ vectorId: { [op]: like } }, { title: { [op]: like } }, { tags: { [op]: like } }, { text: { [op]: like } }] });
    }
  }
  if (filter.tag) and.push({ tags: { [op]: likeText(` ${filter.tag} `) } });
  if (filter.kind) and.push({ kind: filter.kind });
  if (filter.deviceId) and.push({ deviceId: filter.deviceId });
  return and.length > 0 ? { $and: and } : {};
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
