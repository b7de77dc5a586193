import { describe, expect, it } from 'vitest';
import { ScoredBuffer } from '../../../src/features/bench/live/scored-buffer';

describe('the buffer of scored results on their way to the page', () => {
  it('hands over everything appended since the last take, in order, growing as needed', () => {
    const b = new ScoredBuffer();
    expect(b.take()).toBeNull();
    const n = 3000; // more than its first capacity
    const codes = Float64Array.from({ length: n }, (_, i) => i);
    b.append(codes.subarray(0, 1000), new Int32Array(1000).fill(1), new Int32Array(1000).fill(2), (k) => k / 2, () => -1);
    b.append(codes.subarray(1000), new Int32Array(2000).fill(3), new Int32Array(2000).fill(4), (k) => k, () => 0.5);
    const out = b.take()!;
    expect(out.codes).toEqual(codes);
    expect(out.cos[999]).toBe(1);
    expect(out.cos[1000]).toBe(3);
    expect(out.sin[2999]).toBe(4);
    expect(out.errCos[999]).toBe(499.5);
    expect(out.errCos[1001]).toBe(1);
    expect(out.errSin[0]).toBe(-1);
    expect(b.length).toBe(0);
    expect(b.take()).toBeNull();
  });
});
