import { describe, expect, it } from 'vitest';
import { dueUntil } from '../../../src/features/sessions/capture/replay-clock';
import { recordedAt, replayTimeline, SILENCE_MS } from '../../../src/features/sessions/capture/replay-timeline';

// HELLO → INFO at 1000 and 1000.5 ms, then 143.2 s of nothing, then a run's requests.
const times = [1000, 1000.5, 144_200.5, 144_201, 144_203.5];

describe('a replay that skips silences', () => {
  const t = replayTimeline(times, 1000, SILENCE_MS);

  it('shortens only the gaps longer than the threshold, to the threshold', () => {
    expect(Array.from(t.recorded)).toEqual([0, 0.5, 143_200.5, 143_201, 143_203.5]);
    expect(Array.from(t.play).map((v) => +v.toFixed(6))).toEqual([0, 0.5, 2000.5, 2001, 2003.5]);
    expect(Array.from(t.skippedBefore)).toEqual([0, 0, 143_200, 0, 0]);
  });

  it('reaches the records after the silence within the threshold of wall time', () => {
    expect(dueUntil(t.play, 0, 0, 2000, 1)).toBe(2);
    expect(dueUntil(t.play, 0, 0, 2000.5, 1)).toBe(3);
    expect(dueUntil(t.play, 0, 0, 2003.5, 1)).toBe(5);
    // At 16× the threshold is 125 ms of wall time.
    expect(dueUntil(t.play, 0, 0, 125.03125, 16)).toBe(3);
  });

  it('states progress in recorded time: counting through the kept part, then jumping the silence', () => {
    expect(recordedAt(t, 2, 1000.5)).toBeCloseTo(1000.5, 6);
    expect(recordedAt(t, 2, 2000)).toBeCloseTo(2000, 6);
    // Once the record after the silence is shown, its recorded time is where the replay stands.
    expect(recordedAt(t, 3, 2000.5)).toBeCloseTo(143_200.5, 6);
    expect(recordedAt(t, 4, 2002)).toBeCloseTo(143_201 + 1, 6);
    // Never past the next record, nor past the last one at the end.
    expect(recordedAt(t, 4, 2100)).toBeCloseTo(143_203.5, 6);
    expect(recordedAt(t, 5, 9999)).toBeCloseTo(143_203.5, 6);
  });

  it('shortens a silence before the first listed record too (one direction shown)', () => {
    const rx = replayTimeline([6000, 6001], 1000, SILENCE_MS);
    expect(Array.from(rx.play)).toEqual([2000, 2001]);
    expect(Array.from(rx.skippedBefore)).toEqual([5000, 0]);
    expect(recordedAt(rx, 0, 1500)).toBe(1500);
    expect(recordedAt(rx, 1, 2000)).toBe(5000);
  });
});

describe('a replay as recorded', () => {
  it('keeps every gap, so replay time and recorded time are the same', () => {
    const t = replayTimeline(times, 1000);
    expect(Array.from(t.play)).toEqual(Array.from(t.recorded));
    expect(t.skippedBefore.every((v) => v === 0)).toBe(true);
    expect(dueUntil(t.play, 0, 0, 2000.5, 1)).toBe(2);
    expect(recordedAt(t, 2, 100_000)).toBe(100_000);
  });

  it('has nothing to say about an empty list', () => {
    const t = replayTimeline([], 0, SILENCE_MS);
    expect(t.play.length).toBe(0);
    expect(recordedAt(t, 0, 500)).toBe(0);
  });
});
