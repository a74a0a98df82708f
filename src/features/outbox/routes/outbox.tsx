import { DataTable, dataColumnHelper } from '../../../components/data-table.tsx';
import { EmptyState } from '../../../components/empty-state.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { formatDateTime } from '../../../lib/format.ts';
import { pageParam } from '../../../lib/list-params.ts';
import { useListParams } from '../../../lib/use-list-params.ts';
import { useOutbox, type OutboxItem } from '../api/get-outbox.ts';
import { MailReader } from '../components/mail-reader.tsx';

const pageSize = 25;
const noMail: OutboxItem[] = [];

const col = dataColumnHelper<OutboxItem>();
const columns = col.columns([
  col.accessor('subject', {
    header: 'Mail',
    enableSorting: false,
    cell: ({ row }) => (
      // Wrapped, not truncated: a nowrap cell would push the Sent column out of the table.
      <div className="min-w-0">
        <p className="line-clamp-2 font-medium break-words text-slate-900 dark:text-slate-100">{row.original.subject}</p>
        <p className="font-mono text-xs break-words text-slate-500 dark:text-slate-400">{row.original.to}</p>
      </div>
    ),
  }),
  col.accessor('sentAt', {
    header: 'Sent',
    enableSorting: false,
    meta: { mono: true, align: 'end' },
    cell: ({ getValue }) => <span className="whitespace-nowrap">{formatDateTime(getValue())}</span>,
  }),
]);

export function OutboxRoute() {
  const { page, selectedId: mailId, update } = useListParams('mail');
  const outbox = useOutbox({ page, pageSize });

  return (
    <>
      <PageHeader
        eyebrow="Admin"
        title="Outbox"
        description="Every e-mail Parley has sent — invitations, password resets, notices of newly failing vectors and shared trace diagnoses — exactly as it went out."
      />
      <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
        {outbox.isError ? (
          <ErrorMessage title="The outbox could not be loaded" error={outbox.error} />
        ) : (
          <DataTable
            label="Sent mail"
            columns={columns}
            data={outbox.data?.items ?? noMail}
            getRowId={(mail) => String(mail.id)}
            isLoading={outbox.isPending}
            onRowClick={(mail) => update({ mail: String(mail.id) })}
            selectedRowId={mailId ?? undefined}
            pagination={{
              pageIndex: page - 1,
              pageSize,
              rowCount: outbox.data?.total ?? 0,
              onPageChange: (pageIndex) => update({ page: pageParam(pageIndex) }),
            }}
            empty={<EmptyState title="No mail sent yet" description="Invitations, password resets, failing-vector notices and shared diagnoses appear here." />}
          />
        )}
        <MailReader mailId={mailId} />
      </div>
    </>
  );
}
