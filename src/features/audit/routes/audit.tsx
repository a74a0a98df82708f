import { Badge, type BadgeTone } from '../../../components/badge.tsx';
import { DataTable, dataColumnHelper } from '../../../components/data-table.tsx';
import { EmptyState } from '../../../components/empty-state.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { formatDateTimeSeconds } from '../../../lib/format.ts';
import { pageParam } from '../../../lib/list-params.ts';
import { useListParams } from '../../../lib/use-list-params.ts';
import { useAudit, type AuditEvent } from '../api/get-audit.ts';
import { AuditDetails } from '../components/audit-details.tsx';
import { actionLabel } from '../lib/action-labels.ts';

const pageSize = 25;
const noEvents: AuditEvent[] = [];

function toneOf(action: string): BadgeTone {
  if (action.endsWith('_failed') || action.endsWith('deactivated') || action.endsWith('deleted') || action.endsWith('revoked')) return 'warning';
  if (action.startsWith('user.')) return 'accent';
  return 'neutral';
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
    cell: ({ row }) => (row.original.actor ? <span title={row.original.actor.email}>{row.original.actor.name || row.original.actor.email}</span> : <span className="text-slate-400">—</span>),
  }),
  col.accessor('action', {
    header: 'Action',
    enableSorting: false,
    cell: ({ getValue }) => (
      <span className="flex flex-col items-start gap-0.5">
        <Badge tone={toneOf(getValue())}>{actionLabel(getValue())}</Badge>
        <span className="font-mono text-[11px] text-slate-500 dark:text-slate-400">{getValue()}</span>
      </span>
    ),
  }),
  col.accessor('target', {
    header: 'Target',
    enableSorting: false,
    meta: { mono: true },
    cell: ({ getValue }) => <span className="break-words">{getValue() ?? '—'}</span>,
  }),
]);

export function AuditRoute() {
  const { page, selectedId, update } = useListParams('event');
  const audit = useAudit({ page, pageSize });
  const items = audit.data?.items ?? noEvents;
  const selected = items.find((event) => String(event.id) === selectedId) ?? null;

  return (
    <>
      <PageHeader
        eyebrow="Admin"
        title="Audit log"
        description="Sign-ins, account changes and what was done to traces, vectors and API tokens, newest first. Pick a line for its details. Entries cannot be edited."
      />
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
              onPageChange: (pageIndex) => update({ page: pageParam(pageIndex), event: null }),
            }}
            empty={<EmptyState title="Nothing recorded yet" />}
          />
        )}
        <AuditDetails event={selected} />
      </div>
    </>
  );
}
