import { MikroORM } from '@mikro-orm/better-sqlite';
import { Migrator } from '@mikro-orm/migrations';
import { entities } from './entities.ts';
import { migrationsList } from './migrations/index.ts';
import { badRequest } from '../errors.ts';

export type Orm = MikroORM;

/**
 * MikroORM inlines the parameters into the SQL text, and SQLite ends a statement at a NUL byte, so a
 * value holding U+0000 would break the statement (a 500). Validation refuses NUL in request fields;
 * this catches text that arrives inside files (reports, zips) on its way to any query.
 */
function refuseNul(sql: string, params: readonly unknown[]): string {
  if (params.some((p) => typeof p === 'string' && p.includes('\u0000'))) {
    throw badRequest('body: text must not contain NUL characters (\\u0000)', 'input.invalid');
  }
  return sql;
}

/**
 * Opens the SQLite database (a file path or `:memory:`) and brings its schema up to date by running
 * the committed migrations. `snapshot: false` keeps the migrator from writing into the source tree.
 */
export async function openOrm(options: { dbName: string; debug?: boolean }): Promise<Orm> {
  const orm = await MikroORM.init({
    dbName: options.dbName,
    entities,
    extensions: [Migrator],
    migrations: { migrationsList, snapshot: false, silent: true, transactional: true, allOrNothing: true },
    debug: options.debug ?? false,
    allowGlobalContext: false,
    discovery: { warnWhenNoEntities: false },
    onQuery: refuseNul,
  });
  if (options.dbName !== ':memory:') {
    // Write-ahead log, synced at checkpoints: a commit no longer waits for the disk on the request
    // thread (a run of the whole library commits a hundred batches). A crash can lose the last
    // commits, never corrupt the file; back up with the server stopped or through SQLite's backup API.
    await orm.em.getConnection().execute('pragma journal_mode = WAL');
    await orm.em.getConnection().execute('pragma synchronous = NORMAL');
  }
  await orm.getMigrator().up();
  return orm;
}
