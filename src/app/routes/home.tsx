import { Link } from 'react-router';
import { Badge } from '../../components/badge.tsx';
import { Card, CardBody, CardHeader } from '../../components/card.tsx';
import { PageHeader } from '../../components/page-header.tsx';
import { paths } from '../../config/paths.ts';
import { DevicesTable } from '../../features/devices/components/devices-table.tsx';
import { useSession } from '../../lib/auth.ts';
import { roleLabels, type Role } from '../../lib/roles.ts';
import { navSectionsFor } from '../nav.ts';

/** What the product does for each role, in the words of the person holding it, and the pages to start with. */
const roleSummaries: Record<Role, { lead: string; points: string[]; startWith: string[] }> = {
  admin: {
    lead: 'You run Parley for your organisation, and can do everything the other roles do.',
    points: [
      'Invite people and choose their role; deactivate accounts that should no longer sign in.',
      'Read every e-mail Parley sends, such as invitations, password resets and failed-run notices.',
      'Follow the audit log, and give CI a token to post test results.',
    ],
    startWith: [paths.admin.users.path, paths.admin.outbox.path],
  },
  engineer: {
    lead: 'You build chargers, power banks and devices, and use Parley to see how they negotiate.',
    points: [
      'Simulate a negotiation on the Bench with faults injected, and watch the contract that results.',
      "Decode single messages, check a source's offers and analyse the traces you capture.",
      'Write test vectors and properties for your firmware.',
    ],
    startWith: [paths.bench.path, paths.decoder.path],
  },
  qa: {
    lead: 'You keep the library of test vectors and run it, here and in CI.',
    points: [
      'Write and revise test vectors; every save is a new revision you can compare and restore.',
      'Run the library here or post results from CI, and see what newly fails in each build.',
      'Write properties that hunt for a counterexample, and keep it as a vector.',
    ],
    startWith: [paths.library.index.path, paths.runs.index.path],
  },
  support: {
    lead: 'You help customers whose devices charge slowly or not at all.',
    points: [
      'Upload a log from the field: Parley decodes it, checks it against the USB PD rules and says what went wrong.',
      "Check an adapter's offers, decode a single message, and share a diagnosis by e-mail or as a printable report.",
      'Read the vector library to compare a report with known behaviour.',
    ],
    startWith: [paths.traces.index.path, paths.offers.path],
  },
  viewer: {
    lead: 'You can read what the team has stored; nothing you do changes it.',
    points: ['Read traces and their findings, the vector library and every run.', 'Use the Decoder, Offers and the Bench; what you try there is not saved.'],
    startWith: [paths.traces.index.path, paths.library.index.path],
  },
};

export function HomeRoute() {
  const { user, organisation } = useSession();
  const summary = roleSummaries[user.role];
  const sections = navSectionsFor(user.role).filter((section) => section.id !== 'home');

  return (
    <>
      <PageHeader
        eyebrow={organisation?.name ?? 'Parley'}
        title={`Welcome, ${user.name}`}
        description="Parley decodes, checks and simulates USB Power Delivery negotiations between sources and sinks."
      />

      <div className="grid gap-5 xl:grid-cols-3">
        <Card className="xl:col-span-2" aria-labelledby="role-heading">
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
          </CardBody>
        </Card>

        <Card aria-labelledby="account-heading">
          <CardHeader title={<span id="account-heading">Your account</span>} />
          <CardBody>
            <dl className="grid grid-cols-[auto_minmax(0,1fr)] gap-x-4 gap-y-2.5 text-sm">
              <dt className="text-slate-500 dark:text-slate-400">Name</dt>
              <dd className="font-medium text-slate-900 dark:text-slate-100">{user.name}</dd>
              <dt className="text-slate-500 dark:text-slate-400">E-mail</dt>
              <dd className="font-mono text-xs leading-5 break-all">{user.email}</dd>
              <dt className="text-slate-500 dark:text-slate-400">Role</dt>
              <dd>
                <Badge tone="accent">{roleLabels[user.role]}</Badge>
              </dd>
            </dl>
          </CardBody>
        </Card>
      </div>

      <nav aria-label="Your pages" className="mt-8 space-y-6">
        {sections.map((section) => (
          <section key={section.id} aria-labelledby={`home-${section.id}`}>
            <div className="mb-2.5 flex flex-wrap items-baseline gap-x-3">
              <h2 id={`home-${section.id}`} className="text-base font-semibold text-slate-900 dark:text-slate-50">
                {section.label}
              </h2>
              <p className="text-xs text-slate-500 dark:text-slate-400">{section.summary}</p>
            </div>
            <ul className="grid gap-3 sm:grid-cols-2 xl:grid-cols-3">
              {section.entries.map((entry) => (
                <li key={entry.to} className="flex">
                  <Link
                    to={entry.to}
                    className="group flex w-full flex-col rounded-lg border border-slate-200 bg-white px-4 py-3 shadow-xs hover:border-amber-400 hover:bg-amber-50/60 dark:border-slate-800 dark:bg-slate-900 dark:hover:border-amber-500/60 dark:hover:bg-amber-400/5"
                  >
                    <span className="flex items-center gap-2 text-sm font-medium text-slate-900 group-hover:text-amber-800 dark:text-slate-100 dark:group-hover:text-amber-300">
                      {entry.label}
                      {summary.startWith.includes(entry.to) && <Badge tone="accent">Start here</Badge>}
                      <span aria-hidden="true" className="ml-auto text-slate-400 group-hover:text-amber-600 dark:group-hover:text-amber-400">
                        →
                      </span>
                    </span>
                    <span className="mt-1 block text-xs text-slate-600 dark:text-slate-400">{entry.summary}</span>
                  </Link>
                </li>
              ))}
            </ul>
          </section>
        ))}
      </nav>

      <section aria-labelledby="devices-heading" className="mt-10">
        <div className="mb-3 flex flex-wrap items-end justify-between gap-2">
          <div>
            <h2 id="devices-heading" className="text-base font-semibold text-slate-900 dark:text-slate-50">
              Devices under test
            </h2>
            <p className="text-xs text-slate-500 dark:text-slate-400">
              The adapters and devices {organisation?.name ?? 'your organisation'} works with, and the power objects (PDOs) each offers or asks for.
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
          Parley simulates; it never switches power. Real adapters deliver up to 48 V and 5 A. When you work on hardware, defer to the USB Power Delivery specification, certified test labs and your
          local electrical codes.
        </p>
      </aside>
    </>
  );
}
