// Which records are due in a paced replay: a record recorded `timeMs` after the first one is
// due once `elapsedMs × speed` has passed. Pure, so the pacing is tested without timers.

/** Index one past the last record due at `elapsedMs` of wall time, from `from` on. */
export function dueUntil(times: ArrayLike<number>, from: number, t0Ms: number, elapsedMs: number, speed: number): number {
  const horizon = t0Ms + elapsedMs * speed;
  let i = from;
  while (i < times.length && times[i] <= horizon) i++;
  return i;
}

export const REPLAY_SPEEDS = [1, 4, 16, 64] as const;
