import { paths } from '../config/paths.ts';
import { everyRole, type Role } from '../lib/roles.ts';

export type NavEntry = {
  label: string;
  to: string;
  /** Roles that see the entry; the route itself checks the same roles. */
  roles: readonly Role[];
  /** One line for the Home page's "where to go" list. */
  summary: string;
  section: 'work' | 'admin';
};

// A page appears here once it exists; add one line per page.
export const navEntries: readonly NavEntry[] = [
  { label: 'Home', to: paths.home.path, roles: everyRole, section: 'work', summary: 'Your account and the devices under test.' },
  { label: 'Users', to: paths.admin.users.path, roles: ['admin'], section: 'admin', summary: 'Invite people, change roles, deactivate accounts.' },
  { label: 'Outbox', to: paths.admin.outbox.path, roles: ['admin'], section: 'admin', summary: 'Read every e-mail Parley has sent.' },
  { label: 'Audit log', to: paths.admin.audit.path, roles: ['admin'], section: 'admin', summary: 'Who did what, and when.' },
];

export function navFor(role: Role): NavEntry[] {
  return navEntries.filter((entry) => entry.roles.includes(role));
}
