// Where each record falls in a paced replay when long silences are shortened, and which
// recorded time a point of the replay stands for. Pure, so the skipping is tested without timers.

/** A gap between records longer than this (recorded ms) is shortened to it when skipping silences. */
export const SILENCE_MS = 2000;

export interface ReplayTimeline {
  /** Recorded ms of each record after the capture's first record. */
  recorded: Float64Array;
  /** Replay ms of each record after the start of the replay (before any speed-up). */
  play: Float64Array;
  /** Recorded ms of silence left out just before each record (0 where none was). */
  skippedBefore: Float64Array;
}

/**
 * Times of the listed records, measured from `t0Ms` (the capture's first record, which may not be
 * listed when one direction is shown). With `maxGapMs` finite, every gap longer than it, the one
 * before the first listed record included, lasts `maxGapMs` in the replay.
 */
export function replayTimeline(times: ArrayLike<number>, t0Ms: number, maxGapMs = Infinity): ReplayTimeline {
  const n = times.length;
  const recorded = new Float64Array(n);
  const play = new Float64Array(n);
  const skippedBefore = new Float64Array(n);
  // Replay time is recorded time less every silence cut so far (no drift over long captures).
  let cut = 0;
  for (let i = 0; i < n; i++) {
    recorded[i] = times[i] - t0Ms;
    const gap = recorded[i] - (i > 0 ? recorded[i - 1] : 0);
    if (gap > maxGapMs) {
      skippedBefore[i] = gap;
      cut += gap - maxGapMs;
    }
    play[i] = recorded[i] - cut;
  }
  return { recorded, play, skippedBefore };
}

/**
 * The recorded ms a replay `playMs` in stands for, with `due` records shown: the last shown
 * record's time plus the replay time since, never past the next record. Inside a shortened
 * silence it counts on as recorded, then jumps to the next record when that is shown.
 */
export function recordedAt(t: ReplayTimeline, due: number, playMs: number): number {
  const n = t.recorded.length;
  // Before the first listed record the replay counts from the capture's start.
  const fromRecorded = due > 0 ? t.recorded[due - 1] : 0;
  const fromPlay = due > 0 ? t.play[due - 1] : 0;
  const room = due < n ? t.recorded[due] - fromRecorded : 0;
  return fromRecorded + Math.min(Math.max(0, playMs - fromPlay), room);
}
