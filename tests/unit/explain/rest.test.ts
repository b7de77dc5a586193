import { describe, expect, it } from 'vitest';
import { classifyRest } from '../../../shared/explain';

/** n answers, all reproduced but those at `missed` (cos one off there). */
function rest(n: number, missed: number[]) {
  const codes = Float64Array.from({ length: n }, (_, i) => i);
  const cos = new Int32Array(n);
  const out = new Int32Array(n);
  for (const k of missed) out[k] = 1;
  return classifyRest(codes, cos, new Int32Array(n), out, new Int32Array(n));
}

describe('what the best hypothesis leaves unexplained', () => {
  it('is scattered when few answers are left, far apart', () => {
    expect(rest(10_000, [5])).toBe('scattered');
    expect(rest(10_000, [17, 900, 2500, 4000, 7321, 9999])).toBe('scattered');
  });

  it('is structured when many are left, or they come in runs of neighbouring codes', () => {
    // 2% of the answers: beyond the 1% a damaged line plausibly leaves (rule of thumb, no source).
    expect(rest(10_000, Array.from({ length: 200 }, (_, i) => i * 50))).toBe('structured');
    expect(rest(10_000, [100, 101, 102, 103, 5000, 5001, 5002])).toBe('structured');
  });

  it('finds runs in angle order whatever order the answers came in', () => {
    const n = 1000;
    const codes = Float64Array.from({ length: n }, (_, i) => (i * 7919) % n); // a permutation of 0..999
    const out = new Int32Array(n);
    codes.forEach((c, k) => c >= 300 && c < 306 && (out[k] = 1));
    expect(classifyRest(codes, new Int32Array(n), new Int32Array(n), out, new Int32Array(n))).toBe('structured');
  });
});
