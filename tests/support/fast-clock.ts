import type { EngineClock } from '../../shared/link-engine/link-engine';

/**
 * Real time sped up `factor` times: a simulated board paced by it sends `factor` times faster
 * than its baud rate allows, in the same order, so long soaks finish in a test's time.
 */
export function fastClock(factor: number): EngineClock {
  const t0 = performance.now();
  return {
    now: () => (performance.now() - t0) * factor,
    after: (ms, fn) => {
      const t = setTimeout(fn, ms / factor);
      return () => clearTimeout(t);
    },
  };
}
