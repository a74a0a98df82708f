import { useState } from 'react';
import { useParams, useSearchParams } from 'react-router';
import { Badge } from '../../../components/badge.tsx';
import { ButtonLink } from '../../../components/button.tsx';
import { DataTable, dataColumnHelper } from '../../../components/data-table.tsx';
import { EmptyState } from '../../../components/empty-state.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { paths } from '../../../config/paths.ts';
import { formatDateTime } from '../../../lib/format.ts';
import { useRun } from '../api/get-run.ts';
import type { RunResult } from '../../../../shared/api/index.ts';
import { FailureDetail } from '../components/failure-detail.tsx';
import { RunCounts } from '../components/run-counts.tsx';
import { SweepRunSummary } from '../components/sweep-run-summary.tsx';

const noResults: RunResult[] = [];
const pageSize = 50;

const col = dataColumnHelper<RunResult>();
const columns = col.columns([
  col.accessor('ok', {
    header: 'Result',
    cell: ({ row }) => (
      <span className="flex items-center gap-1">
        <Badge tone={row.original.ok ? 'success' : 'error'} dot>
          {row.original.ok ? 'pass' : 'fail'}
        </Badge>
        {row.original.newFailure && <Badge tone="warning">new</Badge>}
      </span>
    ),
  }),
  col.accessor('vectorId', {
    header: 'Vector',
    cell: ({ row }) => (
      <div className="min-w-0">
        <p className="font-mono text-xs text-slate-900 dark:text-slate-100">{row.original.vectorId}</p>
        {row.original.message && <p className="mt-0.5 line-clamp-2 font-mono text-[11px] text-red-700 dark:text-red-300">{row.original.message}</p>}
      </div>
    ),
  }),
  col.accessor((r) => r.kind ?? '', { id: 'kind', header: 'Kind', cell: ({ getValue }) => (getValue() ? <Badge mono>{getValue()}</Badge> : <span className="text-slate-400">—</span>) }),
  col.accessor('durationMs', { header: 'ms', meta: { align: 'end', mono: true }, cell: ({ getValue }) => getValue().toFixed(1) }),
]);

export function RunDetailRoute() {
  const { runId } = useParams();
  const id = Number(runId);
  const run = useRun(Number.isInteger(id) && id > 0 ? id : 0);
  const [params, setParams] = useSearchParams();
  const selectedId = params.get('result');
  const [onlyFailures, setOnlyFailures] = useState(false);
  const [page, setPage] = useState(0);
  if (run.isPending)
    return (
      <p className="text-sm text-slate-500" role="status">
        Loading the run…
      </p>
    );
  if (run.isError) return <ErrorMessage title="The run could not be loaded" error={run.error} action={<ButtonLink to={paths.runs.index.getHref()}>All runs</ButtonLink>} />;
  const { run: summary, results } = run.data;
  const selected = results.find((r) => r.vectorId === selectedId) ?? results.find((r) => !r.ok) ?? null;
  const shown = onlyFailures ? results.filter((r) => !r.ok) : results;
  const pageIndex = Math.min(page, Math.max(0, Math.ceil(shown.length / pageSize) - 1));
  const pageRows = shown.slice(pageIndex * pageSize, (pageIndex + 1) * pageSize);
  return (
    <>
      <PageHeader
        eyebrow={summary.kind === 'sweep' ? 'Fault sweep on the server' : summary.source === 'ci' ? 'Posted by CI' : 'Library run'}
        title={`Run #${summary.id} · ${summary.project}${summary.build ? ` · ${summary.build}` : ''}`}
        description={
          <>
            {summary.selection} · {summary.startedBy} · {formatDateTime(summary.createdAt)}
            {summary.finishedAt ? '' : ' · still running'}
          </>
        }
        actions={<ButtonLink to={paths.runs.index.getHref(summary.project)}>Runs of {summary.project}</ButtonLink>}
      />
      <div className="mb-4 flex flex-wrap items-center justify-between gap-3">
        <RunCounts run={summary} />
        <label className="inline-flex items-center gap-2 text-sm text-slate-700 dark:text-slate-300">
          <input
            type="checkbox"
            className="size-4 accent-amber-500"
            checked={onlyFailures}
            onChange={(event) => {
              setOnlyFailures(event.target.checked);
              setPage(0);
            }}
          />
          Failures only
        </label>
      </div>
      {summary.error && <ErrorMessage className="mb-4" title="The run stopped" error={new Error(summary.error)} />}
      <SweepRunSummary run={summary} />
      <div className="grid items-start gap-6 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <DataTable
          label="Results"
          dense
          columns={columns}
          data={pageRows.length > 0 ? pageRows : noResults}
          pagination={{ pageIndex, pageSize, rowCount: shown.length, onPageChange: setPage }}
          empty={
            <EmptyState
              title={
                summary.kind === 'sweep'
                  ? summary.status === 'running'
                    ? 'Broken runs are listed when the sweep ends'
                    : 'No run broke an invariant'
                  : onlyFailures
                    ? 'No failures in this run'
                    : 'No results'
              }
            />
          }
          getRowId={(r) => r.vectorId}
          selectedRowId={selected?.vectorId}
          onRowClick={(r) => {
            const next = new URLSearchParams(params);
            next.set('result', r.vectorId);
            setParams(next, { replace: true });
          }}
        />
        <div className="xl:sticky xl:top-4">
          <FailureDetail result={selected} />
        </div>
      </div>
    </>
  );
}
