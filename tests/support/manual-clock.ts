import type { EngineClock } from '../../shared/link-engine/link-engine';

/**
 * A clock whose timers fire only when the test moves time: `advance` fires each timer at its
 * due time, in order (a host keeping up); `stall` jumps first and fires what fell due only
 * afterwards, late (a host whose event loop was blocked).
 */
export function manualClock() {
  let now = 0;
  let timers: Array<{ at: number; fn: () => void }> = [];
  const clock: EngineClock = {
    now: () => now,
    after: (ms, fn) => {
      const t = { at: now + ms, fn };
      timers.push(t);
      return () => (timers = timers.filter((x) => x !== t));
    },
  };
  const fireDue = (until: number, onTime: boolean) => {
    for (;;) {
      timers.sort((a, b) => a.at - b.at);
      const next = timers[0];
      if (!next || next.at > until) break;
      timers.shift();
      if (onTime) now = next.at;
      next.fn();
    }
  };
  const advance = (ms: number) => {
    const end = now + ms;
    fireDue(end, true);
    now = end;
  };
  const stall = (ms: number) => {
    now += ms;
    fireDue(now, false);
  };
  return { clock, advance, stall, pending: () => timers.length };
}
