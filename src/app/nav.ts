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
  { label: 'Offers', to: paths.offers.path, roles: everyRole, section: 'work', summary: 'Check a source\'s offers against the Power Rules and see the contract a sink takes.' },
  { label: 'Rules', to: paths.rules.index.path, roles: everyRole, section: 'work', summary: 'Every check Parley reports, what it means and where it comes from.' },
  { label: 'Decoder', to: paths.decoder.path, roles: everyRole, section: 'work', summary: 'Paste a message or drop a capture and read every field, bit by bit.' },
  { label: 'Traces', to: paths.traces.index.path, roles: everyRole, section: 'work', summary: 'Upload a log from the field, see what happened on the wire and share the diagnosis.' },
  { label: 'Bench', to: paths.bench.path, roles: everyRole, section: 'work', summary: 'Simulate a source and a sink negotiating, inject faults, and watch every message, timer and volt.' },
  { label: 'Properties', to: paths.properties.path, roles: ['admin', 'engineer', 'qa'], section: 'work', summary: 'Write a property over the engine, let fast-check hunt for a counterexample and keep it as a vector.' },
  { label: 'Library', to: paths.library.index.path, roles: everyRole, section: 'work', summary: 'The team\'s test vectors with their history: edit, compare revisions, run them, import and export.' },
  { label: 'Runs', to: paths.runs.index.path, roles: everyRole, section: 'work', summary: 'Every run of the library, from here or from CI per firmware build, with what failed and why.' },
  { label: 'Users', to: paths.admin.users.path, roles: ['admin'], section: 'admin', summary: 'Invite people, change roles, deactivate accounts.' },
  { label: 'Outbox', to: paths.admin.outbox.path, roles: ['admin'], section: 'admin', summary: 'Read every e-mail Parley has sent.' },
  { label: 'Audit log', to: paths.admin.audit.path, roles: ['admin'], section: 'admin', summary: 'Who did what, and when.' },
  { label: 'API tokens', to: paths.admin.tokens.path, roles: ['admin'], section: 'admin', summary: 'Tokens that let CI post test results for a project.' },
];

export function navFor(role: Role): NavEntry[] {
  return navEntries.filter((entry) => entry.roles.includes(role));
}
