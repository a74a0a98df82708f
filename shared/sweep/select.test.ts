import { describe, expect, it } from 'vitest';
import { parseShard, sampleWithSeed, shardOf } from './select.ts';

describe('sampleWithSeed and shardOf', () => {
  const items = Array.from({ length: 103 }, (_, i) => i);

  it('keeps max items, the same for the same seed, in their original order', () => {
    const a = sampleWithSeed(items, 20, 7);
    expect(a).toHaveLength(20);
    expect(a).toEqual(sampleWithSeed(items, 20, 7));
    expect(a).not.toEqual(sampleWithSeed(items, 20, 8));
    expect([...a].sort((x, y) => x - y)).toEqual(a);
    expect(new Set(a).size).toBe(20);
    expect(sampleWithSeed(items, 500, 1)).toEqual(items);
  });

  it('splits a campaign into shards that cover every item exactly once', () => {
    for (const count of [1, 2, 3, 7]) {
      const covered = Array.from({ length: count }, (_, i) => shardOf(items, { index: i + 1, count })).flat();
      expect(covered.sort((x, y) => x - y)).toEqual(items);
    }
  });

  it('parses i/n and refuses the rest', () => {
    expect(parseShard('2/3')).toEqual({ ok: true, shard: { index: 2, count: 3 } });
    for (const bad of ['0/2', '3/2', '1/0', 'a/b', '1', '1/2/3', '-1/2']) expect(parseShard(bad)).toMatchObject({ ok: false, error: { code: 'sweep.shard' } });
  });
});
