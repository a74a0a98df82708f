import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Options } from 'express-rate-limit';
import { openOrm, type Orm } from './orm.ts';
import { createSqlRateLimitStore } from './rate-limit-store.ts';

let nowMs = Date.parse('2026-03-02T09:00:00Z');
const clock = { now: () => new Date(nowMs) };
const WINDOW_MS = 15 * 60_000;
let orm: Orm;

beforeAll(async () => {
  orm = await openOrm({ dbName: ':memory:' });
});
afterAll(async () => orm.close());

function storeNamed(name: string) {
  const store = createSqlRateLimitStore({ orm, name, clock });
  store.init?.({ windowMs: WINDOW_MS } as Options);
  return store;
}

describe('rate limits in the database', () => {
  it('two stores of one limit (two instances) count the same client together', async () => {
    const first = storeNamed('login:address');
    const second = storeNamed('login:address');
    expect((await first.increment('198.51.100.7')).totalHits).toBe(1);
    expect((await second.increment('198.51.100.7')).totalHits).toBe(2);
    const third = await first.increment('198.51.100.7');
    expect(third.totalHits).toBe(3);
    expect(third.resetTime?.getTime()).toBe(nowMs + WINDOW_MS);
    expect((await second.get!('198.51.100.7'))?.totalHits).toBe(3);
    expect((await second.increment('203.0.113.9')).totalHits).toBe(1);
  });

  it('keeps limits apart and stores no address in the clear', async () => {
    const other = storeNamed('forgot:address');
    expect((await other.increment('198.51.100.7')).totalHits).toBe(1);
    const keys = await orm.em.getConnection().execute<{ key: string }[]>('select key from rate_limit_counter');
    expect(keys.every((k) => /^[0-9a-f]{64}$/.test(k.key))).toBe(true);
  });

  it('a new window starts at 1; decrement and reset work on the shared counter', async () => {
    const store = storeNamed('share:user');
    await store.increment('user:4');
    await store.increment('user:4');
    await store.decrement('user:4');
    expect((await store.get!('user:4'))?.totalHits).toBe(1);
    nowMs += WINDOW_MS;
    expect(await store.get!('user:4')).toBeUndefined();
    const fresh = await store.increment('user:4');
    expect(fresh.totalHits).toBe(1);
    expect(fresh.resetTime?.getTime()).toBe(nowMs + WINDOW_MS);
    await store.resetKey('user:4');
    expect(await store.get!('user:4')).toBeUndefined();
  });
});
