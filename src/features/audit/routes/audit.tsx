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
import { actionLabel, labelledActions } from '../lib/action-labels.ts';
import { Input } from '../../../components/input.tsx';

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
  const { params, page, selectedId, update } = useListParams('event');
  const filters = { action: params.get('action') ?? '', actor: params.get('actor') ?? '', target: params.get('target') ?? '' };
  const audit = useAudit({ page, pageSize, ...Object.fromEntries(Object.entries(filters).filter(([, value]) => value !== '')) });
  const items = audit.data?.items ?? noEvents;
  const selected = items.find((event) => String(event.id) === selectedId) ?? null;

  return (
    <>
      <PageHeader
        eyebrow="Admin"
        title="Audit log"
        description="Sign-ins, account changes and what was done to traces, vectors and API tokens, newest first. Pick a line for its details. Entries cannot be edited."
      />
      <form role="search" aria-label="Filter the audit log" className="mb-4 flex flex-wrap items-end gap-3" onSubmit={(event) => event.preventDefault()}>
        <label className="flex flex-col gap-1 text-xs font-medium text-slate-700 dark:text-slate-300">
          Action
          <select
            value={filters.action}
            onChange={(event) => update({ action: event.target.value || null, page: null, event: null })}
            className="h-9 rounded-md border border-slate-300 bg-white px-2 text-sm dark:border-slate-700 dark:bg-slate-950"
          >
            <option value="">Every action</option>
            <option value="vector.">Vector changes (created, edited, restored, deleted, imported)</option>
            <option value="trace.">Traces</option>
            <option value="user.">Users</option>
            <option value="auth.">Sign-ins</option>
            <option value="token.">API tokens</option>
            {labelledActions.map((action) => (
              <option key={action} value={action}>
                {actionLabel(action)} ({action})
              </option>
            ))}
          </select>
        </label>
        <Input label="Who (e-mail)" className="w-56" defaultValue={filters.actor} onChange={(event) => update({ actor: event.target.value.trim() || null, page: null, event: null })} />
        <Input
          label="Target"
          className="w-56"
          placeholder="vector:caps/…"
          defaultValue={filters.target}
          onChange={(event) => update({ target: event.target.value.trim() || null, page: null, event: null })}
        />
      </form>
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
            empty={<EmptyState title={Object.values(filters).some(Boolean) ? 'Nothing matches these filters' : 'Nothing recorded yet'} />}
          />
        )}
        <AuditDetails event={selected} />
      </div>
    </>
  );
}
