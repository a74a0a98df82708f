import { useMemo } from 'react';
import { DataTable, dataColumnHelper } from '../../../components/data-table.tsx';
import type { IndexedContract } from '../../../../shared/api/index.ts';
import { contractLabel, formatPower, formatSeconds } from '../lib/format.ts';

type ContractRow = IndexedContract & { untilUs: number };

/** Rows a page of the table shows, and asks the server for. */
export const CONTRACTS_PAGE_SIZE = 25;

export type ContractsTableProps = {
  rows: readonly IndexedContract[];
  /** When the page's last contract ended: the next page's first, or the end of the trace. */
  nextUs: number;
  total: number;
  pageIndex: number;
  onPageChange(pageIndex: number): void;
};
const col = dataColumnHelper<ContractRow>();
const columns = col.columns([
  col.accessor('t', {
    header: 'In force',
    enableSorting: false,
    meta: { mono: true },
    cell: ({ row }) => (
      <span className="whitespace-nowrap">
        {formatSeconds(row.original.t)}
        <span className="block text-slate-500">to {formatSeconds(row.original.untilUs)}</span>
      </span>
    ),
  }),
  col.accessor('voltageMv', {
    header: 'Contract',
    enableSorting: false,
    cell: ({ row }) => (
      <span>
        <span className="font-medium whitespace-nowrap text-slate-900 dark:text-slate-100">{contractLabel(row.original)}</span>
        <span className="block text-xs text-slate-500">
          {row.original.kind}, object {row.original.objectPosition}
        </span>
      </span>
    ),
  }),
  col.accessor('powerMw', { header: 'Power', enableSorting: false, meta: { align: 'end', mono: true }, cell: ({ getValue }) => <span className="whitespace-nowrap">{formatPower(getValue())}</span> }),
]);

/**
 * Each contract change at its PS_RDY, in order: what the sink got and for how long. Paged by the
 * server (a source that steps a programmable supply every 500 ms makes thousands of contracts);
 * the last row's end is the next page's first contract.
 */
export function ContractsTable({ rows, nextUs, total, pageIndex, onPageChange }: ContractsTableProps) {
  const page = useMemo(() => rows.map((c, offset) => ({ ...c, untilUs: rows[offset + 1]?.t ?? nextUs })), [rows, nextUs]);
  if (total === 0) return <p className="text-sm text-slate-600 dark:text-slate-400">No contract was reached: the source and sink never finished a negotiation.</p>;
  return (
    <DataTable
      label="Contracts over time"
      dense
      columns={columns}
      data={page}
      getRowId={(row) => String(row.index)}
      pagination={total > CONTRACTS_PAGE_SIZE ? { pageIndex, pageSize: CONTRACTS_PAGE_SIZE, rowCount: total, onPageChange } : undefined}
    />
  );
}
