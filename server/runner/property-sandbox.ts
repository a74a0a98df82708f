/**
 * Property vectors are code written by one user and run on the server, so they are checked in a
 * separate child process with few powers, never in the server's own threads:
 * - Node's permission model (`--experimental-permission`): the only readable file is the checker
 *   itself (./property-child.ts and shared/, bundled by esbuild at first use into a fresh private
 *   temp folder); no `--allow-fs-write`, `--allow-child-process`, `--allow-worker`, addons or WASI;
 * - an empty environment, cwd in that temp folder, `--max-old-space-size`, a wall-clock timeout
 *   (SIGKILL, then "property timed out after N s");
 * - where `unshare` can make user, network and pid namespaces (probed once), the child runs inside
 *   them: no network at all (Node 20's permission model does not restrict sockets) and no view of
 *   the server's process, so it cannot signal it. Without them it shares the server's network;
 * - a server running as root starts the child as `nobody` (65534), so the operating system denies
 *   the server's files as well.
 * Protocol: `{ code, runs, seed }` on stdin, the shared checker's `PropertyOutcome` as the last
 * line of stdout.
 */
import { spawn } from 'node:child_process';
import { rmSync } from 'node:fs';
import { dirname } from 'node:path';
import type { PropertyOutcome } from '../../shared/vectors/index.ts';
import { bundleChecker, planLaunch, type Launch, type SandboxInfo } from './sandbox-launch.ts';

export type { SandboxInfo } from './sandbox-launch.ts';

export interface SandboxOptions {
  /** Wall-clock limit per property, child start included. */
  timeoutMs: number;
  /** Properties checked at once. */
  maxConcurrent: number;
  heapMb?: number;
  /** `permission-only` skips the namespaces and the user switch (tests use it to see the permission model alone). */
  layers?: 'all' | 'permission-only';
}

export interface PropertySandbox {
  check(code: string, options: { runs: number; seed: number }): Promise<PropertyOutcome>;
  info(): Promise<SandboxInfo>;
  close(): Promise<void>;
}

const MAX_STDOUT_BYTES = 16 * 1024 * 1024;
const STDERR_TAIL_CHARS = 2_000;
const DENIED = /Access to this API has been restricted|process\.kill is not available/;
const DENIED_NOTE = ' (property code runs in a sandbox without access to files, processes, workers or signals)';

function seconds(ms: number): string {
  return String(Math.round(ms / 100) / 10);
}

function failed(seed: number, code: string, message: string, durationMs: number): PropertyOutcome {
  return { holds: false, numRuns: 0, seed, error: { code, message }, durationMs };
}

function isOutcome(value: unknown): value is PropertyOutcome {
  if (typeof value !== 'object' || value === null) return false;
  const outcome = value as Record<string, unknown>;
  return typeof outcome.holds === 'boolean' && typeof outcome.numRuns === 'number' && typeof outcome.seed === 'number';
}

/** Says why a denied call failed, so the author does not hunt for a bug in the engine. */
function explainDenied(outcome: PropertyOutcome): PropertyOutcome {
  const explained = { ...outcome };
  if (explained.failure !== undefined && DENIED.test(explained.failure)) explained.failure += DENIED_NOTE;
  if (explained.error !== undefined && DENIED.test(explained.error.message)) explained.error = { ...explained.error, message: explained.error.message + DENIED_NOTE };
  return explained;
}

/** A small counting semaphore: at most `limit` children at once. */
function limiter(limit: number): <T>(task: () => Promise<T>) => Promise<T> {
  let active = 0;
  const waiting: (() => void)[] = [];
  return async (task) => {
    if (active >= limit) await new Promise<void>((resolve) => waiting.push(resolve));
    active += 1;
    try {
      return await task();
    } finally {
      active -= 1;
      waiting.shift()?.();
    }
  };
}

