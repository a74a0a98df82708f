import { roleGroups, type Role } from '../../../lib/roles.ts';
import { createContext, useContext, useEffect, useRef, useState } from 'react';
import { useNavigate, useSearchParams } from 'react-router';
import type { SortingState } from '@tanstack/react-table';
import { Badge } from '../../../components/badge.tsx';
import { Button, ButtonLink, buttonClasses } from '../../../components/button.tsx';
import { DataTable, dataColumnHelper } from '../../../components/data-table.tsx';
import { EmptyState } from '../../../components/empty-state.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { Input } from '../../../components/input.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { Select } from '../../../components/select.tsx';
import { paths } from '../../../config/paths.ts';
import { useUser } from '../../../lib/auth.ts';
import { formatDateTime } from '../../../lib/format.ts';
import { useDevices } from '../../../lib/api/get-devices.ts';
import { exportHref, useVectors } from '../api/get-vectors.ts';
import { useImportVectors } from '../api/import-vectors.ts';
import { useStartRun, type StartRunInput } from '../api/start-run.ts';
import type { VectorFilter, VectorListItem } from '../../../../shared/api/index.ts';
import { RunPanel } from '../components/run-panel.tsx';
import { vectorKinds } from '../lib/vector-model.ts';

const pageSize = 25;
const noVectors: VectorListItem[] = [];
const writers: readonly Role[] = roleGroups.editors;

/** The page's selection, read by the checkbox cells (columns stay at module scope). */
const SelectionContext = createContext<{ selected: ReadonlySet<string>; toggle(id: string): void }>({ selected: new Set(), toggle() {} });

function SelectCell({ id }: { id: string }) {
  const { selected, toggle } = useContext(SelectionContext);
  return <input type="checkbox" aria-label={`Select ${id}`} className="size-4 accent-amber-500" checked={selected.has(id)} onClick={(event) => event.stopPropagation()} onChange={() => toggle(id)} />;
}

const col = dataColumnHelper<VectorListItem>();
const columns = col.columns([
  col.display({ id: 'select', header: () => <span className="sr-only">Select</span>, cell: ({ row }) => <SelectCell id={row.original.id} />, meta: { widthClass: 'w-8' } }),
  col.accessor('id', {
    header: 'Vector',
    cell: ({ row }) => (
      <div className="min-w-0">
        <p className="font-mono text-xs text-slate-900 dark:text-slate-100">{row.original.id}</p>
        <p className="mt-0.5 line-clamp-1 text-xs text-slate-500 dark:text-slate-400">{row.original.title}</p>
      </div>
    ),
  }),
  col.accessor('kind', { header: 'Kind', cell: ({ getValue }) => <Badge mono>{getValue()}</Badge> }),
  col.accessor((v) => v.tags.join(' '), {
    id: 'tags',
    header: 'Tags',
    enableSorting: false,
    cell: ({ row }) => (
      <span className="flex flex-wrap gap-1">
        {row.original.tags.map((t) => (
          <Badge key={t} tone="accent">
            {t}
          </Badge>
        ))}
      </span>
    ),
  }),
  col.accessor((v) => v.device?.name ?? '', { id: 'device', header: 'Device', enableSorting: false, cell: ({ getValue }) => getValue() || <span className="text-slate-400">—</span> }),
  col.accessor((v) => (v.lastResult ? (v.lastResult.ok ? 'pass' : 'fail') : ''), {
    id: 'last',
    header: 'Last run',
    enableSorting: false,
    cell: ({ row }) =>
      row.original.lastResult ? (
        <Badge tone={row.original.lastResult.ok ? 'success' : 'error'} dot>
          {row.original.lastResult.ok ? 'pass' : 'fail'}
        </Badge>
      ) : (
        <span className="text-slate-400">—</span>
      ),
  }),
  col.accessor('revision', { header: 'Rev', meta: { align: 'end', mono: true } }),
  col.accessor('updatedAt', {
    header: 'Saved',
    meta: { mono: true },
    cell: ({ row }) => (
      <span className="whitespace-nowrap" title={`by ${row.original.updatedBy.name}`}>
        {formatDateTime(row.original.updatedAt)}
      </span>
    ),
  }),
]);

