import { useNavigate, useSearchParams } from 'react-router';
import { Badge } from '../../../components/badge.tsx';
import { DataTable, dataColumnHelper } from '../../../components/data-table.tsx';
import { EmptyState } from '../../../components/empty-state.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { Select } from '../../../components/select.tsx';
import { paths } from '../../../config/paths.ts';
import { formatDateTime } from '../../../lib/format.ts';
import { useRuns } from '../api/get-runs.ts';
import type { Run } from '../../../../shared/api/index.ts';
import { RunCounts } from '../components/run-counts.tsx';

const pageSize = 25;
const noRuns: Run[] = [];

const col = dataColumnHelper<Run>();
const columns = col.columns([
  col.accessor('id', { header: 'Run', enableSorting: false, meta: { mono: true }, cell: ({ getValue }) => `#${getValue()}` }),
  col.accessor('createdAt', { header: 'When', enableSorting: false, meta: { mono: true }, cell: ({ getValue }) => <span className="whitespace-nowrap">{formatDateTime(getValue())}</span> }),
  col.accessor('project', { header: 'Project', enableSorting: false, meta: { mono: true } }),
  col.accessor('build', { header: 'Build', enableSorting: false, meta: { mono: true }, cell: ({ getValue }) => getValue() ?? <span className="text-slate-400">—</span> }),
  col.accessor('source', {
    header: 'From',
    enableSorting: false,
    cell: ({ row }) => (
      <span className="flex flex-col">
        <Badge tone={row.original.source === 'ci' ? 'info' : row.original.kind === 'sweep' ? 'accent' : 'neutral'}>
          {row.original.source === 'ci' ? 'CI' : row.original.kind === 'sweep' ? 'Fault sweep' : 'Library'}
        </Badge>
        <span className="mt-0.5 text-xs text-slate-500">{row.original.startedBy}</span>
      </span>
    ),
  }),
  col.accessor('selection', { header: 'What', enableSorting: false, cell: ({ getValue }) => <span className="line-clamp-1 max-w-48 text-xs">{getValue()}</span> }),
  col.accessor('failed', { header: 'Result', enableSorting: false, cell: ({ row }) => <RunCounts run={row.original} /> }),
]);

export function RunsRoute() {
  const [params, setParams] = useSearchParams();
  const navigate = useNavigate();
  const project = params.get('project') ?? '';
  const source = params.get('source') ?? '';
  const page = Math.max(1, Number(params.get('page')) || 1);
  const runs = useRuns({ project: project || undefined, source: source || undefined, page, pageSize });
  const update = (key: string, value: string) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    if (key !== 'page') next.delete('page');
    setParams(next, { replace: true });
  };
  return (
    <>
      <PageHeader eyebrow="Test" title="Runs" description="Every run of the library, started here or posted by CI for a firmware build, newest first." />
      <div className="mb-4 flex flex-wrap gap-3">
        <Select
          label="Project"
          className="w-56"
          value={project}
          onChange={(e) => update('project', e.target.value)}
          options={[{ value: '', label: 'Every project' }, ...(runs.data?.projects ?? []).map((p) => ({ value: p, label: p }))]}
        />
        <Select
          label="From"
          className="w-40"
          value={source}
          onChange={(e) => update('source', e.target.value)}
          options={[
            { value: '', label: 'Library and CI' },
            { value: 'ui', label: 'Library' },
            { value: 'ci', label: 'CI' },
          ]}
        />
      </div>
      {runs.isError ? (
        <ErrorMessage title="The runs could not be loaded" error={runs.error} />
      ) : (
        <DataTable
          label="Runs"
          dense
          columns={columns}
          data={runs.data?.items ?? noRuns}
          getRowId={(r) => String(r.id)}
          isLoading={runs.isPending}
          onRowClick={(r) => navigate(paths.runs.detail.getHref(r.id))}
          pagination={{ pageIndex: page - 1, pageSize, rowCount: runs.data?.total ?? 0, onPageChange: (index) => update('page', index > 0 ? String(index + 1) : '') }}
          empty={<EmptyState title="No runs yet" description="Run vectors from the Library, or post a JUnit report from CI with an API token." />}
        />
      )}
    </>
  );
}
