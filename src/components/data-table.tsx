import { useState, type ReactNode } from 'react';
import {
  createColumnHelper,
  createSortedRowModel,
  metaHelper,
  rowPaginationFeature,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  sortFn_datetime,
  sortFn_text,
  tableFeatures,
  useTable,
  type ColumnDef,
  type PaginationState,
  type RowData,
  type SortingState,
} from '@tanstack/react-table';
import { cn } from '../lib/cn.ts';
import { Button } from './button.tsx';
import { EmptyState } from './empty-state.tsx';

/** Per-column presentation hints. */
export type DataColumnMeta = {
  align?: 'start' | 'end';
  /** Monospace cells (numbers, ids, hex). */
  mono?: boolean;
  /** Tailwind width class for the column, e.g. 'w-32'. */
  widthClass?: string;
};

/** One feature set for every table in the app (TanStack Table v9 registers features explicitly). */
export const dataTableFeatures = tableFeatures({
  rowSortingFeature,
  sortedRowModel: createSortedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, text: sortFn_text, datetime: sortFn_datetime, basic: sortFn_basic },
  rowPaginationFeature,
  columnMeta: metaHelper<DataColumnMeta>(),
});

export type DataTableFeatures = typeof dataTableFeatures;

/** Column helper bound to the app's feature set: `const col = dataColumnHelper<Row>()`. */
export function dataColumnHelper<TData extends RowData>() {
  return createColumnHelper<DataTableFeatures, TData>();
}

// biome-ignore lint/suspicious/noExplicitAny: cell values differ per column; the helper's `columns([...])` keeps each accessor's own type
export type DataColumns<TData extends RowData> = Array<ColumnDef<DataTableFeatures, TData, any>>;

/** Server-side pages: the table shows `data` as the current page of `rowCount` rows. */
export type ServerPagination = {
  pageIndex: number;
  pageSize: number;
  rowCount: number;
  onPageChange: (pageIndex: number) => void;
};

export type DataTableProps<TData extends RowData> = {
  /** Stable (module scope or memoised): a new array every render re-runs the row models. */
  columns: DataColumns<TData>;
  /** Stable as well; pass a module-level empty array while loading. */
  data: TData[];
  /** Names the table for assistive technology. */
  label: string;
  getRowId?: (row: TData) => string;
  pagination?: ServerPagination;
  /** Sorting the server does: the table only reports the wanted order. */
  serverSorting?: { sorting: SortingState; onSortingChange: (sorting: SortingState) => void };
  initialSorting?: SortingState;
  onRowClick?: (row: TData) => void;
  selectedRowId?: string;
  isLoading?: boolean;
  empty?: ReactNode;
  className?: string;
  dense?: boolean;
};

const noPagination: PaginationState = { pageIndex: 0, pageSize: 1_000_000 };

