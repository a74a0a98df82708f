/**
 * Plain SQL for the hot read paths (session check, lists, trace views), with bound parameters and
 * `?` placeholders in both dialects. On a SQLite file the reads go through a read-only connection of
 * their own with each statement prepared once: the write-ahead log gives it the last commit, so it
 * never waits behind a writer's transaction (an import's batches) and never sees one half done, and
 * no request pays for MikroORM's query building and a fresh `prepare`. On PostgreSQL and on
 * `:memory:` (tests) they go through the entity manager's connection, with the same answers.
 */

type Row = Record<string, unknown>;

/** The part of better-sqlite3 used here (the driver MikroORM's SQLite connection already loaded). */
interface Statement {
  all(...params: unknown[]): unknown[];
  get(...params: unknown[]): unknown;
}
interface Connection {
  prepare(sql: string): Statement;
  close(): void;
}
type ConnectionClass = new (file: string, options: { readonly: boolean; fileMustExist: boolean }) => Connection;

export interface SqlReads {
  all<T = Row>(sql: string, params?: readonly unknown[]): Promise<T[]>;
  get<T = Row>(sql: string, params?: readonly unknown[]): Promise<T | undefined>;
}

/** What of an entity manager (or ORM) the reads need: its configuration and its connection. */
export interface ReadSource {
  config: { get(key: 'dbName'): unknown; get(key: 'clientUrl'): unknown };
  getConnection(): { execute(sql: string, params?: readonly unknown[], method?: 'all' | 'get' | 'run'): Promise<unknown>; getKnex?(): unknown };
}

interface FileReads {
  db: Connection;
  statements: Map<string, Statement>;
}

/** One read-only connection per SQLite file this process has open (several ORMs on one file share it). */
const files = new Map<string, FileReads & { users: number }>();

/** The SQLite file of an ORM when it has one (not PostgreSQL, not `:memory:`). */
function sqliteFileOf(source: ReadSource): string | undefined {
  const clientUrl = source.config.get('clientUrl');
  if (typeof clientUrl === 'string' && clientUrl.startsWith('postgres')) return undefined;
  const dbName = source.config.get('dbName');
  return typeof dbName === 'string' && dbName !== '' && dbName !== ':memory:' ? dbName : undefined;
}

/** Opens the read connection of the ORM's file (openOrm calls it once the schema is up to date). */
export function openReads(source: ReadSource): void {
  const file = sqliteFileOf(source);
  if (file === undefined) return;
  const open = files.get(file);
  if (open) {
    open.users++;
    return;
  }
  const knex = source.getConnection().getKnex?.() as { client?: { driver?: ConnectionClass } } | undefined;
  const Driver = knex?.client?.driver;
  if (!Driver) return;
  const db = new Driver(file, { readonly: true, fileMustExist: true });
  files.set(file, { db, statements: new Map(), users: 1 });
}

/** Closes it again when the last ORM on the file closes. */
export function closeReads(source: ReadSource): void {
  const file = sqliteFileOf(source);
  const open = file === undefined ? undefined : files.get(file);
  if (!open || file === undefined) return;
  if (--open.users > 0) return;
  files.delete(file);
  open.db.close();
}

function statementOf(reads: FileReads, sql: string): Statement {
  let statement = reads.statements.get(sql);
  if (!statement) {
    statement = reads.db.prepare(sql);
    reads.statements.set(sql, statement);
  }
  return statement;
}

export function sqlReads(source: ReadSource): SqlReads {
  const file = sqliteFileOf(source);
  const reads = file === undefined ? undefined : files.get(file);
  if (reads) {
    return {
      all: async <T>(sql: string, params: readonly unknown[] = []) => statementOf(reads, sql).all(...params) as T[],
      get: async <T>(sql: string, params: readonly unknown[] = []) => statementOf(reads, sql).get(...params) as T | undefined,
    };
  }
  const connection = source.getConnection();
  return {
    all: async <T>(sql: string, params: readonly unknown[] = []) => (await connection.execute(sql, params, 'all')) as T[],
    get: async <T>(sql: string, params: readonly unknown[] = []) => ((await connection.execute(sql, params, 'all')) as T[])[0],
  };
}

/** A datetime column as read: SQLite keeps milliseconds; PostgreSQL's timestamptz arrives as text with its offset (MikroORM's type parser) or a Date. */
export function dateOf(value: unknown): Date {
  if (value instanceof Date) return value;
  return typeof value === 'string' && !/^\d+$/.test(value) ? new Date(value) : new Date(Number(value));
}

/** A nullable datetime column as read. */
export function dateOrNull(value: unknown): Date | null {
  return value === null || value === undefined ? null : dateOf(value);
}

/** A boolean column as read: SQLite keeps 0 and 1. */
export function booleanOf(value: unknown): boolean {
  return value === true || value === 1 || value === '1' || value === 't';
}
