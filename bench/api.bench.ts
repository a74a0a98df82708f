/**
 * `npm run bench:api`: the API under load on loopback (autocannon, 50 connections), each main route
 * beside a bare Express JSON route measured in the same run, on a seeded library of 10,000 vectors
 * and a store of traces (`--traces-mb N`, default 64; `--full` for 1 GB). Also: a 5,000-vector zip
 * import with /api/health probed meanwhile, a sign-in flood (a new e-mail each request) with health
 * probed meanwhile, the stored analysis size against the trace files, and the server's peak RSS.
 * While working on a route: `--keep DIR` seeds into DIR and keeps it (a later run with the same
 * `--keep DIR` reuses it and measures the reads only), `--only WORD` measures the read routes whose
 * name holds WORD, and BENCH_SERVER_NODE_ARGS (e.g. `--cpu-prof --cpu-prof-dir=prof`) goes to the server.
 * Targets (issue 14): list, search, trace list and trace page ≥ 1,000 req/s with p99 ≤ 50 ms; RSS ≤ 400 MB;
 * import of 5,000 vectors ≤ 10 s with health ≤ 100 ms meanwhile.
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createInterface } from 'node:readline';
import autocannon from 'autocannon';
import { strToU8, zipSync } from 'fflate';
import { openOrm } from '../server/db/orm.ts';
import { seedDemo } from '../server/db/seed.ts';
import { systemClock } from '../server/context.ts';
import { writeSyntheticTrace } from '../tests/support/synthetic-trace.ts';
import { report, type BenchFigure } from './report.ts';

const args = process.argv.slice(2);
const flag = (name: string) => args.includes(name);
const option = (name: string, fallback: number) => {
  const at = args.indexOf(name);
  return at >= 0 && args[at + 1] ? Number(args[at + 1]) : fallback;
};
const stringOption = (name: string) => {
  const at = args.indexOf(name);
  return at >= 0 ? args[at + 1] : undefined;
};
const TRACES_MB = flag('--full') ? 1024 : option('--traces-mb', 64);
/** `--keep DIR`: seed into DIR and leave it; a later `--keep DIR` reuses it and measures the reads only. */
const KEEP_DIR = stringOption('--keep');
/** `--only WORD`: measure only the read routes whose name contains WORD. */
const ONLY = stringOption('--only');
const TRACE_FILE_MB = 8;
const VECTORS = 10_000;
const CONNECTIONS = 50;
const DURATION_S = option('--seconds', 10);
const ROOT = join(import.meta.dirname, '..');

const vectorFile = (i: number) => ({
  vector: 1,
  id: `caps/bench/v${String(i).padStart(5, '0')}`,
  title: `Bench offer set ${i}: ${i % 3 === 0 ? 'PPS' : 'fixed'} supply at ${15 + (i % 6) * 15} W`,
  tags: ['bench', i % 2 === 0 ? 'even' : 'odd', `group-${i % 20}`],
  ref: 'USB PD R3.1 V1.8 §10.2.3.2 (from memory)',
  kind: 'caps',
  input: { pdos: ['0x0001912c', '0x0002d12c'], pdpW: 27 },
  expect: { findings: { exclude: ['*error'] } },
});

function zipOf(from: number, count: number): Buffer {
  const entries: Record<string, Uint8Array> = {};
  for (let i = from; i < from + count; i++) entries[`vectors/caps/bench/v${i}.vector.json`] = strToU8(JSON.stringify(vectorFile(i)));
  return Buffer.from(zipSync(entries, { level: 6 }));
}

function percentile(values: number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? 0;
}

/** Probes GET /api/health every 20 ms until stopped; latencies in ms. */
function probeHealth(url: string): { stop(): Promise<number[]> } {
  const latencies: number[] = [];
  let running = true;
  const loop = (async () => {
    while (running) {
      const t0 = performance.now();
      await fetch(`${url}/api/health`).then((r) => r.arrayBuffer());
      latencies.push(performance.now() - t0);
      await new Promise((r) => setTimeout(r, 20));
    }
  })();
  return {
    async stop() {
      running = false;
      await loop;
      return latencies;
    },
  };
}

interface Load {
  reqPerSec: number;
  p99Ms: number;
  non2xx: number;
  /** The server's CPU time (all its threads) per answered request: steadier than req/s on a shared machine. */
  cpuMsPerRequest: number;
}

