import { panel, panelTitle } from '../../components/ui';
import { ApiTokensPanel } from '../../features/account/components/api-tokens-panel';
import { useMe } from '../../features/auth/api/get-me';

/** The signed-in person's own page: who they are, and their runner tokens (engineers). */
export function AccountRoute() {
  const me = useMe().data;
  if (!me) return null;
  return (
    <div className="grid max-w-4xl gap-6">
      <h1 className="text-3xl font-bold">Your account</h1>
      <section aria-labelledby="who-title" className={panel}>
        <h2 id="who-title" className={panelTitle}>
          Signed in as
        </h2>
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-ink-soft">name</dt>
          <dd>{me.name}</dd>
          <dt className="text-ink-soft">e-mail</dt>
          <dd className="font-mono">{me.email}</dd>
          <dt className="text-ink-soft">role</dt>
          <dd>{me.role}</dd>
        </dl>
        <p className="mt-3 text-sm text-ink-soft">An admin changes roles on the Team page.</p>
      </section>
      {me.role === 'reviewer' ? (
        <p className="text-sm text-ink-soft">Runner tokens upload sessions, which takes the engineer role.</p>
      ) : (
        <ApiTokensPanel />
      )}
    </div>
  );
}
