import { describe, expect, it } from 'vitest';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openOrm } from './orm.ts';
import { seedDemo } from './seed.ts';
import { User } from './entities.ts';
import { migrationsList } from './migrations/index.ts';

describe('openOrm', () => {
  it('migrates a fresh file database, matches the entities, and reopens without re-running', async () => {
    const dbName = join(mkdtempSync(join(tmpdir(), 'parley-db-')), 'parley.sqlite');
    const orm = await openOrm({ dbName });
    expect((await orm.getMigrator().getExecutedMigrations()).map((m) => m.name)).toEqual(migrationsList.map((m) => m.name));
    // The committed migrations and the entities agree: nothing left to change.
    expect((await orm.getSchemaGenerator().getUpdateSchemaSQL({ wrap: false })).trim()).toBe('');
    expect(await seedDemo(orm.em.fork(), { now: () => new Date() })).toBe(true);
    await orm.close();

    const reopened = await openOrm({ dbName });
    expect(await reopened.getMigrator().getPendingMigrations()).toEqual([]);
    expect(await reopened.em.fork().count(User)).toBe(5);
    expect(await seedDemo(reopened.em.fork(), { now: () => new Date() })).toBe(false);
    await reopened.close();
  });
});
