import type { EngineClock } from '../shared/link-engine/link-engine';

/** Real time for the engine and the bridge (shared/ holds no timers). */
export const realClock: EngineClock = {
  now: () => performance.now(),
  after: (ms, fn) => {
    const t = setTimeout(fn, ms);
    return () => clearTimeout(t);
  },
};
