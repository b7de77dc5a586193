// Small timing helpers shared by the benchmarks.
import { performance } from 'node:perf_hooks';

/** Milliseconds taken by `fn`. */
export async function timeMs(fn: () => unknown): Promise<number> {
  const t0 = performance.now();
  await fn();
  return performance.now() - t0;
}

/** The q-quantile (0..1) of `values`, nearest rank. */
export function quantile(values: number[], q: number): number {
  if (values.length === 0) throw new RangeError('quantile of no values');
  const sorted = [...values].sort((a, b) => a - b);
  const rank = Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1));
  return sorted[rank];
}

export const median = (values: number[]) => quantile(values, 0.5);

/**
 * CPU milliseconds (user + system) this process spent in a synchronous `fn`: on a shared machine
 * wall time also counts the waits for a core, which say nothing about the code.
 */
export function cpuMs(fn: () => unknown): number {
  const t0 = process.cpuUsage();
  fn();
  const t = process.cpuUsage(t0);
  return (t.user + t.system) / 1000;
}
