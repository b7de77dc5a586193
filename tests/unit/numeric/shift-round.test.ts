import { describe, expect, it } from 'vitest';
import { shiftRound, shiftRoundAddends32 } from '../../../shared/numeric/shift-round';

describe('the CORDIC shift step', () => {
  it('floors as an arithmetic right shift does, or rounds half up with nearest shift rounding (docs/model.md)', () => {
    // Two's-complement >> floors (common practice, no source): −5 >> 1 is −3, 5 >> 1 is 2.
    expect(shiftRound(-5, 1, false)).toBe(-3);
    expect(shiftRound(5, 1, false)).toBe(2);
    // Nearest adds half an LSB of the result first: (−5 + 1) >> 1 is −2, (5 + 1) >> 1 is 3; no rounding at i = 0.
    expect(shiftRound(-5, 1, true)).toBe(-2);
    expect(shiftRound(5, 1, true)).toBe(3);
    expect(shiftRound(-7, 0, true)).toBe(-7);
    // Beyond 32 bits, where the double path is used: 2^45 + 2^9 shifted by 10 is 2^35 rounded up.
    expect(shiftRound(2 ** 45 + 2 ** 9, 10, true)).toBe(2 ** 35 + 1);
    expect(shiftRound(2 ** 45 + 2 ** 9, 10, false)).toBe(2 ** 35);
  });

  it('gives the 32-bit paths the same step: (v + add[i]) >> i', () => {
    for (const nearest of [false, true]) {
      const add = shiftRoundAddends32(30, nearest);
      for (let i = 0; i < 30; i++) {
        for (const v of [0, 1, -1, 2 ** i - 1, -(2 ** i), 123_456_789, -987_654_321, 2 ** 28 + 3, -(2 ** 28) - 5]) {
          expect((v + add[i]) >> i).toBe(shiftRound(v, i, nearest));
        }
      }
    }
  });
});
