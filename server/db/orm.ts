import { MikroORM } from '@mikro-orm/better-sqlite';
import { Migrator } from '@mikro-orm/migrations';
import { entities } from './entities.ts';
import { migrationsList } from './migrations/index.ts';

export type Orm = MikroORM;

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
  });
  await orm.getMigrator().up();
  return orm;
}
