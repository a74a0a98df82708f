/**
 * Answers computed from the library table alone (the ids a search matches, in order; a filter's
 * total; the tag counts) kept in memory while the library's version stands: a number that triggers
 * raise on every insert, update and delete of `team_vector` (migration LibraryVersion). Every list
 * request reads the version (one row by its key), so a change made through any instance is seen by
 * the next request on every instance. Kept per database (per ORM), so two servers in one process
 * never share answers; what a caller may see is decided before (every library route checks the role).
 */
import type { EntityManager } from '@mikro-orm/better-sqlite';
import { sqlReads } from '../../db/reads.ts';
import { answerVersion } from '../../db/answer-version.ts';

/** Answers kept per version (searches and filters asked meanwhile; each at most a few tens of kB). */
const KEPT = 64;

interface Answers {
  version: number;
  byKey: Map<string, Promise<unknown>>;
}

const perDatabase = new WeakMap<object, Answers>();

/** The library's version now (raised by every change of the tables the library's answers read). */
export const libraryVersion = answerVersion;

/** The answer for `key` at `version`: kept, or computed once however many requests ask at the same time. */
export function libraryAnswer<T>(em: EntityManager, version: number, key: string, compute: () => Promise<T>): Promise<T> {
  let answers = perDatabase.get(em.config);
  if (!answers || answers.version < version) {
    answers = { version, byKey: new Map() };
    perDatabase.set(em.config, answers);
  }
  // A request that read an older version than the kept one computes its own answer and keeps nothing.
  if (answers.version !== version) return compute();
  const kept = answers.byKey.get(key);
  if (kept) return kept as Promise<T>;
  const answer = compute();
  const byKey = answers.byKey;
  byKey.set(key, answer);
  answer.catch(() => {
    if (byKey.get(key) === answer) byKey.delete(key);
  });
  if (byKey.size > KEPT) byKey.delete(byKey.keys().next().value as string);
  return answer;
}

/** Every tag in the library with its count, for the list's filter menu (read from the tags index on SQLite). */
export function libraryTagCounts(em: EntityManager, version: number): Promise<{ tag: string; count: number }[]> {
  return libraryAnswer(em, version, 'tags', async () => {
    const rows = await sqlReads(em).all<{ tags: string; n: unknown }>("select tags, count(*) as n from team_vector where tags <> '' group by tags");
    const counts = new Map<string, number>();
    for (const { tags, n } of rows) for (const tag of tags.split(' ')) if (tag !== '') counts.set(tag, (counts.get(tag) ?? 0) + Number(n));
    return [...counts].map(([tag, count]) => ({ tag, count })).sort((a, b) => (a.tag < b.tag ? -1 : 1));
  });
}