/** CPU time the process has used so far (user + system, all threads), in ms. */
function cpuMsOf(pid: number): number {
  const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
  return ((Number(fields[11]) + Number(fields[12])) * 1000) / 100;
}

async function load(url: string, headers: Record<string, string>, serverPid: number): Promise<Load> {
  const cpuBeforeMs = cpuMsOf(serverPid);
  const result = await autocannon({ url, connections: CONNECTIONS, duration: DURATION_S, headers });
  const cpuMs = cpuMsOf(serverPid) - cpuBeforeMs;
  return { reqPerSec: result.requests.average, p99Ms: result.latency.p99, non2xx: result.non2xx, cpuMsPerRequest: cpuMs / Math.max(1, result.requests.total) };
}

/**
 * The server's RSS sampled every 100 ms, its peak kept per phase of the run (seeding, import,
 * analyses, each read route, the flood) with the process's thread count then (analysis threads
 * stay a while after their last trace), so the report says when the process is largest and why.
 */
function rssPhases(pid: number): { phase(name: string): void; stop(): Map<string, { rssMb: number; threads: number }> } {
  const threadsAtPeak = new Map<string, number>();
  const peaks = new Map<string, number>();
  let current = 'start';
  const sample = () => {
    try {
      const rssMb = rssOf(pid).rssMb;
      const threads = Number(/Threads:\s+(\d+)/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1] ?? 0);
      if (rssMb > (peaks.get(current) ?? 0)) threadsAtPeak.set(current, threads);
      peaks.set(current, Math.max(peaks.get(current) ?? 0, rssMb));
    } catch {
      // The server has exited.
    }
  };
  const timer = setInterval(sample, 100);
  return {
    phase(name) {
      sample();
      current = name;
    },
    stop() {
      sample();
      clearInterval(timer);
      return new Map([...peaks].map(([name, rssMb]) => [name, { rssMb, threads: threadsAtPeak.get(name) ?? 0 }]));
    },
  };
}

function rssOf(pid: number): { rssMb: number; peakMb: number } {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  const kb = (key: string) => Number(new RegExp(`${key}:\\s+(\\d+)`).exec(status)?.[1] ?? 0);
  return { rssMb: kb('VmRSS') / 1024, peakMb: kb('VmHWM') / 1024 };
}