export function createPropertySandbox(options: SandboxOptions): PropertySandbox {
  const heapMb = options.heapMb ?? 512;
  const limit = limiter(Math.max(1, options.maxConcurrent));
  const running = new Set<(reason: string) => void>();
  let bundled: Promise<{ dir: string; path: string }> | undefined;
  let launch: Promise<Launch> | undefined;
  let closed = false;

  let bundleDir: string | undefined;
  const removeBundle = (): void => {
    if (bundleDir !== undefined) rmSync(bundleDir, { recursive: true, force: true });
    bundleDir = undefined;
  };
  const prepare = (): Promise<Launch> => {
    if (bundled === undefined) {
      bundled = bundleChecker();
      // A server that exits without closing the pool leaves no bundle behind either.
      bundled.then(
        (bundle) => {
          bundleDir = bundle.dir;
          process.once('exit', removeBundle);
        },
        () => undefined,
      );
    }
    launch ??= bundled.then((bundle) => planLaunch(bundle.path, options.layers ?? 'all'));
    return launch;
  };

  const runChild = (plan: Launch, code: string, job: { runs: number; seed: number }): Promise<PropertyOutcome> =>
    new Promise((resolve) => {
      const started = performance.now();
      const args = [...plan.prefix, '--experimental-permission', `--allow-fs-read=${plan.info.bundlePath}`, `--max-old-space-size=${heapMb}`, '--no-warnings', plan.info.bundlePath];
      const child = spawn(plan.command, args, { env: {}, cwd: dirname(plan.info.bundlePath), stdio: ['pipe', 'pipe', 'pipe'], uid: plan.uid, gid: plan.gid });
      let stdout = '';
      let stdoutBytes = 0;
      let stderr = '';
      let ending: string | undefined;
      const stop = (reason: string): void => {
        ending ??= reason;
        child.kill('SIGKILL');
      };
      running.add(stop);
      const timer = setTimeout(() => stop('timeout'), options.timeoutMs);
      child.stdout.on('data', (chunk: Buffer) => {
        stdoutBytes += chunk.length;
        if (stdoutBytes > MAX_STDOUT_BYTES) stop('output');
        else stdout += chunk.toString('utf8');
      });
      child.stderr.on('data', (chunk: Buffer) => {
        stderr = (stderr + chunk.toString('utf8')).slice(-STDERR_TAIL_CHARS);
      });
      child.stdin.on('error', () => undefined);
      child.on('error', (error) => stop(`spawn: ${error.message}`));
      child.on('close', (exitCode, signal) => {
        clearTimeout(timer);
        running.delete(stop);
        const durationMs = performance.now() - started;
        if (ending === 'timeout') return resolve(failed(job.seed, 'property.timeout', `property timed out after ${seconds(options.timeoutMs)} s`, options.timeoutMs));
        if (ending === 'output') return resolve(failed(job.seed, 'property.output', `the property wrote more than ${MAX_STDOUT_BYTES / 1024 / 1024} MB of output`, durationMs));
        if (ending === 'closed') return resolve(failed(job.seed, 'property.stopped', 'the property was stopped because the server is shutting down', durationMs));
        if (ending !== undefined) return resolve(failed(job.seed, 'property.sandbox', `the property sandbox could not start (${ending.slice(7)})`, durationMs));
        const last = stdout.trimEnd().split('\n').at(-1) ?? '';
        let parsed: unknown;
        try {
          parsed = JSON.parse(last);
        } catch {
          parsed = undefined;
        }
        if (exitCode === 0 && isOutcome(parsed)) return resolve(explainDenied(parsed));
        if (/heap out of memory|Allocation failed/.test(stderr)) return resolve(failed(job.seed, 'property.memory', `the property ran out of memory (limit ${heapMb} MB)`, durationMs));
        const how = signal === null ? `exit code ${String(exitCode)}` : `signal ${signal}`;
        const tail = stderr.trim().split('\n').at(-1);
        resolve(failed(job.seed, 'property.crash', `the property process stopped (${how})${tail ? `: ${tail}` : ''}`, durationMs));
      });
      child.stdin.end(JSON.stringify({ code, runs: job.runs, seed: job.seed }));
    });

  return {
    async check(code, job) {
      if (closed) return failed(job.seed, 'property.stopped', 'the property sandbox is closed', 0);
      let plan: Launch;
      try {
        plan = await prepare();
      } catch (error) {
        return failed(job.seed, 'property.sandbox', `the property sandbox could not be prepared: ${error instanceof Error ? error.message : String(error)}`, 0);
      }
      return limit(() => (closed ? Promise.resolve(failed(job.seed, 'property.stopped', 'the property sandbox is closed', 0)) : runChild(plan, code, job)));
    },
    async info() {
      return (await prepare()).info;
    },
    async close() {
      closed = true;
      for (const stop of running) stop('closed');
      await bundled?.catch(() => undefined);
      process.off('exit', removeBundle);
      removeBundle();
    },
  };
}
