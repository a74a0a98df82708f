import { Link } from 'react-router';
import { Badge } from '../../components/badge.tsx';
import { Card, CardBody, CardHeader } from '../../components/card.tsx';
import { PageHeader } from '../../components/page-header.tsx';
import { paths } from '../../config/paths.ts';
import { DevicesTable } from '../../features/devices/components/devices-table.tsx';
import { useSession } from '../../lib/auth.ts';
import { roleLabels, type Role } from '../../lib/roles.ts';
import { navFor } from '../nav.ts';

/** What the product does for each role, in the words of the person holding it. */
const roleSummaries: Record<Role, { lead: string; points: string[] }> = {
  admin: {
    lead: 'You run Parley for your organisation, and can do everything the other roles do.',
    points: [
      'Invite people and choose their role; deactivate accounts that should no longer sign in.',
      'Read every e-mail Parley sends, such as invitations and password resets.',
      'Follow the audit log of sign-ins and account changes.',
    ],
  },
  engineer: {
    lead: 'You build chargers, power banks and devices, and use Parley to see how they negotiate.',
    points: [
      'Replay USB PD negotiations with faults injected, and watch the contract that results.',
      'Write test vectors and properties for your firmware, and analyse traces you capture.',
    ],
  },
  qa: {
    lead: 'You keep the test vector library and run it, here and in CI.',
    points: [
      'Write and revise test vectors; every edit is a new revision.',
      'Run the library with the parley command line in CI, and analyse failing traces.',
    ],
  },
  support: {
    lead: 'You help customers whose devices charge slowly or not at all.',
    points: [
      'Upload field logs to have them decoded and checked against the USB PD rules.',
      'Read the vector library to compare a report with known behaviour.',
    ],
  },
  viewer: {
    lead: 'You can read everything shared with you; nothing you do changes it.',
    points: ['Read devices, test vectors, traces and their findings.'],
  },
};

export function HomeRoute() {
  const { user, organisation } = useSession();
  const summary = roleSummaries[user.role];
  const destinations = navFor(user.role).filter((entry) => entry.to !== paths.home.path);

  return (
    <>
      <PageHeader
        eyebrow={organisation?.name ?? 'Parley'}
        title={`Welcome, ${user.name}`}
        description="Parley decodes, checks and simulates USB Power Delivery negotiations between sources and sinks."
      />

      <div className="grid gap-5 lg:grid-cols-3">
        <Card aria-labelledby="account-heading">
          <CardHeader title={<span id="account-heading">Your account</span>} />
          <CardBody>
            <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2.5 text-sm">
              <dt className="text-slate-500 dark:text-slate-400">Name</dt>
              <dd className="font-medium text-slate-900 dark:text-slate-100">{user.name}</dd>
              <dt className="text-slate-500 dark:text-slate-400">E-mail</dt>
              <dd className="truncate font-mono text-xs leading-5">{user.email}</dd>
              <dt className="text-slate-500 dark:text-slate-400">Role</dt>
              <dd>
                <Badge tone="accent" mono>
                  {user.role}
                </Badge>
              </dd>
            </dl>
          </CardBody>
        </Card>

        <Card className="lg:col-span-2" aria-labelledby="role-heading">
          <CardHeader title={<span id="role-heading">What Parley does for you as {roleLabels[user.role]}</span>} />
          <CardBody className="space-y-3">
            <p className="text-slate-700 dark:text-slate-300">{summary.lead}</p>
            <ul className="space-y-1.5">
              {summary.points.map((point) => (
                <li key={point} className="flex gap-2.5 text-slate-600 dark:text-slate-400">
                  <span aria-hidden="true" className="mt-2 size-1.5 shrink-0 rounded-full bg-amber-500" />
                  {point}
                </li>
              ))}
            </ul>
            {destinations.length > 0 && (
              <nav aria-label="Your pages" className="flex flex-wrap gap-2 pt-2">
                {destinations.map((entry) => (
                  <Link
                    key={entry.to}
                    to={entry.to}
                    className="group rounded-md border border-slate-200 px-3 py-2 hover:border-amber-400 hover:bg-amber-50/60 dark:border-slate-700 dark:hover:border-amber-500/60 dark:hover:bg-amber-400/5"
                  >
                    <span className="block text-sm font-medium text-slate-900 group-hover:text-amber-800 dark:text-slate-100 dark:group-hover:text-amber-300">
                      {entry.label} →
                    </span>
                    <span className="block text-xs text-slate-500 dark:text-slate-400">{entry.summary}</span>
                  </Link>
                ))}
              </nav>
            )}
          </CardBody>
        </Card>
      </div>

      <section aria-labelledby="devices-heading" className="mt-8">
        <div className="mb-3 flex flex-wrap items-end justify-between gap-2">
          <div>
            <h2 id="devices-heading" className="text-base font-semibold text-slate-900 dark:text-slate-50">
              Devices under test
            </h2>
            <p className="text-xs text-slate-500 dark:text-slate-400">
              The adapters and devices {organisation?.name ?? 'your organisation'} works with, and the power objects each offers or asks for.
            </p>
          </div>
        </div>
        <DevicesTable />
      </section>

      <aside
        aria-label="Safety"
        className="mt-8 flex gap-3 rounded-lg border border-orange-200 bg-orange-50/70 px-4 py-3 text-xs text-orange-900 dark:border-orange-500/25 dark:bg-orange-500/5 dark:text-orange-200"
      >
        <svg aria-hidden="true" viewBox="0 0 20 20" className="mt-0.5 size-4 shrink-0 fill-current">
          <path d="M10 1.5 19 17.5H1L10 1.5Zm-.9 6v5h1.8v-5H9.1Zm0 6.5v1.8h1.8V14H9.1Z" />
        </svg>
        <p>
          Parley simulates; it never switches power. Real adapters deliver up to 48 V and 5 A. When you work on hardware, defer to
          the USB Power Delivery specification, certified test labs and your local electrical codes.
        </p>
      </aside>
    </>
  );
}
