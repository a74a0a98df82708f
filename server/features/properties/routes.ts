/**
 * `GET /api/properties/queue`: the server's property sandbox as the Properties page shows it —
 * its mode and limits, and where the caller's properties stand in the fair queue (others'
 * counted, never named). Admins also get how the child is isolated and why a fallback is in use.
 */
import { roleGroups, type PropertyQueue, type SandboxIsolation } from '../../../shared/api/index.ts';
import { serviceUnavailable } from '../../errors.ts';
import { currentUser, route, type RouteDef } from '../../route-def.ts';
import { queueOwner, type SandboxStatus } from '../../runner/property-sandbox.ts';

export function presentQueue(status: SandboxStatus, admin: boolean): PropertyQueue {
  const { info, queue } = status;
  const isolation: SandboxIsolation = {
    mode: info.mode,
    fallbackReason: info.fallbackReason,
    network: info.network,
    pidNamespace: info.pidNamespace,
    files: info.files,
    diesWithParent: info.diesWithParent,
    user: info.user,
  };
  return {
    mode: info.mode,
    limits: {
      timeoutMs: status.timeoutMs,
      heapMb: info.limits.heapMb,
      addressSpaceMb: info.limits.addressSpaceMb,
      cpuSeconds: info.limits.cpuSeconds,
      tool: info.limits.tool,
      atOnce: queue.atOnce,
      perUser: queue.perOwner,
    },
    running: queue.running,
    waiting: queue.waiting,
    users: queue.owners,
    yours: queue.yours,
    ...(admin ? { isolation } : {}),
  };
}

export const propertiesRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/properties/queue',
    access: roleGroups.editors,
    async handler(ctx) {
      const me = currentUser(ctx);
      const status = await ctx.deps.runPool.sandboxStatus?.(queueOwner({ startedById: me.id })).catch((cause: unknown) => {
        throw serviceUnavailable(`the property sandbox cannot start: ${cause instanceof Error ? cause.message : String(cause)}`, 'sandbox.unavailable');
      });
      if (!status) throw serviceUnavailable('this server runs no property sandbox', 'sandbox.unavailable');
      return presentQueue(status, me.role === 'admin');
    },
  }),
];
