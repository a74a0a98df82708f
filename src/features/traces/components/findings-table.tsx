import { useMemo } from 'react';
import { DataTable, dataColumnHelper } from '../../../components/data-table.tsx';
import { SeverityBadge } from '../../../components/badge.tsx';
import { EmptyState } from '../../../components/empty-state.tsx';
import { RuleLink } from '../../../components/rule-link.tsx';
import type { Finding } from '../../../../shared/core/finding.ts';
import { isRuleId, ruleTitle } from '../../../../shared/rules/catalog.ts';
import { formatSeconds } from '../lib/format.ts';

export type FindingRow = Finding & { index: number };

/** Rows a page of the table shows, and asks the server for. */
export const FINDINGS_PAGE_SIZE = 25;

export type FindingsTableProps = {
  /** One page of the findings (the server's), each with its index in the whole list. */
  rows: readonly FindingRow[];
  total: number;
  pageIndex: number;
  onPageChange(pageIndex: number): void;
  selectedIndex?: number;
  /** A finding with a time was chosen: the page zooms the timeline to it. */
  onShow(index: number, tUs: number): void;
  omitted?: number;
};

/** Every finding with its rule (linked to the rule's page) and its time (linked to the timeline), a page at a time. */
export function FindingsTable({ rows: page, total, pageIndex, onPageChange, selectedIndex, onShow, omitted = 0 }: FindingsTableProps) {
  const columns = useMemo(() => {
    const col = dataColumnHelper<FindingRow>();
    return col.columns([
      col.accessor('severity', { header: 'Severity', enableSorting: false, cell: ({ getValue }) => <SeverityBadge severity={getValue()} /> }),
      col.accessor('t', {
        header: 'Time',
        enableSorting: false,
        meta: { mono: true },
        cell: ({ row }) =>
          row.original.t === undefined ? (
            row.original.line !== undefined ? (
              <span className="whitespace-nowrap">line {row.original.line}</span>
            ) : (
              '—'
            )
          ) : (
            <button
              type="button"
              className="whitespace-nowrap text-amber-800 underline decoration-dotted underline-offset-2 dark:text-amber-300"
              onClick={(event) => {
                event.stopPropagation();
                if (row.original.t !== undefined) onShow(row.original.index, row.original.t);
              }}
              aria-label={`Show ${row.original.rule} at ${formatSeconds(row.original.t)} on the timeline`}
            >
              {formatSeconds(row.original.t)}
            </button>
          ),
      }),
      col.accessor('rule', {
        header: 'Rule',
        enableSorting: false,
        // The rule's title in plain words (it wraps), its id under it as the link to the rule's page; the
        // row's own click (zoom the timeline) must not follow the link.
        cell: ({ getValue }) => {
          const rule = getValue();
          return (
            // biome-ignore lint/a11y/useKeyWithClickEvents: only keeps the row's click from following the link; the link itself is the control
            // biome-ignore lint/a11y/noStaticElementInteractions: same span, no interaction of its own
            <span onClick={(event) => event.stopPropagation()} className="block min-w-32">
              {isRuleId(rule) && <span className="block text-slate-800 dark:text-slate-200">{ruleTitle(rule)}</span>}
              <span className="whitespace-nowrap">
                <RuleLink rule={rule} />
              </span>
            </span>
          );
        },
      }),
      col.accessor('message', {
        header: 'What happened',
        enableSorting: false,
        cell: ({ row }) => (
          <span>
            {row.original.message}
            <span className="mt-0.5 block text-[11px] text-slate-500 dark:text-slate-400">{row.original.ref}</span>
          </span>
        ),
      }),
    ]);
  }, [onShow]);

  return (
    <div className="space-y-2">
      <DataTable
        label="Findings"
        dense
        columns={columns}
        data={page as FindingRow[]}
        getRowId={(row) => String(row.index)}
        selectedRowId={selectedIndex === undefined ? undefined : String(selectedIndex)}
        onRowClick={(row) => row.t !== undefined && onShow(row.index, row.t)}
        pagination={total > FINDINGS_PAGE_SIZE ? { pageIndex, pageSize: FINDINGS_PAGE_SIZE, rowCount: total, onPageChange } : undefined}
        empty={<EmptyState title="No findings" description="Every check passed on this trace." />}
      />
      {omitted > 0 && <p className="text-xs text-slate-500">{omitted} more findings were counted but not listed (the list keeps the first 5 000).</p>}
    </div>
  );
}
