import type { UseQueryResult } from '@tanstack/react-query';
import type { Health } from '../api/get-health';

export function HealthPanel({ query }: { query: UseQueryResult<Health> }) {
  return (
    <aside aria-labelledby="health-title" className="rounded-lg border border-rule bg-panel p-5">
      <h2 id="health-title" className="text-sm font-bold uppercase tracking-wider text-ink-soft mb-3">
        Server
      </h2>
      {query.isPending && <p>Asking the server…</p>}
      {query.isError && (
        <p role="alert" className="text-fail font-bold">
          Unreachable: {query.error.message}
        </p>
      )}
      {query.data && (
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 font-mono text-sm">
          <dt className="text-ink-soft">status</dt>
          <dd data-testid="health-status" className={query.data.status === 'ok' ? 'text-pass font-bold' : 'text-fail font-bold'}>
            {query.data.status === 'ok' ? 'OK' : 'DEGRADED'}
          </dd>
          <dt className="text-ink-soft">version</dt>
          <dd data-testid="health-version">{query.data.version}</dd>
          <dt className="text-ink-soft">database</dt>
          <dd data-testid="health-db">
            {query.data.database.dialect} · {query.data.database.status}
            {query.data.database.message ? ` (${query.data.database.message})` : ''}
          </dd>
          <dt className="text-ink-soft">migrations</dt>
          <dd>{query.data.database.migrations}</dd>
          <dt className="text-ink-soft">uptime</dt>
          <dd>{Math.round(query.data.uptimeS)} s</dd>
        </dl>
      )}
    </aside>
  );
}
