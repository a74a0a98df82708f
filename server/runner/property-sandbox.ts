/**
 * Property vectors are code written by one user and run on the server, so they are checked in a
 * separate child process with few powers, never in the server's own threads:
 * - the isolation of ./sandbox-launch.ts: bubblewrap where the machine has it (every namespace,
 *   nothing of the host's files but Node and the bundle, dies with the server), else the fallback
 *   launcher (`unshare` namespaces where possible, dies with the server through `setpriv`);
 * - operating-system limits on the child (./sandbox-limits.ts): address space, CPU time, tasks,
 *   no core files; plus `--max-old-space-size` and a wall-clock timeout (SIGKILL, then "property
 *   timed out after N s");
 * - Node's permission model (`--experimental-permission`): the only readable file is the checker
 *   itself (./property-child.ts and shared/, bundled by esbuild at first use into a fresh temp
 *   folder); no `--allow-fs-write`, `--allow-child-process`, `--allow-worker`, addons or WASI; the
 *   child also refuses signals and sockets itself;
 * - a fair queue (./fair-queue.ts): one running property per user, the free slot to the user
 *   served longest ago.
 * Protocol: `{ code, runs, seed }` on stdin, the shared checker's `PropertyOutcome` as the last
 * line of stdout.
 */
import { spawn } from 'node:child_process';
import { rmSync } from 'node:fs';
import type { PropertyOutcome } from '../../shared/vectors/index.ts';
import { createFairQueue, type QueueView } from './fair-queue.ts';
import { removeStaleSandboxFolders } from './sandbox-folders.ts';
import { bundleChecker, planLaunch, type Launch, type SandboxInfo, type SandboxModeSetting } from './sandbox-launch.ts';

export type { SandboxInfo, SandboxModeSetting } from './sandbox-launch.ts';
export type { QueueView } from './fair-queue.ts';

/**
 * Wall-clock limit per property, child start included. The slowest shipped property (the
 * simulator one, 40 runs) checks in 0.35 s on a 2-core machine, about 9 ms per simulated
 * negotiation; 30 s lets a user's simulator property run about 3,000 negotiations, 85 times the
 * shipped one, while one stuck property holds a slot for at most half a minute.
 */
export const DEFAULT_PROPERTY_TIMEOUT_MS = 30_000;
/** V8 heap per child; typed arrays and Buffers get the rest of the address-space limit. */
export const DEFAULT_PROPERTY_HEAP_MB = 512;
/** Owner of a property checked without one (CLI-like callers, tests): they share one turn. */
export const UNOWNED = 'unowned';

/** The fair queue's owner for a run started by a user or posted with a CI token. */
export function queueOwner(run: { startedById?: number | null; tokenId?: number | null }): string {
  if (run.startedById != null) return `user:${run.startedById}`;
  return run.tokenId != null ? `token:${run.tokenId}` : UNOWNED;
}

export interface SandboxOptions {
  /** Wall-clock limit per property, child start included. */
  timeoutMs?: number;
  /** Properties checked at once, over all users. */
  maxConcurrent: number;
  /** Properties checked at once for one user (default 1). */
  perUser?: number;
  heapMb?: number;
  /** `auto` (default): bubblewrap where it works, else the fallback launcher. */
  mode?: SandboxModeSetting;
  /** `permission-only` skips every OS layer (tests use it to see the permission model alone). */
  layers?: 'all' | 'permission-only';
}

export interface SandboxStatus {
  info: SandboxInfo;
  timeoutMs: number;
  queue: QueueView;
}

export interface PropertySandbox {
  /** `owner` (a user or token id) decides the property's place in the fair queue. */
  check(code: string, options: { runs: number; seed: number }, owner?: string): Promise<PropertyOutcome>;
  info(): Promise<SandboxInfo>;
  /** The mode and limits (prepares the sandbox if nothing ran yet) and the queue as `owner` sees it. */
  status(owner: string): Promise<SandboxStatus>;
  close(): Promise<void>;
}

const MAX_STDOUT_BYTES = 16 * 1024 * 1024;
const STDERR_TAIL_CHARS = 2_000;
const DENIED = /Access to this API has been restricted|process\.kill is not available|sockets are not available/;
const DENIED_NOTE = ' (property code runs in a sandbox without access to files, processes, workers, signals or the network)';
/** What V8 and Node print, or throw, when the heap or the address space is used up. */
const OUT_OF_MEMORY = /heap out of memory|Allocation failed|Fatal process (out of memory|OOM)|Failed to reserve virtual memory|Array buffer allocation failed/;

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

