import { useSearchParams } from 'react-router';
import { Badge, type BadgeTone } from '../../../components/badge.tsx';
import { DataTable, dataColumnHelper } from '../../../components/data-table.tsx';
import { EmptyState } from '../../../components/empty-state.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { formatDateTimeSeconds } from '../../../lib/format.ts';
import { useAudit, type AuditEvent } from '../api/get-audit.ts';
import { AuditDetails } from '../components/audit-details.tsx';

const pageSize = 25;
const noEvents: AuditEvent[] = [];

function toneOf(action: string): BadgeTone {
  if (action.endsWith('_failed') || action.endsWith('deactivated')) return 'warning';
  if (action.startsWith('user.')) return 'accent';
  return 'neutral';
}

function compactDetails(details: AuditEvent['details']): string {
  if (!details || Object.keys(details).length === 0) return '';
  return Object.entries(details)
    .map(([key, value]) => `${key}=${typeof value === 'string' ? value : JSON.stringify(value)}`)
    .join(' ');
}

const col = dataColumnHelper<AuditEvent>();
const columns = col.columns([
  col.accessor('at', {
    header: 'When',
    enableSorting: false,
    meta: { mono: true },
    cell: ({ getValue }) => <span className="whitespace-nowrap">{formatDateTimeSeconds(getValue())}</span>,
  }),
  col.accessor((event) => event.actor?.email ?? '', {
    id: 'actor',
    header: 'Who',
    enableSorting: false,
    cell: ({ row }) =>
      row.original.actor ? (
        <span title={row.original.actor.email}>{row.original.actor.name || row.original.actor.email}</span>
      ) : (
        <span className="text-slate-400">—</span>
      ),
  }),
  col.accessor('action', {
    header: 'Action',
    enableSorting: false,
    cell: ({ getValue }) => (
      <Badge tone={toneOf(getValue())} mono>
        {getValue()}
      </Badge>
    ),
  }),
  col.accessor('target', {
    header: 'Target',
    enableSorting: false,
    meta: { mono: true },
    cell: ({ getValue }) => getValue() ?? '—',
  }),
  col.accessor((event) => compactDetails(event.details), {
    id: 'details',
    header: 'Details',
    enableSorting: false,
    meta: { mono: true },
    cell: ({ getValue }) => <span className="line-clamp-1 max-w-56 text-slate-500 dark:text-slate-400">{getValue()}</span>,
  }),
]);

export function AuditRoute() {
  const [params, setParams] = useSearchParams();
  const page = Math.max(1, Number(params.get('page')) || 1);
  const selectedId = params.get('event');
  const audit = useAudit({ page, pageSize });
  const items = audit.data?.items ?? noEvents;
  const selected = items.find((event) => String(event.id) === selectedId) ?? null;

  const update = (changes: Record<string, string | null>) => {
    const next = new URLSearchParams(params);
    for (const [key, value] of Object.entries(changes)) {
      if (value === null) next.delete(key);
      else next.set(key, value);
    }
    setParams(next);
  };

  return (
    <>
      <PageHeader eyebrow="Admin" title="Audit log" description="Sign-ins and account changes, newest first. Entries cannot be edited." />
      <div className="grid items-start gap-6 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        {audit.isError ? (
          <ErrorMessage title="The audit log could not be loaded" error={audit.error} />
        ) : (
          <DataTable
            label="Audit log"
            dense
            columns={columns}
            data={items}
            getRowId={(event) => String(event.id)}
            isLoading={audit.isPending}
            onRowClick={(event) => update({ event: String(event.id) })}
            selectedRowId={selectedId ?? undefined}
            pagination={{
              pageIndex: page - 1,
              pageSize,
              rowCount: audit.data?.total ?? 0,
              onPageChange: (pageIndex) => update({ page: pageIndex > 0 ? String(pageIndex + 1) : null, event: null }),
            }}
            empty={<EmptyState title="Nothing recorded yet" />}
          />
        )}
        <AuditDetails event={selected} />
      </div>
    </>
  );
}