export function DataTable<TData extends RowData>({
  columns,
  data,
  label,
  getRowId,
  pagination,
  serverSorting,
  initialSorting,
  onRowClick,
  selectedRowId,
  isLoading,
  empty,
  className,
  dense,
}: DataTableProps<TData>) {
  const [localSorting, setLocalSorting] = useState<SortingState>(initialSorting ?? []);
  const sorting = serverSorting?.sorting ?? localSorting;

  const table = useTable({
    features: dataTableFeatures,
    columns,
    data,
    getRowId: getRowId ? (row: TData) => getRowId(row) : undefined,
    manualSorting: Boolean(serverSorting),
    manualPagination: true,
    rowCount: pagination?.rowCount,
    state: {
      sorting,
      pagination: pagination ? { pageIndex: pagination.pageIndex, pageSize: pagination.pageSize } : noPagination,
    },
    onSortingChange: (updater) => {
      const next = typeof updater === 'function' ? updater(sorting) : updater;
      if (serverSorting) serverSorting.onSortingChange(next);
      else setLocalSorting(next);
    },
    onPaginationChange: (updater) => {
      if (!pagination) return;
      const current = { pageIndex: pagination.pageIndex, pageSize: pagination.pageSize };
      const next = typeof updater === 'function' ? updater(current) : updater;
      pagination.onPageChange(next.pageIndex);
    },
  });

  const rows = table.getRowModel().rows;
  const cellPadding = dense ? 'px-3 py-1.5' : 'px-4 py-2.5';

  return (
    <div className={cn('overflow-hidden rounded-lg border border-slate-200 dark:border-slate-800', className)}>
      <div className="overflow-x-auto">
        <table aria-label={label} aria-busy={isLoading || undefined} className="w-full border-collapse text-left text-sm">
          <thead className="bg-slate-50 dark:bg-slate-900/60">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} className="border-b border-slate-200 dark:border-slate-800">
                {group.headers.map((header) => {
                  const meta = header.column.columnDef.meta;
                  const sorted = header.column.getIsSorted();
                  const canSort = header.column.getCanSort();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                      className={cn(
                        cellPadding,
                        'text-[11px] font-semibold tracking-wide whitespace-nowrap text-slate-500 uppercase dark:text-slate-400',
                        meta?.align === 'end' && 'text-right',
                        meta?.widthClass,
                      )}
                    >
                      {header.isPlaceholder ? null : canSort ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className={cn('inline-flex items-center gap-1 uppercase hover:text-slate-900 dark:hover:text-slate-100', meta?.align === 'end' && 'flex-row-reverse')}
                        >
                          <table.FlexRender header={header} />
                          <SortGlyph direction={sorted} />
                        </button>
                      ) : (
                        <table.FlexRender header={header} />
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody className="divide-y divide-slate-100 bg-white dark:divide-slate-800/80 dark:bg-slate-900">
            {rows.map((row) => {
              const selected = selectedRowId !== undefined && row.id === selectedRowId;
              return (
                <tr
                  key={row.id}
                  aria-current={selected ? 'true' : undefined}
                  tabIndex={onRowClick ? 0 : undefined}
                  onClick={onRowClick ? () => onRowClick(row.original) : undefined}
                  onKeyDown={
                    onRowClick
                      ? (event) => {
                          if (event.target !== event.currentTarget) return;
                          if (event.key === 'Enter' || event.key === ' ') {
                            event.preventDefault();
                            onRowClick(row.original);
                          }
                        }
                      : undefined
                  }
                  className={cn(
                    'align-top',
                    onRowClick && 'cursor-pointer hover:bg-slate-50 focus-visible:-outline-offset-2 dark:hover:bg-slate-800/60',
                    selected && 'bg-amber-50 shadow-[inset_3px_0_0_var(--color-amber-500)] hover:bg-amber-50 dark:bg-amber-400/10 dark:hover:bg-amber-400/10',
                  )}
                >
                  {row.getAllCells().map((cell) => {
                    const meta = cell.column.columnDef.meta;
                    return (
                      <td key={cell.id} className={cn(cellPadding, 'text-slate-700 dark:text-slate-300', meta?.align === 'end' && 'text-right', meta?.mono && 'font-mono text-xs tabular')}>
                        <table.FlexRender cell={cell} />
                      </td>
                    );
                  })}
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {rows.length === 0 && (
        <div className="bg-white p-4 dark:bg-slate-900">
          {isLoading ? (
            <p className="py-6 text-center text-xs text-slate-500" role="status">
              Loading…
            </p>
          ) : (
            (empty ?? <EmptyState title="Nothing here yet" />)
          )}
        </div>
      )}
      {/* An empty table says so above; "0–0 of 0" would only repeat it. */}
      {pagination && pagination.rowCount > 0 && <Pager table={table} pagination={pagination} />}
    </div>
  );
}

function SortGlyph({ direction }: { direction: false | 'asc' | 'desc' }) {
  return (
    <svg aria-hidden="true" viewBox="0 0 8 12" className="h-3 w-2">
      <path d="M4 1 7 5H1z" className={direction === 'asc' ? 'fill-amber-500' : 'fill-current opacity-30'} />
      <path d="M4 11 1 7h6z" className={direction === 'desc' ? 'fill-amber-500' : 'fill-current opacity-30'} />
    </svg>
  );
}

type PagerTable = { getCanPreviousPage: () => boolean; getCanNextPage: () => boolean; getPageCount: () => number; previousPage: () => void; nextPage: () => void };

function Pager({ table, pagination }: { table: PagerTable; pagination: ServerPagination }) {
  const { pageIndex, pageSize, rowCount } = pagination;
  const first = rowCount === 0 ? 0 : pageIndex * pageSize + 1;
  const last = Math.min(rowCount, (pageIndex + 1) * pageSize);
  const pageCount = Math.max(1, table.getPageCount());
  return (
    <nav
      aria-label={`Pages`}
      className="flex items-center justify-between gap-3 border-t border-slate-200 bg-slate-50 px-4 py-2 text-xs text-slate-600 dark:border-slate-800 dark:bg-slate-900/60 dark:text-slate-400"
    >
      <p className="font-mono tabular">
        {first}–{last} of {rowCount} · page {pageIndex + 1}/{pageCount}
      </p>
      <div className="flex gap-2">
        <Button size="sm" variant="secondary" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
          Previous
        </Button>
        <Button size="sm" variant="secondary" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
          Next
        </Button>
      </div>
    </nav>
  );
}
