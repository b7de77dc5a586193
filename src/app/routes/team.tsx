import { useMe } from '../../features/auth/api/get-me';
import { TeamPage } from '../../features/team/components/team-page';

export function TeamRoute() {
  const me = useMe().data;
  if (me && me.role !== 'admin') {
    return (
      <section className="max-w-xl rounded-lg border border-rule bg-panel p-6">
        <h1 className="mb-2 text-2xl font-bold">Admins only</h1>
        <p className="text-ink-soft">Accounts, invitations, the audit log and the mail outbox are kept by the team’s admins.</p>
      </section>
    );
  }
  return me ? <TeamPage meId={me.id} /> : null;
}
