/** The roles a user can hold, and the groups of them that routes and pages allow (docs/api.md). */
export const roles = ['admin', 'engineer', 'qa', 'support', 'viewer'] as const;
export type Role = (typeof roles)[number];

/**
 * Who may do what. The server's routes and the client's guards and buttons read these same lists,
 * so a page never offers what the server refuses.
 */
export const roleGroups = {
  admins: ['admin'],
  /** Create and edit vectors and devices, start runs, write properties. */
  editors: ['admin', 'engineer', 'qa'],
  /** Delete vectors. */
  vectorDeleters: ['admin', 'qa'],
  /** Upload, comment on and share traces. */
  traceWriters: ['admin', 'engineer', 'qa', 'support'],
} as const satisfies Record<string, readonly Role[]>;

export type RoleGroup = keyof typeof roleGroups;

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (roles as readonly string[]).includes(value);
}

/** Whether `role` belongs to the group. */
export function roleIn(group: readonly Role[], role: Role): boolean {
  return group.includes(role);
}
