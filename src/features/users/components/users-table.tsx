import { Badge } from '../../../components/badge.tsx';
import { Button } from '../../../components/button.tsx';
import { DataTable, dataColumnHelper } from '../../../components/data-table.tsx';
import { EmptyState } from '../../../components/empty-state.tsx';
import { errorText } from '../../../components/error-message.tsx';
import { Select } from '../../../components/select.tsx';
import { useUser } from '../../../lib/auth.ts';
import { formatDateTime } from '../../../lib/format.ts';
import { isRole } from '../../../lib/roles.ts';
import { useUpdateUser } from '../api/update-user.ts';
import type { AdminUser } from '../../../../shared/api/index.ts';
import { roleOptions } from './role-options.ts';

function isSelf(me: { email: string }, user: AdminUser): boolean {
  return me.email.toLowerCase() === user.email.toLowerCase();
}

function RoleCell({ user }: { user: AdminUser }) {
  const me = useUser();
  const update = useUpdateUser();
  const self = isSelf(me, user);
  return (
    <div className="w-36">
      <Select
        label={`Role of ${user.name}`}
        hideLabel
        options={roleOptions}
        value={user.role}
        disabled={self || update.isPending || !user.active}
        title={self ? 'You cannot change your own role' : undefined}
        error={update.isError ? errorText(update.error) : undefined}
        onChange={(event) => {
          const role = event.target.value;
          if (isRole(role) && role !== user.role) update.mutate({ id: user.id, role });
        }}
      />
    </div>
  );
}

function StatusCell({ user }: { user: AdminUser }) {
  if (!user.active)
    return (
      <Badge tone="neutral" dot>
        deactivated
      </Badge>
    );
  if (user.invitePending)
    return (
      <Badge tone="warning" dot>
        invite pending
      </Badge>
    );
  return (
    <Badge tone="success" dot>
      active
    </Badge>
  );
}

function ActionsCell({ user }: { user: AdminUser }) {
  const me = useUser();
  const update = useUpdateUser();
  if (isSelf(me, user)) return <span className="text-xs text-slate-400">you</span>;
  return (
    <div className="flex flex-col items-end gap-1">
      <Button
        size="sm"
        variant={user.active ? 'secondary' : 'ghost'}
        loading={update.isPending}
        aria-label={`${user.active ? 'Deactivate' : 'Reactivate'} ${user.name}`}
        onClick={() => update.mutate({ id: user.id, active: !user.active })}
      >
        {user.active ? 'Deactivate' : 'Reactivate'}
      </Button>
      {update.isError && (
        <p role="alert" className="max-w-48 text-right text-xs text-red-600 dark:text-red-400">
          {errorText(update.error)}
        </p>
      )}
    </div>
  );
}

const col = dataColumnHelper<AdminUser>();
const columns = col.columns([
  col.accessor('name', {
    header: 'Person',
    cell: ({ row }) => (
      <div>
        <p className="font-medium text-slate-900 dark:text-slate-100">{row.original.name}</p>
        <p className="font-mono text-xs text-slate-500 dark:text-slate-400">{row.original.email}</p>
      </div>
    ),
  }),
  col.accessor('role', { header: 'Role', cell: ({ row }) => <RoleCell user={row.original} /> }),
  col.accessor((user) => (!user.active ? 2 : user.invitePending ? 1 : 0), {
    id: 'status',
    header: 'Status',
    cell: ({ row }) => <StatusCell user={row.original} />,
  }),
  col.accessor('lastSignInAt', {
    header: 'Last sign-in',
    meta: { mono: true },
    sortUndefined: 'last',
    cell: ({ getValue }) => <span className="whitespace-nowrap">{formatDateTime(getValue())}</span>,
  }),
  col.display({
    id: 'actions',
    header: () => <span className="sr-only">Actions</span>,
    meta: { align: 'end' },
    cell: ({ row }) => <ActionsCell user={row.original} />,
  }),
]);

export function UsersTable({ users, isLoading }: { users: AdminUser[]; isLoading: boolean }) {
  return (
    <DataTable
      label="Users"
      columns={columns}
      data={users}
      getRowId={(user) => String(user.id)}
      isLoading={isLoading}
      empty={<EmptyState title="No users" description="Invite someone to get started." />}
    />
  );
}
