/**
 * The checks behind `/api/health` and `/api/health/ready`, kept per app and answered from the last
 * result: a load balancer or a monitor probing every few milliseconds costs the request thread a
 * lookup, not a database round trip and two file-system calls per probe. A result younger than
 * `freshMs` is answered as it is; an older one (up to `staleMs`) is answered at once while one new
 * check runs behind it; beyond that the request waits for the new check, so an instance probed
 * rarely never reports a state older than `staleMs`.
 */

export interface HealthPart {
  ok: boolean;
  kind: string;
  message?: string;
}

export interface HealthParts {
  database: HealthPart;
  storage: HealthPart;
  queue: HealthPart;
}

export interface HealthMonitor {
  parts(): Promise<HealthParts>;
}

/** A result this young is answered without a new check. */
export const HEALTH_FRESH_MS = 1_000;
/** A result older than this is not answered: the request waits for a new check. */
export const HEALTH_STALE_MS = 5_000;

export function allHealthy(parts: HealthParts): boolean {
  return parts.database.ok && parts.storage.ok && parts.queue.ok;
}

export function createHealthMonitor(check: () => Promise<HealthParts>, options: { freshMs?: number; staleMs?: number; nowMs?: () => number } = {}): HealthMonitor {
  const freshMs = options.freshMs ?? HEALTH_FRESH_MS;
  const staleMs = options.staleMs ?? HEALTH_STALE_MS;
  const nowMs = options.nowMs ?? (() => performance.now());
  let last: { parts: HealthParts; atMs: number } | undefined;
  let running: Promise<HealthParts> | undefined;

  // One check at a time, however many requests ask; its start time dates the result.
  const refresh = (): Promise<HealthParts> => {
    running ??= (async () => {
      const atMs = nowMs();
      try {
        const parts = await check();
        last = { parts, atMs };
        return parts;
      } finally {
        running = undefined;
      }
    })();
    return running;
  };

  return {
    async parts() {
      const ageMs = last === undefined ? Number.POSITIVE_INFINITY : nowMs() - last.atMs;
      if (last !== undefined && ageMs < freshMs) return last.parts;
      if (last !== undefined && ageMs < staleMs) {
        // Its failures are values (each part says ok: false), so nothing is left unhandled.
        refresh().catch(() => undefined);
        return last.parts;
      }
      return refresh();
    },
  };
}
