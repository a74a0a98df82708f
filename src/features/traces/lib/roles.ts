import { roleGroups, type Role } from '../../../lib/roles.ts';

/** Whether the role may upload, comment on and share traces (the server's `traceWriters`). */
export function mayWriteTraces(role: Role): boolean {
  return (roleGroups.traceWriters as readonly Role[]).includes(role);
}
