import { describe, expect, it } from 'vitest';
import { dueUntil } from '../../../src/features/sessions/capture/replay-clock';

describe('paced replay of a capture', () => {
  // Recorded at 1000 ms, 1000.5, 1010, 1100, 2000 (the archive's clock has any origin).
  const times = [1000, 1000.5, 1010, 1100, 2000];

  it('releases the records whose recorded offset has passed in wall time', () => {
    expect(dueUntil(times, 0, 1000, 0, 1)).toBe(1);
    expect(dueUntil(times, 0, 1000, 10, 1)).toBe(3);
    expect(dueUntil(times, 0, 1000, 999, 1)).toBe(4);
    expect(dueUntil(times, 0, 1000, 1000, 1)).toBe(5);
  });

  it('runs faster by the chosen speed', () => {
    expect(dueUntil(times, 0, 1000, 10, 16)).toBe(4);
    expect(dueUntil(times, 0, 1000, 62.5, 16)).toBe(5);
  });

  it('goes on from where the last frame stopped', () => {
    expect(dueUntil(times, 3, 1000, 10, 1)).toBe(3);
    expect(dueUntil(times, 3, 1000, 100, 1)).toBe(4);
  });
});
