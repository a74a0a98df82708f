import { route, type RouteDef } from '../../route-def.ts';
import type { AppDeps } from '../../context.ts';
import { dialectOf } from '../../db/orm.ts';
import { allHealthy, createHealthMonitor, type HealthMonitor, type HealthPart as Part, type HealthParts } from './monitor.ts';

async function checkParts(deps: AppDeps): Promise<HealthParts> {
  const database = deps.orm.em
    .fork()
    .getConnection()
    .execute('select 1')
    .then((): Part => ({ ok: true, kind: dialectOf(deps.orm) }))
    .catch((error: unknown): Part => ({ ok: false, kind: dialectOf(deps.orm), message: error instanceof Error ? error.message : String(error) }));
  const storage = deps.traceStore.check().then((result): Part => ({ kind: deps.traceStore.kind, ...result }));
  const queue = deps.jobs.check().then((result): Part => ({ kind: deps.jobs.name, ...result }));
  const [db, st, q] = await Promise.all([database, storage, queue]);
  return { database: db, storage: st, queue: q };
}

/** One monitor per app (its deps): every probe of that app shares its last check. */
const monitors = new WeakMap<AppDeps, HealthMonitor>();

function monitorOf(deps: AppDeps): HealthMonitor {
  let monitor = monitors.get(deps);
  if (monitor === undefined) {
    monitor = createHealthMonitor(() => checkParts(deps));
    monitors.set(deps, monitor);
  }
  return monitor;
}

/**
 * The property sandbox's mode (`bubblewrap` or `fallback`, with the reason), for admins only. It
 * never makes health fail: a server whose sandbox cannot start still serves everything else.
 */
async function sandboxPart(deps: AppDeps): Promise<Part | undefined> {
  const status = deps.runPool.sandboxStatus?.('');
  if (status === undefined) return undefined;
  return status.then(
    ({ info }): Part => ({ ok: true, kind: info.mode, ...(info.fallbackReason ? { message: info.fallbackReason } : {}) }),
    (error: unknown): Part => ({ ok: false, kind: 'unavailable', message: error instanceof Error ? error.message : String(error) }),
  );
}

/**
 * `/api/health`: is this instance alive, and how are the database, the trace storage and the job
 * queue (a part that fails makes it 503), from a check at most a few seconds old (./monitor.ts);
 * an admin also sees the property sandbox's mode.
 * `/api/health/ready`: may a load balancer send requests here (200) or not (503, e.g. while it
 * shuts down). Neither says more than the kinds in use.
 */
export const healthRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/health',
    access: 'anyone',
    async handler({ deps, res, user }) {
      const [parts, sandbox] = await Promise.all([monitorOf(deps).parts(), user?.role === 'admin' ? sandboxPart(deps) : undefined]);
      const ok = allHealthy(parts);
      if (!ok) res.status(503);
      return { ok, ...parts, ...(sandbox ? { sandbox } : {}) };
    },
  }),
  route({
    method: 'get',
    path: '/api/health/ready',
    access: 'anyone',
    async handler({ deps, res }) {
      const ready = allHealthy(await monitorOf(deps).parts());
      res.status(ready ? 200 : 503);
      return { ready };
    },
  }),
];
