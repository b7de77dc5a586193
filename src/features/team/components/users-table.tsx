import { DataTable, type PlainColumn } from '../../../components/data-table';
import { useMemo, useState } from 'react';
import { btn, fieldError, input } from '../../../components/ui';
import { ROLES, type Role, type TeamUser } from '../api/get-users';
import { useUpdateUser } from '../api/update-user';

function RoleCell({ user, isMe }: { user: TeamUser; isMe: boolean }) {
  const update = useUpdateUser();
  const [role, setRole] = useState<Role>(user.role);
  // Your own role is not yours to drop: the server refuses it too.
  if (isMe) return <span>{user.role} <span className="text-ink-soft">(you)</span></span>;
  return (
    <div className="grid gap-1">
      <div className="flex items-center gap-2">
        <select className={`${input} max-w-36`} aria-label={`Role of ${user.name}`} value={role} onChange={(e) => setRole(e.target.value as Role)}>
          {ROLES.map((r) => (
            <option key={r}>{r}</option>
          ))}
        </select>
        {role !== user.role && (
          <button type="button" className={btn} disabled={update.isPending} onClick={() => update.mutate({ id: user.id, change: { role } })}>
            Change role
          </button>
        )}
      </div>
      {update.isError && <span role="alert" className={fieldError}>{update.error.message}</span>}
    </div>
  );
}

function AccessCell({ user, isMe }: { user: TeamUser; isMe: boolean }) {
  const update = useUpdateUser();
  const state = <span className={user.disabled ? 'font-bold text-fail' : 'text-pass'}>{user.disabled ? 'Disabled' : 'Active'}</span>;
  if (isMe) return state;
  return (
    <div className="grid gap-1">
      <div className="flex items-center gap-3">
        {state}
        <button
          type="button"
          className={btn}
          disabled={update.isPending}
          aria-label={`${user.disabled ? 'Enable' : 'Disable'} ${user.name}`}
          onClick={() => update.mutate({ id: user.id, change: { disabled: !user.disabled } })}
        >
          {user.disabled ? 'Enable' : 'Disable'}
        </button>
      </div>
      {update.isError && <span role="alert" className={fieldError}>{update.error.message}</span>}
    </div>
  );
}

/** Every account, with role and access controls for everyone but yourself. */
export function UsersTable({ users, meId }: { users: TeamUser[]; meId: number }) {
  const columns = useMemo<PlainColumn<TeamUser>[]>(() => [
    { id: 'name', header: 'Name', accessorFn: (u) => u.name, cell: ({ getValue }) => <span className="font-bold">{String(getValue())}</span> },
    { id: 'email', header: 'E-mail', accessorFn: (u) => u.email, cell: ({ getValue }) => <span className="font-mono text-xs">{String(getValue())}</span> },
    { id: 'role', header: 'Role', accessorFn: (u) => u.role, cell: ({ row }) => <RoleCell key={row.original.role} user={row.original} isMe={row.original.id === meId} /> },
    { id: 'access', header: 'Access', accessorFn: (u) => u.disabled, cell: ({ row }) => <AccessCell user={row.original} isMe={row.original.id === meId} /> },
    { id: 'since', header: 'Since', accessorFn: (u) => new Date(u.createdAt).toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric' }) },
  ], [meId]);
  return <DataTable columns={columns} data={users} label="Users" rowTestId={(u) => `user-${u.email}`} bare align="middle" />;
}
