import { useMemo, useState } from 'react';
import { DataTable, dataColumnHelper } from '../../../components/data-table.tsx';
import type { Analysis } from '../../../../shared/api/index.ts';
import { contractLabel, formatPower, formatSeconds } from '../lib/format.ts';

type ContractRow = Analysis['contracts'][number] & { index: number; untilUs: number };

const pageSize = 25;
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
 * Each contract change at its PS_RDY, in order: what the sink got and for how long. Paged like the
 * findings (a source that steps a programmable supply every 500 ms makes thousands of contracts).
 */
export function ContractsTable({ contracts, endUs }: { contracts: Analysis['contracts']; endUs: number }) {
  const [pageIndex, setPageIndex] = useState(0);
  const page = useMemo(
    () =>
      contracts.slice(pageIndex * pageSize, (pageIndex + 1) * pageSize).map((c, offset) => {
        const index = pageIndex * pageSize + offset;
        return { ...c, index, untilUs: contracts[index + 1]?.t ?? endUs };
      }),
    [contracts, pageIndex, endUs],
  );
  if (contracts.length === 0) return <p className="text-sm text-slate-600 dark:text-slate-400">No contract was reached: the source and sink never finished a negotiation.</p>;
  return (
    <DataTable
      label="Contracts over time"
      dense
      columns={columns}
      data={page}
      getRowId={(row) => String(row.index)}
      pagination={contracts.length > pageSize ? { pageIndex, pageSize, rowCount: contracts.length, onPageChange: setPageIndex } : undefined}
    />
  );
}
