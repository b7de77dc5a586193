import type { QueryClient } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { useMe } from '../../features/auth/api/get-me';
import { healthQueryOptions, useHealth } from '../../features/health/api/get-health';
import { HealthPanel } from '../../features/health/components/health-panel';
import { AttentionPanel } from '../overview/attention-panel';
import { LatestSessions } from '../overview/latest-sessions';

export const overviewLoader = (qc: QueryClient) => async () => {
  // Warm the cache, but let the page render its own error state if the server is down.
  await qc.ensureQueryData(healthQueryOptions()).catch(() => undefined);
  return null;
};

export function OverviewRoute() {
  const health = useHealth();
  const me = useMe();
  return (
    <div className="grid gap-6">
      <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
        <section>
          <h1 className="mb-2 text-3xl font-bold">Bench overview</h1>
          <p className="max-w-2xl text-ink-soft">
            Drive a CORDIC sine/cosine core over its UART link, score every returned code against exact math and a
            bit-accurate model, and keep each bench session with its statistics for review.
          </p>
          {me.data && me.data.role !== 'reviewer' && (
            <p className="mt-4">
              <Link to="/bench" className="font-bold underline">
                Open the bench
              </Link>{' '}
              to connect a board and run a plan.
            </p>
          )}
        </section>
        <HealthPanel query={health} />
      </div>
      {me.data && (
        <>
          <AttentionPanel />
          <LatestSessions />
        </>
      )}
    </div>
  );
}
