import type { QueryClient } from '@tanstack/react-query';
import { healthQueryOptions, useHealth } from '../../features/health/api/get-health';
import { HealthPanel } from '../../features/health/components/health-panel';

export const overviewLoader = (qc: QueryClient) => async () => {
  // Warm the cache, but let the page render its own error state if the server is down.
  await qc.ensureQueryData(healthQueryOptions()).catch(() => undefined);
  return null;
};

export function OverviewRoute() {
  const health = useHealth();
  return (
    <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
      <section>
        <h1 className="text-3xl font-bold mb-2">Bench overview</h1>
        <p className="text-ink-soft max-w-2xl">
          Drive a CORDIC sine/cosine core over its UART link, score every returned code against exact
          math and a bit-accurate model, and keep each bench session with its statistics for review.
        </p>
      </section>
      <HealthPanel query={health} />
    </div>
  );
}
