import { fieldError, panel, panelTitle } from '../../../components/ui';
import { useUsers } from '../api/get-users';
import { AuditLog } from './audit-log';
import { InvitationsPanel } from './invitations-panel';
import { Outbox } from './outbox';
import { UsersTable } from './users-table';

/** /team for admins: accounts, invitations, the audit log and the mail outbox. */
export function TeamPage({ meId }: { meId: number }) {
  const users = useUsers();
  const list = users.data ?? [];
  return (
    <div className="grid gap-4">
      <div>
        <h1 className="text-2xl font-bold">Team</h1>
        <p className="text-sm text-ink-soft">Accounts and roles, invitations, who changed what, and the mail the server sent.</p>
      </div>
      <section className={panel} aria-labelledby="users-title">
        <h2 id="users-title" className={panelTitle}>Users</h2>
        {users.isPending && <p className="text-sm text-ink-soft">Loading users…</p>}
        {users.isError && <p role="alert" className={fieldError}>The users could not be loaded: {users.error.message}</p>}
        {users.data && <UsersTable users={users.data} meId={meId} />}
        <p className="mt-2 text-xs text-ink-soft">You cannot disable yourself or drop your own admin role; another admin can. A disabled account cannot sign in.</p>
      </section>
      <section className={panel} aria-labelledby="invite-title">
        <h2 id="invite-title" className={panelTitle}>Invitations</h2>
        <InvitationsPanel users={list} />
      </section>
      <section className={panel} aria-labelledby="audit-title">
        <h2 id="audit-title" className={panelTitle}>Audit log</h2>
        <AuditLog users={list} />
      </section>
      <section className={panel} aria-labelledby="outbox-title">
        <h2 id="outbox-title" className={panelTitle}>Mail outbox</h2>
        <Outbox />
      </section>
    </div>
  );
}
