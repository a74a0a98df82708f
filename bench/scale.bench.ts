/**
 * `npm run bench:scale`: the read capacity of one machine against a team deployment. autocannon on
 * loopback, 50 connections, on the vector list and the trace list, for
 *
 * - one instance on SQLite (the default, `npm start`), and
 * - two instances on one PostgreSQL (a throwaway cluster) with the S3 fake as trace store, the 50
 *   connections spread over both,
 *
 * each beside a bare Express JSON route (its own process) measured just before it in the same run.
 * The library holds the demo data plus copies of the built-in vectors up to `--vectors` (default
 * 5,000). On a machine of two cores two instances share the cores the one instance had, so the
 * figure to read is the ratio to the bare route, not a doubling.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import autocannon from 'autocannon';
import { openOrm, type Orm } from '../server/db/orm.ts';
import { seedDemo } from '../server/db/seed.ts';
import { seedTeamLibrary } from '../server/features/vectors/seed.ts';
import { TeamVector } from '../server/db/library-entities.ts';
import { systemClock } from '../server/context.ts';
import { createS3TraceStore } from '../server/storage/s3-store.ts';
import { startPgCluster } from '../tests/support/pg-cluster.ts';
import { startS3Fake } from '../tests/support/s3-fake.ts';
import { signIn, startChildServer, type ChildServer } from './support/server-process.ts';
import { report, type BenchFigure } from './report.ts';

const args = process.argv.slice(2);
const option = (name: string, fallback: number) => {
  const at = args.indexOf(name);
  return at >= 0 && args[at + 1] ? Number(args[at + 1]) : fallback;
};
const VECTORS = option('--vectors', 5_000);
const DURATION_S = option('--seconds', 8);
const CONNECTIONS = 50;
const SECRET = 'bench-scale-secret-0123456789abcdef0123';
// Parley supports Node 20: the SDK's notice about its own future releases would only break up the table.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';

interface Load {
  reqPerSec: number;
  p99Ms: number;
  non2xx: number;
  /** Connection errors and time-outs. */
  errors: number;
  /** Answers received; 0 when the machine was too busy to answer within the measurement. */
  answered: number;
}

async function load(urls: string[], path: string, headers: Record<string, string>): Promise<Load> {
  // autocannon spreads its connections over several URLs (its types know only one).
  const url = (urls.length === 1 ? `${urls[0]}${path}` : urls.map((u) => `${u}${path}`)) as string;
  const result = await autocannon({ url, connections: CONNECTIONS, duration: DURATION_S, headers });
  return { reqPerSec: result.requests.average, p99Ms: result.latency.p99, non2xx: result.non2xx, errors: result.errors + result.timeouts, answered: result.requests.total };
}

/** Copies of the built-in vectors (properties left out: they run in a sandbox) up to `VECTORS`. */
async function fillLibrary(orm: Orm): Promise<number> {
  const em = orm.em.fork();
  if ((await em.count(TeamVector)) === 0) await seedTeamLibrary(em, systemClock);
  const seeded = await em.find(TeamVector, {}, { orderBy: { vectorId: 'asc' } });
  const copyable = seeded.filter((v) => v.kind !== 'property');
  for (let n = 0; seeded.length + n < VECTORS; n++) {
    const from = copyable[n % copyable.length]!;
    const vectorId = `${from.vectorId}-copy-${String(n).padStart(5, '0')}`;
    const json = JSON.parse(from.text) as Record<string, unknown>;
    em.create(TeamVector, { ...from, id: undefined, vectorId, text: `${JSON.stringify({ ...json, id: vectorId }, null, 2)}\n` } as never);
    if (n % 1_000 === 999) await em.flush();
  }
  await em.flush();
  return em.count(TeamVector);
}

const routes: [string, string][] = [
  ['vector list', '/api/vectors'],
  ['trace list', '/api/traces'],
];

interface Row {
  setup: string;
  route: string;
  measured: Load;
  floor: Load;
}

async function measure(setup: string, urls: string[], bare: ChildServer, figures: BenchFigure[], rows: Row[]): Promise<void> {
  const cookie = await signIn(urls[0]!, 'admin@kestrel.example');
  for (const [name, path] of routes) {
    const floor = await load([bare.url], '/bare', {});
    const measured = await load(urls, path, { cookie });
    console.log(`${setup}, ${name}: ${measured.reqPerSec.toFixed(0)} req/s, p99 ${measured.p99Ms} ms; bare Express ${floor.reqPerSec.toFixed(0)} req/s, p99 ${floor.p99Ms} ms`);
    if (measured.non2xx > 0 || measured.errors > 0) throw new Error(`${setup} ${name}: ${measured.non2xx} answers were not 2xx, ${measured.errors} requests failed`);
    rows.push({ setup, route: name, measured, floor });
    if (measured.answered === 0 || floor.answered === 0) {
      console.log(`${setup}, ${name}: no answer within ${DURATION_S} s; the machine is too busy for this measurement`);
      continue;
    }
    figures.push({ figure: `${name}, ${setup}, 50 connections`, unit: 'req/s', parley: measured.reqPerSec, peer: floor.reqPerSec, peerName: 'bare Express JSON route', higherIsBetter: true });
    figures.push({ figure: `${name}, ${setup}, p99`, unit: 'ms', parley: measured.p99Ms, peer: floor.p99Ms, peerName: 'bare Express JSON route' });
  }
}

