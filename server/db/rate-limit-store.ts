/**
 * An express-rate-limit store in the database, for several server instances on one PostgreSQL:
 * each limit's counters live in `rate_limit_counter`, so ten failed sign-ins count as ten whichever
 * instances they reached. One upsert per counted request; a counter whose window has ended starts
 * again at 1 in the same statement, so two instances never reset it twice. Windows end by each
 * instance's own clock (keep the machines on NTP, as every deployment does).
 */
import { createHash } from 'node:crypto';
import type { ClientRateLimitInfo, IncrementResponse, Options, Store } from 'express-rate-limit';
import type { Clock } from '../context.ts';
import type { Orm } from './orm.ts';

/** How often an instance deletes counters whose window ended long ago. */
const SWEEP_EVERY_MS = 10 * 60_000;

export interface SqlRateLimitStoreOptions {
  orm: Orm;
  /** The limit's name, kept apart from other limits' counters (`login:address`). */
  name: string;
  clock?: Clock;
}

interface CounterRow {
  hits: number | string;
  reset_at_ms: number | string;
}

export function createSqlRateLimitStore(options: SqlRateLimitStoreOptions): Store {
  const { orm, name } = options;
  const nowMs = () => (options.clock ?? { now: () => new Date() }).now().getTime();
  let windowMs = 60_000;
  let lastSweepMs = 0;
  const keyOf = (key: string) => createHash('sha256').update(`${name}\u0000${key}`).digest('hex');
  const execute = async (sql: string, params: unknown[]) => (await orm.em.getConnection().execute(sql, params)) as CounterRow[];
  const info = (row: CounterRow): ClientRateLimitInfo => ({ totalHits: Number(row.hits), resetTime: new Date(Number(row.reset_at_ms)) });

  const sweep = async (now: number) => {
    if (now - lastSweepMs < SWEEP_EVERY_MS) return;
    lastSweepMs = now;
    await execute('delete from rate_limit_counter where reset_at_ms < ?', [now - windowMs]);
  };

  return {
    // The counters are shared: express-rate-limit must not assume they are this process's alone.
    localKeys: false,
    prefix: name,
    init(limitOptions: Options) {
      windowMs = limitOptions.windowMs;
    },
    async get(key) {
      const now = nowMs();
      const rows = await execute('select hits, reset_at_ms from rate_limit_counter where key = ? and reset_at_ms > ?', [keyOf(key), now]);
      return rows[0] ? info(rows[0]) : undefined;
    },
    async increment(key): Promise<IncrementResponse> {
      const now = nowMs();
      const rows = await execute(
        `insert into rate_limit_counter (key, hits, reset_at_ms) values (?, 1, ?)
         on conflict (key) do update set
           hits = case when rate_limit_counter.reset_at_ms <= ? then 1 else rate_limit_counter.hits + 1 end,
           reset_at_ms = case when rate_limit_counter.reset_at_ms <= ? then excluded.reset_at_ms else rate_limit_counter.reset_at_ms end
         returning hits, reset_at_ms`,
        [keyOf(key), now + windowMs, now, now],
      );
      void sweep(now).catch(() => undefined);
      return info(rows[0]!);
    },
    async decrement(key) {
      await execute('update rate_limit_counter set hits = hits - 1 where key = ? and hits > 0 and reset_at_ms > ?', [keyOf(key), nowMs()]);
    },
    async resetKey(key) {
      await execute('delete from rate_limit_counter where key = ?', [keyOf(key)]);
    },
  };
}
