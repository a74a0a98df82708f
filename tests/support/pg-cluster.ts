/**
 * A throwaway PostgreSQL cluster for tests and benchmarks: `initdb` in a temporary folder, the
 * server on a free loopback port, stopped and deleted afterwards. PostgreSQL refuses to run as
 * root, so under root (CI) the cluster belongs to the `postgres` account that Debian's package
 * creates and every command runs through `runuser -u postgres --`.
 *
 * Without PostgreSQL installed, `findPostgres()` returns undefined and callers skip with the
 * install command, except under CI=true, where a missing PostgreSQL fails the run.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { chmodSync, chownSync, existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir, userInfo } from 'node:os';
import { join } from 'node:path';

export const postgresInstallHint = 'apt-get install postgresql (Debian), then run the tests again';

/** The folder of initdb/pg_ctl of the newest PostgreSQL installed, if any. */
export function findPostgres(): string | undefined {
  const root = '/usr/lib/postgresql';
  if (!existsSync(root)) return undefined;
  const versions = readdirSync(root)
    .filter((v) => existsSync(join(root, v, 'bin', 'pg_ctl')))
    .sort((a, b) => Number(b) - Number(a));
  return versions[0] ? join(root, versions[0], 'bin') : undefined;
}

/** Skip the suite (printing how to install) unless CI=true, where a missing PostgreSQL is a failure. */
export function postgresOrSkip(): { available: boolean; reason?: string } {
  if (findPostgres()) return { available: true };
  if (process.env.CI === 'true') throw new Error(`PostgreSQL is required under CI=true: ${postgresInstallHint}`);
  console.warn(`PostgreSQL tests skipped: PostgreSQL is not installed (${postgresInstallHint})`);
  return { available: false, reason: postgresInstallHint };
}

function freePort(): Promise<number> {
  return new Promise((resolvePort, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as { port: number };
      server.close(() => resolvePort(port));
    });
  });
}

export interface PgCluster {
  /** `postgres://postgres@127.0.0.1:<port>/postgres` */
  url: string;
  port: number;
  /** A fresh empty database on the cluster; returns its URL. */
  createDatabase(name: string): string;
  stop(): void;
}

export async function startPgCluster(): Promise<PgCluster> {
  const bin = findPostgres();
  if (!bin) throw new Error(`PostgreSQL is not installed: ${postgresInstallHint}`);
  const asRoot = userInfo().uid === 0;
  const run = (command: string, args: string[]) => {
    const [file, argv] = asRoot ? ['runuser', ['-u', 'postgres', '--', join(bin, command), ...args]] : [join(bin, command), args];
    const result = spawnSync(file, argv, { encoding: 'utf8' });
    if (result.status !== 0) throw new Error(`${command} failed (${result.status}): ${result.stderr || result.stdout}`);
    return result.stdout;
  };
  const folder = mkdtempSync(join(tmpdir(), 'parley-pg-'));
  chmodSync(folder, 0o700);
  if (asRoot) {
    const uid = Number(execFileSync('id', ['-u', 'postgres'], { encoding: 'utf8' }).trim());
    const gid = Number(execFileSync('id', ['-g', 'postgres'], { encoding: 'utf8' }).trim());
    chownSync(folder, uid, gid);
  }
  const data = join(folder, 'data');
  const port = await freePort();
  try {
    run('initdb', ['-D', data, '-U', 'postgres', '-A', 'trust', '-E', 'UTF8', '--locale=C.UTF-8', '--no-sync']);
    // fsync off: a test cluster never needs to survive a power cut, and it spares a busy disk.
    const options = `-p ${port} -k ${folder} -c listen_addresses=127.0.0.1 -c fsync=off -c synchronous_commit=off -c full_page_writes=off -c max_connections=200`;
    run('pg_ctl', ['-D', data, '-o', options, '-l', join(folder, 'log'), '-w', '-t', '60', 'start']);
  } catch (error) {
    rmSync(folder, { recursive: true, force: true });
    throw error;
  }
  const url = `postgres://postgres@127.0.0.1:${port}/postgres`;
  let stopped = false;
  return {
    url,
    port,
    createDatabase(name) {
      if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`not a plain database name: ${name}`);
      run('psql', ['-h', '127.0.0.1', '-p', String(port), '-U', 'postgres', '-d', 'postgres', '-v', 'ON_ERROR_STOP=1', '-c', `create database ${name}`]);
      return `postgres://postgres@127.0.0.1:${port}/${name}`;
    },
    stop() {
      if (stopped) return;
      stopped = true;
      try {
        run('pg_ctl', ['-D', data, '-m', 'immediate', '-w', 'stop']);
      } finally {
        rmSync(folder, { recursive: true, force: true });
      }
    },
  };
}