const loadAverage = () =>
  loadavg()
    .map((l) => l.toFixed(2))
    .join(' ');

/** The setups side by side, one line per route: Parley's req/s and p99, the bare route's req/s, and their ratio. */
function printTable(rows: readonly Row[]): void {
  const setups = [...new Set(rows.map((r) => r.setup))];
  const columns = ['req/s', 'p99 ms', 'bare/s', 'ratio'];
  const width = columns.length * 7 - 1;
  const cell = (r: Row | undefined) => {
    if (!r || r.measured.answered === 0 || r.floor.answered === 0) return 'no answer'.padStart(width);
    return [r.measured.reqPerSec.toFixed(0), String(r.measured.p99Ms), r.floor.reqPerSec.toFixed(0), (r.measured.reqPerSec / r.floor.reqPerSec).toFixed(2)].map((v) => v.padStart(6)).join(' ');
  };
  console.log('');
  console.log(`${''.padEnd(12)} | ${setups.map((s) => s.padEnd(width)).join(' | ')}`);
  console.log(`${'route'.padEnd(12)} | ${setups.map(() => columns.map((c) => c.padStart(6)).join(' ')).join(' | ')}`);
  console.log(`${'-'.repeat(12)}-|-${setups.map(() => '-'.repeat(width)).join('-|-')}`);
  for (const [route] of routes) console.log(`${route.padEnd(12)} | ${setups.map((s) => cell(rows.find((r) => r.setup === s && r.route === route))).join(' | ')}`);
  console.log('');
  console.log(`req/s and p99 of the route (autocannon, ${CONNECTIONS} connections, ${DURATION_S} s); bare/s: a bare Express JSON route measured just before it; ratio: route ÷ bare.`);
}

async function main(): Promise<void> {
  const folder = mkdtempSync(join(tmpdir(), 'parley-bench-scale-'));
  const figures: BenchFigure[] = [];
  const rows: Row[] = [];
  const loadBefore = loadAverage();
  const bare = await startChildServer({}, 'bench/support/bare-express.ts');
  try {
    // One instance on SQLite.
    const sqliteDir = join(folder, 'sqlite');
    const sqliteOrm = await openOrm({ dbName: join(sqliteDir, 'parley.sqlite') });
    await seedDemo(sqliteOrm.em.fork(), systemClock, { dataDir: sqliteDir });
    const vectors = await fillLibrary(sqliteOrm);
    await sqliteOrm.close();
    console.log(`library: ${vectors} vectors; ${DURATION_S} s per measurement, ${CONNECTIONS} connections`);
    const one = await startChildServer({ PARLEY_DATA: sqliteDir, PARLEY_DEMO: '0', LOG_LEVEL: 'info' });
    try {
      await measure('one instance, SQLite', [one.url], bare, figures, rows);
    } finally {
      await one.stop();
    }

    // Two instances on PostgreSQL, traces in the S3 fake.
    const cluster = await startPgCluster();
    const fake = await startS3Fake();
    try {
      const databaseUrl = cluster.createDatabase('parley_bench');
      const pgOrm = await openOrm({ databaseUrl });
      const store = createS3TraceStore({ endpoint: fake.url, bucket: fake.bucket, credentials: fake.credentials, incomingDir: join(folder, 'seed-incoming') });
      await seedDemo(pgOrm.em.fork(), systemClock, { traceStore: store });
      await fillLibrary(pgOrm);
      await pgOrm.close();
      const env = (name: string) => ({
        DATABASE_URL: databaseUrl,
        PARLEY_SECRET: SECRET,
        PARLEY_DATA: join(folder, name),
        PARLEY_DEMO: '0',
        S3_URL: fake.url,
        S3_BUCKET: fake.bucket,
        ...fake.credentialEnv,
        LOG_LEVEL: 'info',
      });
      const two = [await startChildServer(env('a')), await startChildServer(env('b'))];
      try {
        await measure(
          'two instances, PostgreSQL',
          two.map((s) => s.url),
          bare,
          figures,
          rows,
        );
      } finally {
        await Promise.all(two.map((s) => s.stop()));
      }
    } finally {
      await fake.stop();
      cluster.stop();
    }
  } finally {
    await bare.stop();
    rmSync(folder, { recursive: true, force: true });
  }
  printTable(rows);
  console.log(`load average (1, 5, 15 min) at the start ${loadBefore}, at the end ${loadAverage()}; ${availableParallelism()} cores`);
  report('scale', figures);
}

await main();
