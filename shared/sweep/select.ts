/**
 * Which of a sweep's placements run: `--max N` keeps N of them sampled with the seed (the kept
 * ones stay in generator order), `--shard i/n` keeps every n-th from the (i-1)-th, so the n shards
 * of one campaign cover exactly its runs, each once.
 */
import { createRandom } from '../sim/random.ts';
import { fail, type Result } from '../core/result.ts';

/** Keeps `max` items chosen with the seed (a partial Fisher–Yates), in their original order. */
export function sampleWithSeed<T>(items: readonly T[], max: number | undefined, seed: number): T[] {
  if (max === undefined || max >= items.length) return [...items];
  const random = createRandom(seed);
  const indexes = items.map((_, index) => index);
  for (let i = 0; i < max; i++) {
    const j = random.between(i, indexes.length - 1);
    [indexes[i], indexes[j]] = [indexes[j]!, indexes[i]!];
  }
  return indexes
    .slice(0, max)
    .sort((a, b) => a - b)
    .map((index) => items[index]!);
}

export interface Shard {
  /** 1-based. */
  index: number;
  count: number;
}

/** Parses `i/n` (1 ≤ i ≤ n ≤ 10 000). */
export function parseShard(text: string): Result<{ shard: Shard }> {
  const match = /^(\d{1,5})\/(\d{1,5})$/.exec(text.trim());
  const index = match ? Number(match[1]) : NaN;
  const count = match ? Number(match[2]) : NaN;
  if (!match || index < 1 || count < 1 || index > count || count > 10_000) return fail('sweep.shard', `--shard: expected i/n with 1 ≤ i ≤ n ≤ 10000, got "${text}"`);
  return { ok: true, shard: { index, count } };
}

/** The items of one shard: positions index-1, index-1+count, … */
export function shardOf<T>(items: readonly T[], shard: Shard | undefined): T[] {
  if (!shard) return [...items];
  return items.filter((_, position) => position % shard.count === shard.index - 1);
}
