/**
 * `npm run bench:server-runs`: does "Run all" on a 5,142-vector library leave the server
 * responsive? A server in a child process (SQLite, demo data plus copies of the built-in vectors
 * up to 5,142) is probed on `/api/health` every 10 ms while a run of the whole library goes, in
 * turn with a bare Node HTTP server in another process (the baseline: what this machine's load
 * alone costs a request, measured in the same moments). Target: health p99 ≤ 50 ms during the run.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startServer } from '../server/start.ts';
import { openOrm } from '../server/db/orm.ts';
import { TeamVector } from '../server/db/library-entities.ts';
import { probe, signIn, startChildServer, startControlServer, summarise } from './support/server-process.ts';
import { report } from './report.ts';

const LIBRARY_SIZE = 5_142;

/**
 * CPU time the server's main thread (the request thread) has used so far, from Linux's scheduler
 * statistics; undefined elsewhere. Unlike a latency it barely moves with the machine's other load,
 * so it says what the run itself costs the thread that answers requests.
 */
function requestThreadCpuMs(pid: number | undefined): number | undefined {
  if (pid === undefined) return undefined;
  try {
    return Number(readFileSync(`/proc/${pid}/task/${pid}/schedstat`, 'utf8').split(' ')[0]) / 1e6;
  } catch {
    return undefined;
  }
}
const IDLE_MS = 3_000;

const dataDir = join(mkdtempSync(join(tmpdir(), 'parley-bench-runs-')), 'data');
try {
  // Migrations and the demo seed in this process, then copies of the engine's vectors up to the size.
  await (await startServer({ port: 0, host: '127.0.0.1', dataDir, log: false, demo: true, distDir: join(dataDir, 'no-dist') })).close();
  const orm = await openOrm({ dbName: join(dataDir, 'parley.sqlite') });
  const em = orm.em.fork();
  const seeded = await em.find(TeamVector, {}, { orderBy: { vectorId: 'asc' } });
  const copyable = seeded.filter((v) => v.kind !== 'property');
  for (let n = 0; seeded.length + n < LIBRARY_SIZE; n++) {
    const from = copyable[n % copyable.length]!;
    const vectorId = `${from.vectorId}-copy-${String(n).padStart(4, '0')}`;
    const json = JSON.parse(from.text) as Record<string, unknown>;
    em.create(TeamVector, { ...from, id: undefined, vectorId, text: `${JSON.stringify({ ...json, id: vectorId }, null, 2)}\n` } as never);
  }
  await em.flush();
  const total = await em.count(TeamVector);
  await orm.close();

  const server = await startChildServer({ PARLEY_DATA: dataDir, PARLEY_DEMO: '0' });
  const control = await startControlServer();
  try {
    const targets = [`${server.url}/api/health`, `${control.url}/`];
    const idleEnd = performance.now() + IDLE_MS;
    const [idle] = (await probe(targets, () => performance.now() > idleEnd)).map(summarise);

    const cookie = await signIn(server.url, 'qa@kestrel.example');
    const cpuBeforeMs = requestThreadCpuMs(server.child.pid);
    const started = performance.now();
    const start = await fetch(`${server.url}/api/runs/start`, { method: 'POST', headers: { cookie, 'content-type': 'application/json' }, body: JSON.stringify({ all: true }) });
    if (start.status !== 202) throw new Error(`run start: ${start.status} ${await start.text()}`);
    const { run } = (await start.json()) as { run: { id: number } };
    let finished = false;
    let last = { status: 'running', done: 0, total: 0, passed: 0, failed: 0 };
    const watcher = (async () => {
      while (!finished) {
        await new Promise((r) => setTimeout(r, 1_000));
        const res = await fetch(`${server.url}/api/runs?pageSize=1`, { headers: { cookie } });
        const body = (await res.json()) as { items: (typeof last & { id: number })[] };
        const row = body.items.find((r) => r.id === run.id);
        if (row) last = row;
        if (row && row.status !== 'running') finished = true;
      }
    })();
    const [during, floor] = (await probe(targets, () => finished)).map(summarise);
    await watcher;
    const runSeconds = (performance.now() - started) / 1_000;
    const cpuAfterMs = requestThreadCpuMs(server.child.pid);
    const requestThreadMs = cpuBeforeMs === undefined || cpuAfterMs === undefined ? undefined : cpuAfterMs - cpuBeforeMs;

    const fmt = (s: ReturnType<typeof summarise>) => `p50 ${s.p50Ms.toFixed(1)} ms, p99 ${s.p99Ms.toFixed(1)} ms, max ${s.maxMs.toFixed(1)} ms over ${s.count} requests`;
    console.log(`Run all on ${total} vectors: ${runSeconds.toFixed(1)} s, ${last.passed} passed, ${last.failed} failed (${last.status})`);
    console.log(`  /api/health before the run:         ${fmt(idle!)}`);
    console.log(`  /api/health during the run:         ${fmt(during!)}`);
    console.log(`  bare node server during the run:    ${fmt(floor!)} (baseline)`);
    if (requestThreadMs !== undefined) {
      // It includes answering the probes themselves (about one request every 10 ms).
      console.log(
        `  request thread CPU during the run:  ${(requestThreadMs / 1_000).toFixed(2)} s over ${runSeconds.toFixed(1)} s (${(requestThreadMs / 10 / runSeconds).toFixed(0)} %, probes included)`,
      );
    }
    console.log(`  p99 ratio to the baseline: ${(during!.p99Ms / floor!.p99Ms).toFixed(1)}× (target: p99 ≤ 50 ms during the run)`);
    report('server-runs', [
      {
        figure: `/api/health p99 during Run all (${total} vectors)`,
        unit: 'ms',
        parley: during!.p99Ms,
        peer: floor!.p99Ms,
        peerName: 'bare node HTTP server, same moments',
        target: '≤ 50 ms',
        met: during!.p99Ms <= 50,
      },
      { figure: `Run all (${total} vectors), wall time`, unit: 's', parley: runSeconds },
      ...(requestThreadMs === undefined ? [] : [{ figure: `Run all (${total} vectors), request thread CPU (probes included)`, unit: 's', parley: requestThreadMs / 1_000 }]),
    ]);
  } finally {
    await Promise.all([server.stop(), control.stop()]);
  }
} finally {
  rmSync(join(dataDir, '..'), { recursive: true, force: true });
}
