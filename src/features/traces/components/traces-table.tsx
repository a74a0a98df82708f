import { Badge } from '../../../components/badge.tsx';
import { DataTable, dataColumnHelper } from '../../../components/data-table.tsx';
import { EmptyState } from '../../../components/empty-state.tsx';
import { formatDateTime } from '../../../lib/format.ts';
import type { TraceItem } from '../../../../shared/api/index.ts';
import { formatBytes } from '../lib/format.ts';

const col = dataColumnHelper<TraceItem>();

export function FindingCounts({ item }: { item: Pick<TraceItem, 'status' | 'counts' | 'error'> }) {
  if (item.status === 'queued' || item.status === 'analysing') return <Badge tone="accent">analysing</Badge>;
  if (item.status === 'failed') return <Badge tone="error">analysis failed</Badge>;
  const { error, warning } = item.counts;
  if (error + warning === 0)
    return (
      <Badge tone="success" dot>
        clean
      </Badge>
    );
  return (
    <span className="inline-flex flex-wrap gap-1">
      {error > 0 && (
        <Badge tone="error" dot>
          {error} error{error === 1 ? '' : 's'}
        </Badge>
      )}
      {warning > 0 && (
        <Badge tone="warning" dot>
          {warning} warning{warning === 1 ? '' : 's'}
        </Badge>
      )}
    </span>
  );
}

const columns = col.columns([
  col.accessor('title', {
    header: 'Trace',
    cell: ({ row }) => (
      <div className="min-w-0">
        <p className="font-medium text-slate-900 dark:text-slate-100">{row.original.title}</p>
        <p className="line-clamp-2 max-w-xl text-xs text-slate-500 dark:text-slate-400">{row.original.summary ?? row.original.error?.message ?? 'Waiting for the analysis…'}</p>
      </div>
    ),
  }),
  col.accessor((item) => item.device?.name ?? '', {
    id: 'device',
    header: 'Device',
    enableSorting: false,
    cell: ({ row }) => <span className="text-xs whitespace-nowrap">{row.original.device?.name ?? '—'}</span>,
  }),
  col.accessor((item) => item.counts.error, {
    id: 'errors',
    header: 'Findings',
    cell: ({ row }) => <FindingCounts item={row.original} />,
  }),
  col.accessor('customerRef', {
    header: 'Customer ref.',
    enableSorting: false,
    meta: { mono: true },
    cell: ({ getValue }) => getValue() || '—',
  }),
  col.accessor('createdAt', {
    header: 'Uploaded',
    meta: { mono: true },
    cell: ({ row }) => (
      <span className="whitespace-nowrap">
        {formatDateTime(row.original.createdAt)}
        <br />
        <span className="font-sans text-slate-500">{row.original.uploader.name}</span>
      </span>
    ),
  }),
  col.accessor('sizeBytes', {
    header: 'Size',
    meta: { mono: true, align: 'end' },
    cell: ({ row }) => (
      <span className="whitespace-nowrap">
        {formatBytes(row.original.sizeBytes)}
        <br />
        <span className="text-slate-500">{row.original.format}</span>
      </span>
    ),
  }),
]);

export type TracesTableProps = {
  items: TraceItem[];
  total: number;
  isLoading: boolean;
  pageIndex: number;
  pageSize: number;
  sort: string;
  onSortChange(sort: string): void;
  onPageChange(pageIndex: number): void;
  onOpen(item: TraceItem): void;
  filtered: boolean;
};

export function TracesTable({ items, total, isLoading, pageIndex, pageSize, sort, onSortChange, onPageChange, onOpen, filtered }: TracesTableProps) {
  const desc = sort.startsWith('-');
  const id = sort.replace(/^-/, '');
  const sortingId = id === 'sizeBytes' ? 'sizeBytes' : id === 'errors' ? 'errors' : id === 'title' ? 'title' : 'createdAt';
  return (
    <DataTable
      label="Traces"
      columns={columns}
      data={items}
      getRowId={(item) => String(item.id)}
      isLoading={isLoading}
      onRowClick={onOpen}
      serverSorting={{
        sorting: [{ id: sortingId, desc }],
        onSortingChange: (next) => {
          const first = next[0];
          onSortChange(first ? `${first.desc ? '-' : ''}${first.id}` : '-createdAt');
        },
      }}
      pagination={{ pageIndex, pageSize, rowCount: total, onPageChange }}
      empty={
        <EmptyState
          title={filtered ? 'No trace matches these filters' : 'No traces yet'}
          description={filtered ? 'Clear a filter or search for something else.' : 'Upload a log from a customer or the lab to have it decoded and checked.'}
        />
      }
    />
  );
}
