/**
 * Operating-system limits set on the property child itself (setrlimit through util-linux
 * `prlimit`, or a `sh -c 'ulimit …'` wrapper where it is missing), so they hold whatever the code
 * does and even when the server is gone:
 * - address space (RLIMIT_AS): covers typed arrays and Buffers, which live outside the V8 heap
 *   that `--max-old-space-size` limits;
 * - CPU time (RLIMIT_CPU): a backstop for a child the server can no longer stop;
 * - processes (RLIMIT_NPROC): threads and processes of the child's user;
 * - no core files (RLIMIT_CORE 0): a child that aborts leaves nothing on disk.
 */
import { existsSync } from 'node:fs';
import { readdir, readFile } from 'node:fs/promises';
import type { SandboxLimits } from '../../shared/api/index.ts';

/**
 * Address space Node 20 reserves before a property allocates anything, with room to spare.
 * Measured on x64 with Node 20.20 and MALLOC_ARENA_MAX=2: the heaviest shipped property (the
 * simulator one, 400 runs) runs under 800 MB of RLIMIT_AS with a 64 MB heap and aborts at 750 MB
 * ("Failed to reserve virtual memory for CodeRange": V8 reserves a 512 MB code range up front,
 * the binary maps about 85 MB, each thread an 8 MB stack). The rest of the 1,024 MB covers more
 * malloc arenas and threads on larger machines.
 */
export const NODE_ADDRESS_SPACE_RESERVE_MB = 1_024;

/**
 * Tasks (threads count) the child may add to those its user already has: Node 20 runs about 7
 * threads idle and up to 11 with its thread pool busy; bubblewrap adds 2 processes.
 */
export const CHILD_TASKS_HEADROOM = 32;

export interface OsLimits {
  addressSpaceMb: number;
  cpuSeconds: number;
  /** RLIMIT_NPROC as set: the tasks the child's user had at its start plus `CHILD_TASKS_HEADROOM`. */
  processes: number;
}

const PRLIMIT_CANDIDATES = ['/usr/bin/prlimit', '/bin/prlimit'];
const SH = '/bin/sh';

/** How the limits are applied on this machine: `prlimit`, a `sh` wrapper, or not at all. */
export type LimitTool = SandboxLimits['tool'];

export function limitTool(): LimitTool {
  if (PRLIMIT_CANDIDATES.some((path) => existsSync(path))) return 'prlimit';
  return existsSync(SH) ? 'ulimit' : 'none';
}

/**
 * The CPU-time backstop for a wall-clock timeout: above it (so the timeout always speaks first;
 * V8's garbage-collector threads add CPU time beyond the wall time), yet close enough that a
 * child the server cannot kill stops within seconds of it.
 */
export function cpuSecondsFor(timeoutMs: number): number {
  return Math.ceil((timeoutMs * 1.5) / 1_000) + 1;
}

/**
 * Threads and processes owned by `uid` now (RLIMIT_NPROC counts a user's tasks, threads included).
 * Read without blocking: one status file per process on the machine, counted before every child.
 */
export async function tasksOwnedBy(uid: number): Promise<number> {
  let pids: string[];
  try {
    pids = (await readdir('/proc')).filter((name) => /^\d+$/.test(name));
  } catch {
    return 0;
  }
  const counts = await Promise.all(
    pids.map(async (pid) => {
      try {
        const status = await readFile(`/proc/${pid}/status`, 'utf8');
        const realUid = Number(/^Uid:\s+(\d+)/m.exec(status)?.[1]);
        return realUid === uid ? Number(/^Threads:\s+(\d+)/m.exec(status)?.[1] ?? 1) : 0;
      } catch {
        // The process ended while we looked.
        return 0;
      }
    }),
  );
  return counts.reduce((sum, n) => sum + n, 0);
}

/** The command prefix that sets `limits` and then runs the rest of the command line in the same process. */
export function limitPrefix(tool: LimitTool, limits: OsLimits): string[] {
  const asBytes = limits.addressSpaceMb * 1024 * 1024;
  if (tool === 'prlimit') {
    const prlimit = PRLIMIT_CANDIDATES.find((path) => existsSync(path))!;
    // soft:hard. CPU: SIGXCPU at the soft limit, SIGKILL a second later at the hard one.
    return [prlimit, `--as=${asBytes}`, `--cpu=${limits.cpuSeconds}:${limits.cpuSeconds + 1}`, `--nproc=${limits.processes}`, '--core=0', '--'];
  }
  if (tool === 'ulimit') {
    // POSIX sh: -v (KiB) and -t and -c; the process limit is -u in bash and -p in dash, so both are tried.
    const script = `ulimit -v ${asBytes / 1024} && ulimit -t ${limits.cpuSeconds} && ulimit -c 0 && { ulimit -u ${limits.processes} 2>/dev/null || ulimit -p ${limits.processes} 2>/dev/null || true; } && exec "$@"`;
    return [SH, '-c', script, 'sh'];
  }
  return [];
}
