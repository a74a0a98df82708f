/**
 * Helpers for benchmarks that measure the server from outside: a server in a child process (so
 * the probe's own event loop is not the one measured), sign-in, and latency percentiles.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { resolve } from 'node:path';

export const repoRoot = resolve(import.meta.dirname, '..', '..');

export interface ChildProcessHandle {
  child: ChildProcess;
  /** SIGTERM, then resolves once the process has exited (at once if it already has). */
  stop(): Promise<void>;
}

export interface ChildServer extends ChildProcessHandle {
  url: string;
}

/**
 * Node with tsx's loader on `args` (a script and its arguments) and these variables; resolves with
 * the first match of `ready` in its standard output.
 */
function startChild(args: string[], env: Record<string, string>, ready: RegExp): Promise<{ handle: ChildProcessHandle; match: RegExpExecArray }> {
  return new Promise((resolveStart, reject) => {
    // BENCH_SERVER_NODE_ARGS (e.g. `--cpu-prof --cpu-prof-dir=prof`) profiles the measured server.
    const extra = (process.env.BENCH_SERVER_NODE_ARGS ?? '').split(' ').filter(Boolean);
    const child = spawn(process.execPath, [...extra, '--import', 'tsx', ...args], {
      cwd: repoRoot,
      env: { ...process.env, PORT: '0', HOST: '127.0.0.1', LOG_LEVEL: 'info', ...env },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let out = '';
    let errText = '';
    const onData = (chunk: Buffer) => {
      out += chunk.toString();
      const match = ready.exec(out);
      if (!match) return;
      child.stdout!.off('data', onData);
      child.stdout!.resume();
      const stop = () =>
        new Promise<void>((done) => {
          // Exited already, by itself or by a signal (a test's SIGKILL).
          if (child.exitCode !== null || child.signalCode !== null) return done();
          child.once('exit', () => done());
          child.kill('SIGTERM');
        });
      resolveStart({ handle: { child, stop }, match });
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', (chunk: Buffer) => (errText += chunk.toString()));
    child.once('exit', (code) => reject(new Error(`${args.join(' ')} exited with ${code}: ${errText.slice(-2000)}${out.slice(-2000)}`)));
  });
}

/** `tsx server/main.ts` (or another entry) on a random port with these variables; resolves once it listens. */
export async function startChildServer(env: Record<string, string>, entry = 'server/main.ts'): Promise<ChildServer> {
  const { handle, match } = await startChild([resolve(repoRoot, entry)], env, /Parley listening on (http:\/\/[^"\s]+)/);
  return { ...handle, url: match[1]! };
}

/** `parley worker` (the package's bin, as `npx parley worker` runs it) with these variables; resolves once it takes jobs. */
export async function startChildWorker(env: Record<string, string>): Promise<ChildProcessHandle> {
  const { handle } = await startChild([resolve(repoRoot, 'cli', 'parley.js'), 'worker'], env, /Parley worker started/);
  return handle;
}

/** The session cookie of a demo account. */
export async function signIn(url: string, email: string, password = 'parley-demo'): Promise<string> {
  const res = await fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password }) });
  if (res.status !== 200) throw new Error(`sign-in as ${email}: ${res.status} ${await res.text()}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}

/**
 * A bare Node HTTP server in its own process: the floor for a latency probe on this machine right
 * now (a busy machine slows it exactly as it slows Parley, so the ratio to it is what Parley adds).
 */
export function startControlServer(): Promise<ChildServer> {
  const code = "require('node:http').createServer((q, s) => s.end('{\"ok\":true}')).listen(0, '127.0.0.1', function () { console.log('Parley listening on http://127.0.0.1:' + this.address().port) })";
  return new Promise((resolveStart, reject) => {
    const child = spawn(process.execPath, ['-e', code], { stdio: ['ignore', 'pipe', 'inherit'] });
    child.stdout!.once('data', (chunk: Buffer) => {
      const url = /(http:\/\/\S+)/.exec(chunk.toString())?.[1];
      if (!url) return reject(new Error('control server did not start'));
      resolveStart({
        url,
        child,
        stop: () =>
          new Promise((done) => {
            child.once('exit', () => done());
            child.kill('SIGTERM');
          }),
      });
    });
    child.once('error', reject);
  });
}

export function percentile(sortedMs: readonly number[], p: number): number {
  if (sortedMs.length === 0) return Number.NaN;
  return sortedMs[Math.min(sortedMs.length - 1, Math.ceil((p / 100) * sortedMs.length) - 1)]!;
}

export interface LatencySummary {
  count: number;
  p50Ms: number;
  p99Ms: number;
  maxMs: number;
}

export function summarise(samplesMs: readonly number[]): LatencySummary {
  const sorted = [...samplesMs].sort((a, b) => a - b);
  return { count: sorted.length, p50Ms: percentile(sorted, 50), p99Ms: percentile(sorted, 99), maxMs: sorted.at(-1) ?? Number.NaN };
}

/**
 * Requests each URL in turn, one request at a time, `gapMs` apart, until `until()` says stop;
 * returns each URL's latencies (alternating keeps both under the same machine load).
 */
export async function probe(urls: readonly string[], until: () => boolean, gapMs = 10): Promise<number[][]> {
  const samples = urls.map(() => [] as number[]);
  while (!until()) {
    for (const [i, url] of urls.entries()) {
      const started = performance.now();
      const res = await fetch(url);
      await res.arrayBuffer();
      samples[i]!.push(performance.now() - started);
    }
    await new Promise((r) => setTimeout(r, gapMs));
  }
  return samples;
}
