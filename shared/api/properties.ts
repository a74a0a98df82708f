/**
 * The server's property sandbox as the API presents it (`GET /api/properties/queue`, and the
 * `sandbox` part of `GET /api/health` for admins). Property vectors the server runs (library runs,
 * CI) are checked one child process each, in bubblewrap or the fallback launcher, through a fair
 * queue with one running property per user.
 */

/** `bubblewrap`: Debian's bwrap isolates the child; `fallback`: the launcher without it (no bwrap, or its probe failed, or `PARLEY_SANDBOX=fallback`). */
export type SandboxMode = 'bubblewrap' | 'fallback';

/** How the child is isolated. */
export interface SandboxIsolation {
  mode: SandboxMode;
  /** Why the fallback is in use; null in bubblewrap mode. */
  fallbackReason: string | null;
  /** `isolated`: a network namespace with only loopback; `shared`: the server's network (the child still refuses sockets). */
  network: 'isolated' | 'shared';
  /** The child sees only its own processes. */
  pidNamespace: boolean;
  /** `minimal`: only Node, its libraries and the checker exist for the child; `host`: the host's files, behind Node's permission model. */
  files: 'minimal' | 'host';
  /** The child is killed when the server process dies, even by SIGKILL. */
  diesWithParent: boolean;
  /** `nobody` when the server runs as root; else the server's own user. */
  user: 'nobody' | 'server';
}

/** The limits of one property. */
export interface SandboxLimits {
  timeoutMs: number;
  heapMb: number;
  /** Address space of the child process in all (heap, typed arrays, Node itself). */
  addressSpaceMb: number;
  /** CPU-time backstop, above the wall-clock timeout. */
  cpuSeconds: number;
  /** How the OS limits are set: `prlimit`, a `sh -c 'ulimit …'` wrapper, or `none` (neither found). */
  tool: 'prlimit' | 'ulimit' | 'none';
  /** Properties checked at once over all users, and for one user. */
  atOnce: number;
  perUser: number;
}

export interface QueuedProperty {
  /** 1 = starts next. */
  position: number;
  /** Properties that start before this one (other users' are counted, never named). */
  ahead: number;
  /** How many of those are the caller's own. */
  aheadYours: number;
}

export interface PropertyQueue {
  mode: SandboxMode;
  limits: SandboxLimits;
  /** Over every user. */
  running: number;
  waiting: number;
  /** Users (and CI tokens) with a property running or waiting. */
  users: number;
  yours: { running: number; waiting: QueuedProperty[] };
  /** Admins only. */
  isolation?: SandboxIsolation;
}
