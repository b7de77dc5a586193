import { describe, expect, it } from 'vitest';
import { sparklinePath } from '../../../src/features/sessions/list/sparkline-path';

describe('the error-profile sparkline', () => {
  it('draws one point per bin, scaled so the largest value meets the top', () => {
    // 4 bins over 40 px: centres at 5, 15, 25, 35; height 12 leaves 1 px clear each side.
    const s = sparklinePath([0, 1, 2, 1], 40, 12);
    expect(s.maxLsb).toBe(2);
    expect(s.topLsb).toBe(2);
    expect(s.d).toBe('M5 11L15 6L25 1L35 6');
  });

  it('breaks the line where a bin has no sample (-1) and marks a lone bin with a dash', () => {
    const s = sparklinePath([1, 1, -1, 1, -1, -1], 60, 12);
    expect(s.d).toBe('M5 1L15 1M34 1H36');
  });

  it('scales to the limit when the data stays under it, so rows of one core compare by eye', () => {
    const s = sparklinePath([1, 2], 20, 12, 4);
    expect(s.topLsb).toBe(4);
    expect(s.d).toBe('M5 8.5L15 6');
  });

  it('draws nothing when no bin has a sample, and a flat line for a perfect core', () => {
    expect(sparklinePath([-1, -1, -1], 30, 10)).toEqual({ d: '', topLsb: 1, maxLsb: null });
    expect(sparklinePath([0, 0], 20, 10).d).toBe('M5 9L15 9');
  });
});
