/** Labels of the roles; the roles and their groups are the API's (shared/api/roles.ts). */
import { roles, type Role } from '../../shared/api/index.ts';

export { isRole, roleGroups, roles, type Role } from '../../shared/api/index.ts';

export const roleLabels: Record<Role, string> = {
  admin: 'Admin',
  engineer: 'Engineer',
  qa: 'QA',
  support: 'Support',
  viewer: 'Viewer',
};

export const everyRole: readonly Role[] = roles;
