/** Roles as the server defines them (docs/api.md). */
export const roles = ['admin', 'engineer', 'qa', 'support', 'viewer'] as const;
export type Role = (typeof roles)[number];

export const roleLabels: Record<Role, string> = {
  admin: 'Admin',
  engineer: 'Engineer',
  qa: 'QA',
  support: 'Support',
  viewer: 'Viewer',
};

export const everyRole: readonly Role[] = roles;

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (roles as readonly string[]).includes(value);
}
