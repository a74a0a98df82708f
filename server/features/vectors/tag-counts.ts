/**
 * Every tag in the library with its count, for the list's filter menu. Counting reads every row's
 * tags, so the answer is kept for a few seconds and forgotten at once when this process writes the
 * library; one count runs at a time however many lists ask.
 */
import type { EntityManager } from '@mikro-orm/better-sqlite';

/** Another instance's write shows within this long (common practice for a filter menu). */
const FRESH_MS = 5_000;

let cached: { atMs: number; version: number; counts: Promise<{ tag: string; count: number }[]> } | undefined;
let version = 0;

/** Call after any write to the library. */
export function libraryChanged(): void {
  version++;
}

export function libraryTagCounts(em: EntityManager, nowMs = Date.now()): Promise<{ tag: string; count: number }[]> {
  if (cached && cached.version === version && nowMs - cached.atMs < FRESH_MS) return cached.counts;
  const counts = count(em);
  cached = { atMs: nowMs, version, counts };
  counts.catch(() => {
    if (cached?.counts === counts) cached = undefined;
  });
  return counts;
}

async function count(em: EntityManager): Promise<{ tag: string; count: number }[]> {
  const rows = await em.getConnection().execute<{ tags: string }[]>("select tags from team_vector where tags <> ''");
  const counts = new Map<string, number>();
  for (const { tags } of rows) for (const tag of tags.split(' ')) if (tag !== '') counts.set(tag, (counts.get(tag) ?? 0) + 1);
  return [...counts].map(([tag, n]) => ({ tag, count: n })).sort((a, b) => (a.tag < b.tag ? -1 : 1));
}
