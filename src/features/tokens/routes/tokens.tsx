import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { DataTable, dataColumnHelper } from '../../../components/data-table.tsx';
import { EmptyState } from '../../../components/empty-state.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { Input } from '../../../components/input.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { fieldErrorsOf } from '../../../lib/api-client.ts';
import { formatDateTime } from '../../../lib/format.ts';
import { useCreateToken } from '../api/create-token.ts';
import { useTokens } from '../api/get-tokens.ts';
import { useRevokeToken } from '../api/revoke-token.ts';
import type { ApiToken } from '../../../../shared/api/index.ts';

const noTokens: ApiToken[] = [];

function curlFor(token: string, project: string): string {
  return `curl -H "Authorization: Bearer ${token}" -F file=@junit.xml -F project=${project} -F build=$BUILD_ID ${window.location.origin}/api/runs`;
}

function RevokeButton({ token }: { token: ApiToken }) {
  const revoke = useRevokeToken();
  const [confirming, setConfirming] = useState(false);
  if (!confirming) {
    return (
      <Button size="sm" variant="secondary" onClick={() => setConfirming(true)}>
        Revoke
      </Button>
    );
  }
  return (
    <span className="flex gap-1">
      <Button size="sm" variant="danger" loading={revoke.isPending} onClick={() => revoke.mutate(token.id)}>
        Revoke {token.prefix}…
      </Button>
      <Button size="sm" variant="ghost" onClick={() => setConfirming(false)}>
        Keep
      </Button>
    </span>
  );
}

const col = dataColumnHelper<ApiToken>();
const columns = col.columns([
  col.accessor('project', { header: 'Project', enableSorting: false, meta: { mono: true } }),
  col.accessor('name', { header: 'Name', enableSorting: false }),
  col.accessor('prefix', { header: 'Token', enableSorting: false, meta: { mono: true }, cell: ({ getValue }) => `${getValue()}…` }),
  col.accessor('createdAt', {
    header: 'Created',
    enableSorting: false,
    meta: { mono: true },
    cell: ({ row }) => <span title={`by ${row.original.createdBy}`}>{formatDateTime(row.original.createdAt)}</span>,
  }),
  col.accessor('lastUsedAt', { header: 'Last used', enableSorting: false, meta: { mono: true }, cell: ({ getValue }) => (getValue() ? formatDateTime(getValue()) : 'never') }),
  col.display({ id: 'actions', header: () => <span className="sr-only">Actions</span>, meta: { align: 'end' }, cell: ({ row }) => <RevokeButton token={row.original} /> }),
]);

export function TokensRoute() {
  const tokens = useTokens();
  const create = useCreateToken();
  const [project, setProject] = useState('');
  const [name, setName] = useState('');
  const [copied, setCopied] = useState(false);
  const errors = fieldErrorsOf(create.error);
  const shown = create.data;

  const submit = (event: FormEvent) => {
    event.preventDefault();
    setCopied(false);
    create.mutate({ project: project.trim(), name: name.trim() });
  };

  return (
    <>
      <PageHeader eyebrow="Admin" title="API tokens" description="Tokens let CI post test results for one project. A token can do nothing else: it cannot read the library or sign in." />
      <div className="grid items-start gap-6 xl:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
        <Card>
          <CardHeader title="New token" description="The token is shown once; Parley keeps only its hash." />
          <CardBody>
            <form className="flex flex-col gap-3" onSubmit={submit}>
              <Input label="Project" mono placeholder="k65-firmware" value={project} onChange={(e) => setProject(e.target.value)} error={errors.project} />
              <Input label="Name" placeholder="Firmware CI" value={name} onChange={(e) => setName(e.target.value)} error={errors.name} />
              <div>
                <Button type="submit" loading={create.isPending} disabled={project.trim() === '' || name.trim() === ''}>
                  Create token
                </Button>
              </div>
              {create.isError && Object.keys(errors).length === 0 && <ErrorMessage title="No token created" error={create.error} />}
            </form>
            {shown && (
              <div role="region" aria-label="New token" className="mt-4 flex flex-col gap-2 rounded-md border border-amber-300 bg-amber-50 p-3 dark:border-amber-500/40 dark:bg-amber-400/10">
                <p className="text-xs font-medium text-amber-900 dark:text-amber-200">Copy it now: it will not be shown again.</p>
                <code className="font-mono text-xs break-all text-slate-900 dark:text-slate-100" data-testid="new-token">
                  {shown.token}
                </code>
                <div>
                  <Button
                    size="sm"
                    variant="secondary"
                    onClick={() => {
                      void navigator.clipboard?.writeText(shown.token).then(() => setCopied(true));
                    }}
                  >
                    {copied ? 'Copied' : 'Copy token'}
                  </Button>
                </div>
                <p className="mt-2 text-xs text-slate-700 dark:text-slate-300">
                  In CI, after <code className="font-mono">parley run vectors --junit junit.xml</code>:
                </p>
                <pre className="overflow-x-auto rounded bg-white p-2 font-mono text-[11px] whitespace-pre-wrap text-slate-800 dark:bg-slate-950 dark:text-slate-200">
                  {curlFor(shown.token, shown.item.project)}
                </pre>
                <p className="text-xs text-slate-600 dark:text-slate-400">
                  Raw XML works too (<code className="font-mono">-H "Content-Type: application/xml" --data-binary @junit.xml "…/api/runs?project=…&amp;build=…"</code>), and so does the JSON of{' '}
                  <code className="font-mono">parley run --json</code>.
                </p>
              </div>
            )}
          </CardBody>
        </Card>
        {tokens.isError ? (
          <ErrorMessage title="The tokens could not be loaded" error={tokens.error} />
        ) : (
          <DataTable
            label="API tokens"
            dense
            columns={columns}
            data={tokens.data?.items ?? noTokens}
            getRowId={(t) => String(t.id)}
            isLoading={tokens.isPending}
            empty={<EmptyState title="No tokens" description="Create one per project that posts results." />}
          />
        )}
      </div>
    </>
  );
}
