import { describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openOrm } from './orm.ts';
import { booleanOf, dateOf, sqlReads } from './reads.ts';

describe('sqlReads', () => {
  it('on a SQLite file reads the last commit through its own connection: never a transaction still open', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'parley-reads-'));
    const orm = await openOrm({ dbName: join(folder, 'parley.sqlite') });
    try {
      const insert = "insert into organisation (name, created_at) values ('Kestrel Devices', 1796422740896)";
      const count = 'select count(*) as n from organisation';
      const reads = sqlReads(orm.em);
      expect(await reads.get<{ n: number }>(count)).toEqual({ n: 0 });

      let seenInside: unknown;
      await orm.em.fork().transactional(async (em) => {
        const inTransaction = em.getTransactionContext();
        await em.getConnection().execute(insert, [], 'run', inTransaction);
        // The writer sees its own row; the read connection does not until the commit.
        expect(await em.getConnection().execute(count, [], 'all', inTransaction)).toEqual([{ n: 1 }]);
        seenInside = await reads.get<{ n: number }>(count);
      });
      expect(seenInside).toEqual({ n: 0 });
      expect(await reads.get<{ n: number }>(count)).toEqual({ n: 1 });

      const rows = await reads.all<{ name: string; created_at: unknown }>('select name, created_at from organisation where name = ?', ['Kestrel Devices']);
      expect(rows.map((r) => [r.name, dateOf(r.created_at).toISOString()])).toEqual([['Kestrel Devices', '2026-12-04T22:19:00.896Z']]);
    } finally {
      await orm.close();
      rmSync(folder, { recursive: true, force: true });
    }
  });

  it('on :memory: reads through the entity manager with the same answers', async () => {
    const orm = await openOrm({ dbName: ':memory:' });
    try {
      await orm.em.getConnection().execute("insert into organisation (name, created_at) values ('Kestrel Devices', 0)");
      expect(await sqlReads(orm.em).all('select id, name from organisation where id = ?', [1])).toEqual([{ id: 1, name: 'Kestrel Devices' }]);
      expect(await sqlReads(orm.em).get('select id from organisation where id = ?', [2])).toBeUndefined();
    } finally {
      await orm.close();
    }
  });

  it('reads the columns of either dialect alike', () => {
    expect([booleanOf(1), booleanOf(0), booleanOf(true), booleanOf(false), booleanOf(null)]).toEqual([true, false, true, false, false]);
    expect(dateOf(0).toISOString()).toBe('1970-01-01T00:00:00.000Z');
    expect(dateOf(new Date(5)).getTime()).toBe(5);
    expect(dateOf('2026-12-04 22:19:00.896+00').toISOString()).toBe('2026-12-04T22:19:00.896Z');
    expect(dateOf('1796422740896').toISOString()).toBe('2026-12-04T22:19:00.896Z');
  });
});
