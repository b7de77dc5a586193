import { describe, expect, it } from 'vitest';
import { Backoff } from '../../../shared/stations/backoff';

describe('Backoff', () => {
  it('doubles its step from the base up to the cap, each wait between half the step and the step', () => {
    const lows = new Backoff({ baseMs: 250, capMs: 4000, random: () => 0 });
    const highs = new Backoff({ baseMs: 250, capMs: 4000, random: () => 0.999999 });
    const steps = [250, 500, 1000, 2000, 4000, 4000, 4000];
    for (const step of steps) {
      expect(lows.next()).toBe(step / 2);
      expect(highs.next()).toBeCloseTo(step, 1);
    }
  });

  it('spreads the waits of many stations over the upper half of the step (jitter)', () => {
    let seed = 1;
    // A small linear congruential generator (Numerical Recipes' constants), so the test repeats.
    const random = () => ((seed = (seed * 1664525 + 1013904223) >>> 0) / 2 ** 32);
    const waits = Array.from({ length: 200 }, () => new Backoff({ baseMs: 1000, capMs: 1000, random }).next());
    expect(Math.min(...waits)).toBeGreaterThanOrEqual(500);
    expect(Math.max(...waits)).toBeLessThan(1000);
    expect(new Set(waits.map((w) => Math.floor(w / 50))).size).toBeGreaterThan(5); // not all at one instant
  });

  it('starts from the base again after reset, and never overflows however long the server stays away', () => {
    const b = new Backoff({ baseMs: 100, capMs: 5000, random: () => 0 });
    for (let i = 0; i < 5000; i++) b.next();
    expect(b.next()).toBe(2500);
    b.reset();
    expect(b.attempts).toBe(0);
    expect(b.next()).toBe(50);
  });

  it('refuses a cap below the base', () => {
    expect(() => new Backoff({ baseMs: 1000, capMs: 10 })).toThrow(/baseMs <= capMs/);
  });
});
