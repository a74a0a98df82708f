import { paths } from '../config/paths.ts';
import { everyRole, roleGroups, type Role } from '../lib/roles.ts';

/** The groups of the sidebar, in the order they appear; Home stands above them without a heading. */
export type NavSection = 'home' | 'analyse' | 'simulate' | 'test' | 'admin';

export const navSections: readonly { id: NavSection; label: string; summary: string }[] = [
  { id: 'home', label: 'Home', summary: 'Where you start.' },
  { id: 'analyse', label: 'Analyse', summary: 'Read messages, check offers and diagnose logs from the field.' },
  { id: 'simulate', label: 'Simulate', summary: 'Run a negotiation between a simulated source and sink.' },
  { id: 'test', label: 'Test', summary: "Keep the team's test vectors and run them, here and in CI." },
  { id: 'admin', label: 'Admin', summary: 'People, e-mail, the audit log and tokens for CI.' },
];

export type NavEntry = {
  label: string;
  to: string;
  /** Roles that see the entry; the route itself checks the same roles. */
  roles: readonly Role[];
  /** One line for the Home page's cards. */
  summary: string;
  section: NavSection;
};

// A page appears here once it exists; add one line per page, in its section's order.
export const navEntries: readonly NavEntry[] = [
  { label: 'Home', to: paths.home.path, roles: everyRole, section: 'home', summary: 'Your account and the devices under test.' },
  { label: 'Decoder', to: paths.decoder.path, roles: everyRole, section: 'analyse', summary: 'Paste a message or drop a capture and read every field, bit by bit.' },
  { label: 'Offers', to: paths.offers.path, roles: everyRole, section: 'analyse', summary: "Check an adapter's offers against the Power Rules and see the contract a sink takes." },
  { label: 'Traces', to: paths.traces.index.path, roles: everyRole, section: 'analyse', summary: 'Upload a log from the field, see what happened on the wire and share the diagnosis.' },
  { label: 'Rules', to: paths.rules.index.path, roles: everyRole, section: 'analyse', summary: 'Every check Parley reports, what it means and where it comes from.' },
  { label: 'Bench', to: paths.bench.path, roles: everyRole, section: 'simulate', summary: 'Simulate a source and a sink negotiating, inject faults, and watch every message, timer and volt.' },
  {
    label: 'Fault sweep',
    to: paths.sweep.path,
    roles: everyRole,
    section: 'simulate',
    summary: 'Every placement of a lost, corrupted or late message and every timer edge, each run judged by invariants.',
  },
  { label: 'Library', to: paths.library.index.path, roles: everyRole, section: 'test', summary: "The team's test vectors with their history: edit, compare revisions, run them, import and export." },
  { label: 'Runs', to: paths.runs.index.path, roles: everyRole, section: 'test', summary: 'Every run of the library, from here or from CI per firmware build, with what failed and why.' },
  {
    label: 'Properties',
    to: paths.properties.path,
    roles: roleGroups.editors,
    section: 'test',
    summary: 'Write a property over the engine, let it hunt for a counterexample and keep it as a vector.',
  },
  { label: 'Users', to: paths.admin.users.path, roles: roleGroups.admins, section: 'admin', summary: 'Invite people, change roles, deactivate accounts.' },
  { label: 'Outbox', to: paths.admin.outbox.path, roles: roleGroups.admins, section: 'admin', summary: 'Read every e-mail Parley has sent.' },
  { label: 'Audit log', to: paths.admin.audit.path, roles: roleGroups.admins, section: 'admin', summary: 'Who did what, and when.' },
  { label: 'API tokens', to: paths.admin.tokens.path, roles: roleGroups.admins, section: 'admin', summary: 'Tokens that let CI post test results for a project.' },
];

export function navFor(role: Role): NavEntry[] {
  return navEntries.filter((entry) => entry.roles.includes(role));
}

/** The role's entries by section, in sidebar order; sections the role has nothing in are left out. */
export function navSectionsFor(role: Role): { id: NavSection; label: string; summary: string; entries: NavEntry[] }[] {
  const entries = navFor(role);
  return navSections.map((section) => ({ ...section, entries: entries.filter((entry) => entry.section === section.id) })).filter((section) => section.entries.length > 0);
}
