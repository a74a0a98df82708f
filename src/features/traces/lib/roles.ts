import type { Role } from '../../../lib/roles.ts';

/** The roles the API lets upload, comment on and share traces (server/features/traces/routes.ts). */
export const traceWriterRoles: readonly Role[] = ['admin', 'engineer', 'qa', 'support'];

export function mayWriteTraces(role: Role): boolean {
  return traceWriterRoles.includes(role);
}