async function main(): Promise<void> {
  const reuse = KEEP_DIR !== undefined && existsSync(join(KEEP_DIR, 'parley.sqlite'));
  const dataDir = KEEP_DIR ?? mkdtempSync(join(tmpdir(), 'parley-bench-api-'));
  if (!reuse) {
    mkdirSync(dataDir, { recursive: true });
    const orm = await openOrm({ dbName: join(dataDir, 'parley.sqlite') });
    await seedDemo(orm.em.fork(), systemClock);
    await orm.close();
  }

  // BENCH_SERVER_NODE_ARGS (e.g. `--cpu-prof --cpu-prof-dir=prof`) profiles the measured server.
  const nodeArgs = (process.env.BENCH_SERVER_NODE_ARGS ?? '').split(' ').filter(Boolean);
  const child = spawn(process.execPath, [...nodeArgs, '--import', 'tsx', join(ROOT, 'bench/api-server.ts'), dataDir], { cwd: ROOT, stdio: ['ignore', 'pipe', 'inherit'] });
  const first = await new Promise<string>((resolve) => createInterface({ input: child.stdout! }).once('line', resolve));
  const { url, bare } = JSON.parse(first) as { url: string; bare: string };
  const figures: BenchFigure[] = [];
  const phases = rssPhases(child.pid!);
  try {
    const signIn = await fetch(`${url}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'admin@kestrel.example', password: 'parley-demo' }),
    });
    const cookie = (signIn.headers.get('set-cookie') ?? '').split(';')[0]!;
    const headers = { cookie };

    if (!reuse) await seedThroughApi(url, headers, dataDir, figures, phases.phase);
    await measureReads(url, bare, headers, child.pid!, figures, phases.phase);
    phases.phase('sign-in flood');
    if (!ONLY) await signInFlood(url, figures);

    const rss = rssOf(child.pid!);
    const peaks = [...phases.stop()].map(([name, peak]) => `${name} ${peak.rssMb.toFixed(0)} (${peak.threads} threads)`).join(', ');
    console.log(`server RSS now ${rss.rssMb.toFixed(0)} MB, peak ${rss.peakMb.toFixed(0)} MB; peak by phase (MB): ${peaks}`);
    figures.push({ figure: 'server peak RSS over the whole run', unit: 'MB', parley: rss.peakMb, target: '≤ 400 MB', met: rss.peakMb <= 400 });
    report('api', figures);
  } finally {
    child.kill('SIGTERM');
    await new Promise((r) => child.once('exit', r));
    if (!KEEP_DIR) rmSync(dataDir, { recursive: true, force: true });
  }
}

/** 1. Import 2 × 5,000 vectors through the API, health probed meanwhile; 2. upload the traces and wait for their analyses. */
async function seedThroughApi(url: string, headers: Record<string, string>, dataDir: string, figures: BenchFigure[], phase: (name: string) => void): Promise<void> {
  const importTimes: number[] = [];
  let importHealth: number[] = [];
  for (const from of [0, 5_000]) {
    phase(`import ${from === 0 ? 'first' : 'second'} 5,000`);
    const form = new FormData();
    form.append('file', new Blob([new Uint8Array(zipOf(from, VECTORS / 2))]), 'bench.zip');
    const probe = probeHealth(url);
    const t0 = performance.now();
    const res = await fetch(`${url}/api/vectors/import`, { method: 'POST', headers, body: form });
    importTimes.push((performance.now() - t0) / 1000);
    importHealth = importHealth.concat(await probe.stop());
    if (!res.ok) throw new Error(`import failed: ${res.status} ${await res.text()}`);
  }
  console.log(
    `import of 5,000 vectors: ${importTimes.map((s) => s.toFixed(1)).join(' s, ')} s; health during import p99 ${percentile(importHealth, 99).toFixed(0)} ms, max ${Math.max(...importHealth).toFixed(0)} ms`,
  );
  figures.push({ figure: 'import of 5,000 vectors (zip, through the API)', unit: 's', parley: importTimes[0]!, target: '≤ 10 s', met: importTimes[0]! <= 10 });
  figures.push({ figure: '/api/health during the import, p99', unit: 'ms', parley: percentile(importHealth, 99), target: '≤ 100 ms', met: percentile(importHealth, 99) <= 100 });

  // Distinct synthetic captures up to the size asked for, analysed by the server.
  const traceDir = join(dataDir, 'generated');
  rmSync(traceDir, { recursive: true, force: true });
  mkdirSync(traceDir);
  phase('trace uploads and analyses');
  const files = Math.max(1, Math.round(TRACES_MB / TRACE_FILE_MB));
  let traceBytes = 0;
  const t0 = performance.now();
  for (let i = 0; i < files; i++) {
    const path = join(traceDir, `t${i}.jsonl`);
    traceBytes += writeSyntheticTrace(path, TRACE_FILE_MB * 1024 * 1024, `Kestrel K65 soak ${i}`);
    const form = new FormData();
    form.append('file', new Blob([new Uint8Array(readFileSync(path))]), `soak-${i}.jsonl`);
    const res = await postOnFreshConnection(`${url}/api/traces?wait=false`, headers, form);
    if (res.status !== 201) throw new Error(`upload failed: ${res.status} ${await res.text()}`);
    rmSync(path);
  }
  // Every page of the list (--full stores 128 traces), until none is still queued or analysing.
  for (;;) {
    let pending = 0;
    let total = 0;
    for (let page = 1; (page - 1) * 100 < Math.max(total, 1); page++) {
      const list = (await (await fetch(`${url}/api/traces?pageSize=100&page=${page}&sort=createdAt`, { headers })).json()) as { items: { status: string }[]; total: number };
      total = list.total;
      pending += list.items.filter((t) => t.status !== 'done' && t.status !== 'failed').length;
    }
    if (pending === 0 && total >= files) break;
    await new Promise((r) => setTimeout(r, 2_000));
  }
  const storedBytes = readdirSync(join(dataDir, 'traces'))
    .filter((f) => f.endsWith('.analysis'))
    .reduce((sum, f) => sum + statSync(join(dataDir, 'traces', f)).size, 0);
  console.log(
    `${files} traces, ${(traceBytes / 1e6).toFixed(0)} MB, analysed in ${((performance.now() - t0) / 1000).toFixed(0)} s; stored analyses ${(storedBytes / 1e6).toFixed(1)} MB (${(storedBytes / traceBytes).toFixed(3)}× the files)`,
  );
  figures.push({ figure: `stored analysis ÷ trace file (${TRACE_FILE_MB} MB traces)`, unit: '×', parley: storedBytes / traceBytes, target: '≤ 1.5×', met: storedBytes / traceBytes <= 1.5 });
}

/**
 * A POST that is tried once more when the connection fails before an answer: fetch reuses an idle
 * keep-alive connection, which the server may close (its keep-alive timeout) just as the next
 * upload starts after seconds of generating the file (EPIPE; nothing reached the server).
 */
async function postOnFreshConnection(url: string, headers: Record<string, string>, body: FormData): Promise<Response> {
  try {
    return await fetch(url, { method: 'POST', headers, body });
  } catch {
    return fetch(url, { method: 'POST', headers, body });
  }
}

/** 3. Reads at 50 connections, each beside the bare route measured right before it. */
async function measureReads(url: string, bare: string, headers: Record<string, string>, serverPid: number, figures: BenchFigure[], phase: (name: string) => void): Promise<void> {
  const firstTrace = ((await (await fetch(`${url}/api/traces?pageSize=1`, { headers })).json()) as { items: { id: number }[] }).items[0]!.id;
  const routes: [string, string][] = [
    ['library list', '/api/vectors'],
    ['library search', '/api/vectors?q=bench%20pps'],
    ['trace list', '/api/traces'],
    ['trace page: summary', `/api/traces/${firstTrace}/summary`],
    ['trace page: findings', `/api/traces/${firstTrace}/findings?pageSize=100`],
    ['trace page: timeline window', `/api/traces/${firstTrace}/timeline`],
  ];
  for (const [name, path] of routes) {
    if (ONLY && !name.includes(ONLY)) continue;
    phase(name);
    const floor = await load(`${bare}/bare`, {}, serverPid);
    const measured = await load(`${url}${path}`, headers, serverPid);
    const rss = rssOf(serverPid);
    console.log(
      `${name.padEnd(28)} ${measured.reqPerSec.toFixed(0).padStart(6)} req/s p99 ${String(measured.p99Ms).padStart(4)} ms (non-2xx ${measured.non2xx}) CPU ${measured.cpuMsPerRequest.toFixed(2)} ms/req   bare ${floor.reqPerSec.toFixed(0)} req/s p99 ${floor.p99Ms} ms CPU ${floor.cpuMsPerRequest.toFixed(2)} ms/req   RSS ${rss.rssMb.toFixed(0)} MB`,
    );
    figures.push({
      figure: `${name}, 50 connections`,
      unit: 'req/s',
      parley: measured.reqPerSec,
      peer: floor.reqPerSec,
      peerName: 'bare Express JSON route',
      higherIsBetter: true,
      target: '≥ 1,000 req/s',
      met: measured.reqPerSec >= 1_000,
    });
    figures.push({ figure: `${name}, p99 latency`, unit: 'ms', parley: measured.p99Ms, peer: floor.p99Ms, peerName: 'bare Express JSON route', target: '≤ 50 ms', met: measured.p99Ms <= 50 });
    figures.push({ figure: `${name}, server CPU per request`, unit: 'ms', parley: measured.cpuMsPerRequest, peer: floor.cpuMsPerRequest, peerName: 'bare Express JSON route' });
  }
}

/** 4. Sign-in flood: a new e-mail each request; health probed meanwhile. */
async function signInFlood(url: string, figures: BenchFigure[]): Promise<void> {
  let n = 0;
  const probe = probeHealth(url);
  const flood = await autocannon({
    url,
    connections: CONNECTIONS,
    duration: DURATION_S,
    requests: [
      {
        method: 'POST',
        path: '/api/auth/login',
        headers: { 'content-type': 'application/json' },
        setupRequest: (req) => ({ ...req, body: JSON.stringify({ email: `flood-${n++}@example.com`, password: 'wrong-password' }) }),
      },
    ],
  });
  const floodHealth = await probe.stop();
  const limited = flood['4xx'];
  console.log(
    `sign-in flood: ${flood.requests.total} requests (${limited} answered 4xx, mostly 429); health p99 ${percentile(floodHealth, 99).toFixed(0)} ms, max ${Math.max(...floodHealth).toFixed(0)} ms`,
  );
  figures.push({ figure: '/api/health during a sign-in flood, p99', unit: 'ms', parley: percentile(floodHealth, 99), target: '≤ 100 ms', met: percentile(floodHealth, 99) <= 100 });
}

await main();