export function createPropertySandbox(options: SandboxOptions): PropertySandbox {
  const heapMb = options.heapMb ?? DEFAULT_PROPERTY_HEAP_MB;
  const timeoutMs = options.timeoutMs ?? DEFAULT_PROPERTY_TIMEOUT_MS;
  const queue = createFairQueue({ atOnce: options.maxConcurrent, perOwner: options.perUser ?? 1 });
  const running = new Set<(reason: string) => void>();
  let bundled: Promise<{ dir: string; path: string }> | undefined;
  let launch: Promise<Launch> | undefined;
  let closed = false;

  // Folders of servers killed before they could remove theirs.
  removeStaleSandboxFolders();

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
    launch ??= bundled.then((bundle) => planLaunch(bundle.path, { mode: options.mode ?? 'auto', heapMb, timeoutMs, layers: options.layers ?? 'all' }));
    return launch;
  };

  const runChild = async (plan: Launch, code: string, job: { runs: number; seed: number }): Promise<PropertyOutcome> => {
    const started = performance.now();
    const command = await plan.command(['--experimental-permission', `--allow-fs-read=${plan.bundleInChild}`, `--max-old-space-size=${heapMb}`, '--no-warnings', plan.bundleInChild]);
    return new Promise((resolve) => {
      const { addressSpaceMb, cpuSeconds } = plan.info.limits;
      const overMemory = (durationMs: number) =>
        failed(job.seed, 'property.memory', `the property went over its memory limit (${heapMb} MB of heap, ${addressSpaceMb} MB of address space in all)`, durationMs);
      const child = spawn(command.file, command.args, { env: command.env, cwd: command.cwd, stdio: ['pipe', 'pipe', 'pipe'], uid: command.uid, gid: command.gid });
      let stdout = '';
      let stdoutBytes = 0;
      let stderr = '';
      let ending: string | undefined;
      const stop = (reason: string): void => {
        ending ??= reason;
        child.kill('SIGKILL');
      };
      running.add(stop);
      const timer = setTimeout(() => stop('timeout'), timeoutMs);
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
        if (ending === 'timeout') return resolve(failed(job.seed, 'property.timeout', `property timed out after ${seconds(timeoutMs)} s`, timeoutMs));
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
        if (exitCode === 0 && isOutcome(parsed)) {
          // A typed array over the address-space limit throws inside the property: the limit, not a verdict.
          if (OUT_OF_MEMORY.test(parsed.failure ?? '') || OUT_OF_MEMORY.test(parsed.error?.message ?? '')) return resolve(overMemory(durationMs));
          return resolve(explainDenied(parsed));
        }
        if (OUT_OF_MEMORY.test(stderr)) return resolve(overMemory(durationMs));
        if (signal === 'SIGXCPU') return resolve(failed(job.seed, 'property.timeout', `the property used up its CPU time limit (${cpuSeconds} s)`, durationMs));
        const how = signal === null ? `exit code ${String(exitCode)}` : `signal ${signal}`;
        const tail = stderr.trim().split('\n').at(-1);
        resolve(failed(job.seed, 'property.crash', `the property process stopped (${how})${tail ? `: ${tail}` : ''}`, durationMs));
      });
      child.stdin.end(JSON.stringify({ code, runs: job.runs, seed: job.seed }));
    });
  };

  const stopped = (seed: number) => failed(seed, 'property.stopped', 'the property sandbox is closed', 0);

  return {
    async check(code, job, owner = UNOWNED) {
      if (closed) return stopped(job.seed);
      let plan: Launch;
      try {
        plan = await prepare();
      } catch (error) {
        return failed(job.seed, 'property.sandbox', `the property sandbox could not be prepared: ${error instanceof Error ? error.message : String(error)}`, 0);
      }
      try {
        return await queue.run(owner, () => (closed ? Promise.resolve(stopped(job.seed)) : runChild(plan, code, job)));
      } catch {
        return stopped(job.seed);
      }
    },
    async info() {
      return (await prepare()).info;
    },
    async status(owner) {
      return { info: (await prepare()).info, timeoutMs, queue: queue.view(owner) };
    },
    async close() {
      closed = true;
      queue.close(new Error('the property sandbox is closed'));
      for (const stop of running) stop('closed');
      await bundled?.catch(() => undefined);
      process.off('exit', removeBundle);
      removeBundle();
    },
  };
}
