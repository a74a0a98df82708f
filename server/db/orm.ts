import { MikroORM } from '@mikro-orm/better-sqlite';
import { MikroORM as PgMikroORM } from '@mikro-orm/postgresql';
import { Migrator } from '@mikro-orm/migrations';
import pg from 'pg';
import { entities } from './entities.ts';
import { migrationsList } from './migrations/index.ts';
import { postgresMigrationsList } from './migrations-postgres/index.ts';
import { badRequest } from '../errors.ts';
import { closeReads, openReads } from './reads.ts';

/**
 * The ORM of either dialect. Both drivers share MikroORM's SQL entity manager, so the rest of the
 * server is written once against the SQLite driver's types (the API it uses is the same).
 */
export type Orm = MikroORM;
export type Dialect = 'sqlite' | 'postgres';

/** The database a server uses: a `postgres://` URL selects PostgreSQL, anything else the SQLite file. */
export type DatabaseTarget = { dbName: string; databaseUrl?: undefined } | { databaseUrl: string; dbName?: undefined };

export function isPostgresUrl(url: string | undefined): url is string {
  return url !== undefined && /^postgres(ql)?:\/\//.test(url);
}

export function dialectOf(orm: Orm): Dialect {
  return (orm.config.get('clientUrl') ?? '').startsWith('postgres') ? 'postgres' : 'sqlite';
}

/**
 * MikroORM inlines the parameters into the SQL text, and SQLite ends a statement at a NUL byte
 * (PostgreSQL refuses NUL in text), so a value holding U+0000 would break the statement (a 500).
 * Validation refuses NUL in request fields; this catches text that arrives inside files.
 */
function refuseNul(sql: string, params: readonly unknown[]): string {
  if (params.some((p) => typeof p === 'string' && p.includes('\u0000'))) {
    throw badRequest('body: text must not contain NUL characters (\\u0000)', 'input.invalid');
  }
  return sql;
}

const common = {
  entities,
  extensions: [Migrator],
  allowGlobalContext: false,
  discovery: { warnWhenNoEntities: false },
  onQuery: refuseNul,
};

/** Any number for the advisory lock, the same in every instance: "Parley migrations". */
const MIGRATION_LOCK_KEY = 0x5041_524c;

/**
 * Opens the database and brings its schema up to date by running the committed migrations of its
 * dialect (`migrations/` for SQLite, `migrations-postgres/` for PostgreSQL). On PostgreSQL the
 * migrations run under an advisory lock, so instances that start together migrate once.
 * `snapshot: false` keeps the migrator from writing into the source tree.
 */
export async function openOrm(options: DatabaseTarget & { debug?: boolean; migrate?: boolean }): Promise<Orm> {
  if (options.databaseUrl !== undefined) {
    if (!isPostgresUrl(options.databaseUrl)) throw new Error('DATABASE_URL: only postgres:// URLs are supported (leave it unset for SQLite)');
    const orm = await PgMikroORM.init({
      ...common,
      clientUrl: options.databaseUrl,
      migrations: { migrationsList: postgresMigrationsList, snapshot: false, silent: true, transactional: true, allOrNothing: true },
      debug: options.debug ?? false,
      pool: { min: 0, max: 10 },
    });
    if (options.migrate !== false) await withAdvisoryLock(options.databaseUrl, MIGRATION_LOCK_KEY, () => orm.getMigrator().up());
    return orm as unknown as Orm;
  }
  const orm = await MikroORM.init({
    ...common,
    dbName: options.dbName,
    migrations: { migrationsList, snapshot: false, silent: true, transactional: true, allOrNothing: true },
    debug: options.debug ?? false,
    // The full-text index and its shadow tables, and the library's version number, are kept by
    // hand-written migrations and triggers, not entities.
    schemaGenerator: { skipTables: [/^team_vector_search/, 'library_version'] },
  });
  if (options.dbName !== ':memory:') {
    // Write-ahead log, synced at checkpoints: a commit no longer waits for the disk on the request
    // thread (a run of the whole library commits a hundred batches). A crash can lose the last
    // commits, never corrupt the file; back up with the server stopped or through SQLite's backup API.
    await orm.em.getConnection().execute('pragma journal_mode = WAL');
    await orm.em.getConnection().execute('pragma synchronous = NORMAL');
  }
  if (options.migrate !== false) await orm.getMigrator().up();
  // The hot read paths' own read-only connection (server/db/reads.ts), closed with the ORM.
  openReads(orm.em);
  const close = orm.close.bind(orm);
  orm.close = (force?: boolean) => {
    closeReads(orm.em);
    return close(force);
  };
  return orm;
}

/** Runs `work` while holding a PostgreSQL session advisory lock on its own connection. */
export async function withAdvisoryLock<T>(databaseUrl: string, key: number, work: () => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    await client.query('select pg_advisory_lock($1)', [key]);
    try {
      return await work();
    } finally {
      await client.query('select pg_advisory_unlock($1)', [key]);
    }
  } finally {
    await client.end();
  }
}

/**
 * The operator for a case-insensitive substring search: SQLite's LIKE already ignores ASCII case
 * and has no ILIKE; PostgreSQL's LIKE is case-sensitive.
 */
export function likeOperator(em: { getPlatform(): object }): '$like' | '$ilike' {
  return em.getPlatform().constructor.name === 'PostgreSqlPlatform' ? '$ilike' : '$like';
}
