/**
 * `npm run bench:server-rss` (issue 17): the server's resident memory before and after three large
 * uploads (45 MB JSON Lines captures, each analysed and then viewed once as the trace page reads
 * it), and again once the server has been idle past the analysis threads' idle timeout. The floor
 * is the same server's RSS after start-up and one signed-in request, measured in the same run.
 * Target: the server keeps nothing of an upload once it is analysed, so RSS comes back within
 * 1.25× of that floor (in issue 17 it stood at 227 → 404 MB after three uploads).
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createInterface } from 'node:readline';
import { openOrm } from '../server/db/orm.ts';
import { seedDemo } from '../server/db/seed.ts';
import { systemClock } from '../server/context.ts';
import { writeSyntheticTrace } from '../tests/support/synthetic-trace.ts';
import { report } from './report.ts';

const UPLOAD_MB = 45;
/** A little past the analysis pool's idle timeout (server/analysis/pool.ts, 30 s). */
const SETTLE_MS = 35_000;
const ROOT = join(import.meta.dirname, '..');

function rssMbOf(pid: number): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  return Number(/VmRSS:\s+(\d+)/.exec(status)?.[1] ?? 0) / 1024;
}

async function main(): Promise<void> {
  const dataDir = mkdtempSync(join(tmpdir(), 'parley-bench-rss-'));
  const orm = await openOrm({ dbName: join(dataDir, 'parley.sqlite') });
  await seedDemo(orm.em.fork(), systemClock);
  await orm.close();
  const child = spawn(process.execPath, ['--import', 'tsx', join(ROOT, 'bench/api-server.ts'), dataDir], { cwd: ROOT, stdio: ['ignore', 'pipe', 'inherit'] });
  const first = await new Promise<string>((resolve) => createInterface({ input: child.stdout! }).once('line', resolve));
  const { url } = JSON.parse(first) as { url: string };
  try {
    const signIn = await fetch(`${url}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'support@kestrel.example', password: 'parley-demo' }),
    });
    const headers = { cookie: (signIn.headers.get('set-cookie') ?? '').split(';')[0]! };
    await (await fetch(`${url}/api/traces`, { headers })).arrayBuffer();
    const floorMb = rssMbOf(child.pid!);
    console.log(`server RSS after start-up and one request: ${floorMb.toFixed(0)} MB`);

    const afterEach: number[] = [];
    for (let i = 0; i < 3; i++) {
      const path = join(dataDir, `upload-${i}.jsonl`);
      writeSyntheticTrace(path, UPLOAD_MB * 1024 * 1024, `Kestrel K65 day-long capture ${i}`);
      const form = new FormData();
      form.append('file', new Blob([new Uint8Array(readFileSync(path))]), `day-${i}.jsonl`);
      rmSync(path);
      const t0 = performance.now();
      const res = await fetch(`${url}/api/traces`, { method: 'POST', headers, body: form });
      if (res.status !== 201) throw new Error(`upload failed: ${res.status} ${await res.text()}`);
      const { trace } = (await res.json()) as { trace: { id: number; status: string } };
      if (trace.status !== 'done') throw new Error(`the upload ended ${trace.status}`);
      // The trace page's reads, and the whole stored analysis once (GET /api/traces/:id).
      for (const read of ['summary', 'findings?pageSize=100', 'contracts?pageSize=100', 'timeline']) await (await fetch(`${url}/api/traces/${trace.id}/${read}`, { headers })).arrayBuffer();
      await (await fetch(`${url}/api/traces/${trace.id}`, { headers: { ...headers, 'accept-encoding': 'gzip' } })).arrayBuffer();
      afterEach.push(rssMbOf(child.pid!));
      console.log(`upload ${i + 1} (${UPLOAD_MB} MB) analysed and viewed in ${((performance.now() - t0) / 1000).toFixed(1)} s; server RSS ${afterEach[i]!.toFixed(0)} MB`);
    }
    await new Promise((r) => setTimeout(r, SETTLE_MS));
    const settledMb = rssMbOf(child.pid!);
    console.log(`after ${SETTLE_MS / 1000} s idle: server RSS ${settledMb.toFixed(0)} MB (${(settledMb / floorMb).toFixed(2)}× the start-up floor; issue 17: 227 → 404 MB)`);
    report('server-rss', [
      {
        figure: `server RSS after three ${UPLOAD_MB} MB uploads, idle`,
        unit: 'MB',
        parley: settledMb,
        peer: floorMb,
        peerName: 'the same server after start-up',
        growth: [
          { size: '1 upload', value: afterEach[0]! },
          { size: '2 uploads', value: afterEach[1]! },
          { size: '3 uploads', value: afterEach[2]! },
        ],
        target: '≤ 1.25× start-up',
        met: settledMb <= floorMb * 1.25,
      },
    ]);
  } finally {
    child.kill('SIGTERM');
    await new Promise((r) => child.once('exit', r));
    rmSync(dataDir, { recursive: true, force: true });
  }
}

await main();
