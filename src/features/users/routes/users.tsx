import { ErrorMessage } from '../../../components/error-message.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import type { AdminUser } from '../../../../shared/api/index.ts';
import { useUsers } from '../api/get-users.ts';
import { InviteForm } from '../components/invite-form.tsx';
import { UsersTable } from '../components/users-table.tsx';

const noUsers: AdminUser[] = [];

export function UsersRoute() {
  const users = useUsers();
  const items = users.data?.items ?? noUsers;
  const pending = items.filter((user) => user.invitePending && user.active).length;
  return (
    <>
      <PageHeader eyebrow="Admin" title="Users" description="Everyone who can sign in to Parley, with their role. Roles decide what each person may change." />
      <div className="grid items-start gap-6 2xl:grid-cols-[minmax(0,1fr)_22rem]">
        <section aria-label="People" className="space-y-3">
          <p className="font-mono text-xs text-slate-500 tabular dark:text-slate-400">
            {users.data ? `${users.data.total} accounts · ${pending} invite${pending === 1 ? '' : 's'} pending` : '\u00a0'}
          </p>
          {users.isError ? <ErrorMessage title="The users could not be loaded" error={users.error} /> : <UsersTable users={items} isLoading={users.isPending} />}
        </section>
        <InviteForm />
      </div>
    </>
  );
}