function sortParam(sorting: SortingState): string {
  const first = sorting[0];
  if (!first) return 'id';
  return `${first.desc ? '-' : ''}${first.id}`;
}

function sortingOf(sort: string): SortingState {
  return [{ id: sort.replace(/^-/, ''), desc: sort.startsWith('-') }];
}

export function LibraryRoute() {
  const user = useUser();
  const canWrite = writers.includes(user.role);
  const navigate = useNavigate();
  const [params, setParams] = useSearchParams();
  const filter: VectorFilter = {
    q: params.get('q') ?? undefined,
    kind: params.get('kind') ?? undefined,
    tag: params.get('tag') ?? undefined,
    deviceId: params.get('device') ? Number(params.get('device')) : undefined,
  };
  const sort = params.get('sort') ?? 'id';
  const page = Math.max(1, Number(params.get('page')) || 1);
  const vectors = useVectors({ ...filter, sort, page, pageSize });
  const devices = useDevices();
  const [search, setSearch] = useState(filter.q ?? '');
  const [selected, setSelected] = useState<Set<string>>(new Set());
  const [run, setRun] = useState<{ id: number; selection: string } | null>(null);
  const startRun = useStartRun();
  const importer = useImportVectors();
  const fileInput = useRef<HTMLInputElement>(null);

  const update = (changes: Record<string, string | null>) => {
    const next = new URLSearchParams(params);
    for (const [key, value] of Object.entries(changes)) {
      if (value === null || value === '') next.delete(key);
      else next.set(key, value);
    }
    if (!('page' in changes)) next.delete('page');
    setParams(next, { replace: true });
  };

  // Search as the user types, a moment after the last key.
  useEffect(() => {
    if ((filter.q ?? '') === search.trim()) return;
    const timer = setTimeout(() => update({ q: search.trim() || null }), 250);
    return () => clearTimeout(timer);
  });

  const toggle = (id: string) =>
    setSelected((before) => {
      const next = new Set(before);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });

  const start = (input: StartRunInput, selection: string) => startRun.mutate(input, { onSuccess: ({ run: started }) => setRun({ id: started.id, selection }) });

  const filterActive = Boolean(filter.q || filter.kind || filter.tag || filter.deviceId);
  const total = vectors.data?.total ?? 0;

  return (
    <>
      <PageHeader
        eyebrow="Test"
        title="Library"
        description="The team's test vectors: every known behaviour and every bug ever found, each with where its expected value comes from. Run them here or from CI."
        actions={
          canWrite && (
            <ButtonLink to={paths.library.create.getHref()} variant="primary">
              New vector
            </ButtonLink>
          )
        }
      />
      <div className="mb-4 grid gap-3 md:grid-cols-[minmax(0,2fr)_repeat(3,minmax(0,1fr))]">
        <Input label="Search" placeholder="id, title, tag or any text in the file" value={search} onChange={(event) => setSearch(event.target.value)} type="search" />
        <Select
          label="Kind"
          value={filter.kind ?? ''}
          onChange={(e) => update({ kind: e.target.value })}
          options={[{ value: '', label: 'Every kind' }, ...vectorKinds.map((k) => ({ value: k, label: k }))]}
        />
        <Select
          label="Tag"
          value={filter.tag ?? ''}
          onChange={(e) => update({ tag: e.target.value })}
          options={[
            { value: '', label: 'Every tag' },
            ...(vectors.data?.tags ?? []).map((t) => ({ value: t.tag, label: `${t.tag} (${t.count})` })),
            ...(filter.tag && !(vectors.data?.tags ?? []).some((t) => t.tag === filter.tag) ? [{ value: filter.tag, label: filter.tag }] : []),
          ]}
        />
        <Select
          label="Device"
          value={filter.deviceId ? String(filter.deviceId) : ''}
          onChange={(e) => update({ device: e.target.value })}
          options={[{ value: '', label: 'Any device' }, ...(devices.data?.items ?? []).map((d) => ({ value: String(d.id), label: d.name }))]}
        />
      </div>
      <div className="mb-4 flex flex-wrap items-center gap-2">
        {canWrite && (
          <>
            <Button
              size="sm"
              onClick={() => start({ ids: [...selected] }, `${selected.size} selected`)}
              disabled={selected.size === 0}
              loading={startRun.isPending && 'ids' in (startRun.variables ?? {})}
            >
              Run selected{selected.size > 0 ? ` (${selected.size})` : ''}
            </Button>
            <Button size="sm" variant="secondary" onClick={() => start({ filter: { ...filter } }, 'filtered')} disabled={!filterActive || total === 0}>
              Run filtered{filterActive ? ` (${total})` : ''}
            </Button>
            <Button size="sm" variant="secondary" onClick={() => start({ all: true }, 'all')}>
              Run all
            </Button>
            <span className="mx-1 h-5 w-px bg-slate-300 dark:bg-slate-700" aria-hidden="true" />
            <Button size="sm" variant="secondary" onClick={() => fileInput.current?.click()} loading={importer.isPending}>
              Import zip
            </Button>
            <input
              ref={fileInput}
              type="file"
              accept=".zip,application/zip"
              className="sr-only"
              aria-label="Zip of vector files to import"
              onChange={(event) => {
                const file = event.target.files?.[0];
                if (file) importer.mutate(file);
                event.target.value = '';
              }}
            />
          </>
        )}
        <a className={buttonClasses('secondary', 'sm')} href={exportHref(filter)} download>
          Export zip{filterActive ? ' (filtered)' : ''}
        </a>
        {selected.size > 0 && (
          <Button size="sm" variant="ghost" onClick={() => setSelected(new Set())}>
            Clear selection
          </Button>
        )}
        {importer.data && (
          <p role="status" className="text-xs text-emerald-700 dark:text-emerald-300">
            Imported {importer.data.total}: {importer.data.created} new, {importer.data.updated} updated, {importer.data.unchanged} unchanged.
          </p>
        )}
      </div>
      {importer.isError && <ErrorMessage className="mb-4" title="Nothing was imported" error={importer.error} />}
      {startRun.isError && <ErrorMessage className="mb-4" title="The run did not start" error={startRun.error} />}
      {run && (
        <div className="mb-4">
          <RunPanel key={run.id} runId={run.id} selection={run.selection} />
        </div>
      )}
      {vectors.isError ? (
        <ErrorMessage title="The library could not be loaded" error={vectors.error} />
      ) : (
        <SelectionContext.Provider value={{ selected, toggle }}>
          <DataTable
            label="Vectors"
            dense
            columns={columns}
            data={vectors.data?.items ?? noVectors}
            getRowId={(v) => v.id}
            isLoading={vectors.isPending}
            onRowClick={(v) => navigate(paths.library.vector.getHref(v.id))}
            serverSorting={{ sorting: sortingOf(sort), onSortingChange: (next) => update({ sort: sortParam(next) === 'id' ? null : sortParam(next) }) }}
            pagination={{ pageIndex: page - 1, pageSize, rowCount: total, onPageChange: (index) => update({ page: index > 0 ? String(index + 1) : null }) }}
            empty={
              <EmptyState
                title={filterActive ? 'No vector matches' : 'The library is empty'}
                description={filterActive ? 'Change the search or the filters.' : canWrite ? 'Create a vector or import a zip of vector files.' : undefined}
              />
            }
          />
        </SelectionContext.Provider>
      )}
    </>
  );
}
