import { useEffect, useRef, useState } from 'react';
import { useNavigate, useSearchParams } from 'react-router';
import { Button } from '../../../components/button.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { Input } from '../../../components/input.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { Select } from '../../../components/select.tsx';
import { paths } from '../../../config/paths.ts';
import { useUser } from '../../../lib/auth.ts';
import { pageOf, pageParam, withParams } from '../../../lib/list-params.ts';
import { useDevices } from '../../../lib/api/get-devices.ts';
import type { TraceSort } from '../../../../shared/api/index.ts';
import { useTraces, type TraceListParams } from '../api/get-traces.ts';
import type { TraceItem } from '../../../../shared/api/index.ts';
import { TracesTable } from '../components/traces-table.tsx';
import { UploadPanel, type UploadPanelHandle } from '../components/upload-panel.tsx';
import { mayWriteTraces } from '../lib/roles.ts';

const pageSize = 20;
const noTraces: TraceItem[] = [];
const sorts: readonly TraceSort[] = ['createdAt', '-createdAt', 'title', '-title', 'sizeBytes', '-sizeBytes', 'errors', '-errors'];
const severityOptions = [
  { value: '', label: 'Any findings' },
  { value: 'error', label: 'With errors' },
  { value: 'warning', label: 'With warnings' },
  { value: 'info', label: 'With info findings' },
  { value: 'clean', label: 'Clean (no errors or warnings)' },
];

export function TracesRoute() {
  const user = useUser();
  const navigate = useNavigate();
  const [params, setParams] = useSearchParams();
  const devices = useDevices();
  const sortParam = params.get('sort') as TraceSort | null;
  const query: TraceListParams = {
    q: params.get('q') ?? '',
    deviceId: params.get('deviceId') ?? '',
    severity: (params.get('severity') ?? '') as TraceListParams['severity'],
    uploaderId: params.get('uploaderId') ?? '',
    sort: sortParam && sorts.includes(sortParam) ? sortParam : '-createdAt',
    page: pageOf(params),
    pageSize,
  };
  const traces = useTraces(query);
  const [search, setSearch] = useState(query.q ?? '');

  const uploadPanel = useRef<UploadPanelHandle>(null);
  const mayUpload = mayWriteTraces(user.role);

  // A new filter starts on the first page.
  const update = (changes: Record<string, string | null>) => setParams(withParams(params, 'page' in changes ? changes : { ...changes, page: null }));

  // Search as one types, a moment after the last key.
  useEffect(() => {
    if (search === (query.q ?? '')) return;
    const timer = setTimeout(() => update({ q: search.trim() || null }), 300);
    return () => clearTimeout(timer);
  });

  const filtered = Boolean(query.q || query.deviceId || query.severity || query.uploaderId);
  const uploaders = traces.data?.uploaders ?? [];

  return (
    <>
      <PageHeader
        eyebrow="Analyse"
        title="Traces"
        description="Logs from the field and the lab, decoded and checked against the USB PD rules. Open one to see what happened on the wire and share the diagnosis."
        actions={
          mayUpload && (
            // Below 2xl the panel sits under the list: this brings it up with the file chooser focused.
            <Button onClick={() => uploadPanel.current?.focus()}>Upload a trace</Button>
          )
        }
      />
      <div className="grid items-start gap-6 2xl:grid-cols-[minmax(0,1fr)_24rem]">
        <section aria-label="Stored traces" className="min-w-0 space-y-3">
          <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
            <Input label="Search" type="search" value={search} onChange={(event) => setSearch(event.target.value)} placeholder="Title, customer, rule id…" />
            <Select
              label="Device"
              value={query.deviceId}
              onChange={(event) => update({ deviceId: event.target.value })}
              options={[{ value: '', label: 'Every device' }, ...(devices.data?.items ?? []).map((d) => ({ value: String(d.id), label: d.name }))]}
            />
            <Select label="Findings" value={query.severity} onChange={(event) => update({ severity: event.target.value })} options={severityOptions} />
            <Select
              label="Uploaded by"
              value={query.uploaderId}
              onChange={(event) => update({ uploaderId: event.target.value })}
              options={[{ value: '', label: 'Anyone' }, ...uploaders.map((u) => ({ value: String(u.id), label: u.name }))]}
            />
          </div>
          <div className="flex items-center justify-between gap-3">
            <p className="font-mono text-xs text-slate-500 tabular dark:text-slate-400" aria-live="polite">
              {traces.data ? `${traces.data.total} trace${traces.data.total === 1 ? '' : 's'}${filtered ? ' match' : ''}` : '\u00a0'}
            </p>
            {filtered && (
              <Button
                size="sm"
                variant="ghost"
                onClick={() => {
                  setSearch('');
                  setParams(new URLSearchParams(query.sort === '-createdAt' ? {} : { sort: query.sort }));
                }}
              >
                Clear filters
              </Button>
            )}
          </div>
          {traces.isError ? (
            <ErrorMessage title="The traces could not be loaded" error={traces.error} />
          ) : (
            <TracesTable
              items={traces.data?.items ?? noTraces}
              total={traces.data?.total ?? 0}
              isLoading={traces.isPending}
              pageIndex={query.page - 1}
              pageSize={pageSize}
              sort={query.sort}
              filtered={filtered}
              onSortChange={(sort) => update({ sort: sort === '-createdAt' ? null : sort })}
              onPageChange={(pageIndex) => update({ page: pageParam(pageIndex) })}
              onOpen={(item) => navigate(paths.traces.detail.getHref(item.id))}
            />
          )}
        </section>
        {mayUpload ? (
          <UploadPanel ref={uploadPanel} />
        ) : (
          <p className="rounded-md border border-slate-200 px-4 py-3 text-xs text-slate-500 dark:border-slate-800">
            Your role can read traces; uploading needs the support, QA, engineer or admin role.
          </p>
        )}
      </div>
    </>
  );
}
