// The server-side benchmarks measure SQLite and PostgreSQL in the same run. Unless
// ANGLEBENCH_TEST_PG already names a cluster, a throwaway one is started for the run — with
// PostgreSQL's durable defaults (fsync on), as SQLite syncs its own writes — and removed after.
import os from 'node:os';
import { startCluster } from '../scripts/postgres-cluster';

const NEEDS_POSTGRES = new Set(['ingest', 'list-compare']);

/** Whether the benchmark `name` measures PostgreSQL too. */
export const needsPostgres = (name: string) => NEEDS_POSTGRES.has(name);

/** Starts a cluster unless ANGLEBENCH_TEST_PG names one; resolves to what stops it again. */
export async function startBenchPostgres(): Promise<() => Promise<void>> {
  if (process.env.ANGLEBENCH_TEST_PG) return async () => undefined;
  const cluster = await startCluster({ durable: true });
  process.env.ANGLEBENCH_TEST_PG = cluster.adminUrl;
  for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) {
    process.once(signal, () => void cluster.stop().finally(() => process.exit(128 + os.constants.signals[signal])));
  }
  // Unset once stopped: the benchmarks after it (page, station) then start their servers on
  // SQLite, the product's default, as they do when run alone.
  return async () => {
    await cluster.stop();
    delete process.env.ANGLEBENCH_TEST_PG;
  };
}
