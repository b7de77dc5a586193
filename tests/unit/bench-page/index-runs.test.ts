import { describe, expect, it } from 'vitest';
import { contiguousRuns } from '../../../src/features/bench/live/index-runs';
import { ScoreAccumulator } from '../../../shared/numeric';

describe('splitting request indexes into contiguous runs', () => {
  it('gives one run per stretch of consecutive indexes', () => {
    expect(contiguousRuns([5, 6, 7, 2, 3, 9])).toEqual([
      [0, 3],
      [3, 5],
      [5, 6],
    ]);
    expect(contiguousRuns([])).toEqual([]);
    expect(contiguousRuns([4])).toEqual([[0, 1]]);
    expect(contiguousRuns(Uint32Array.of(0, 1, 2, 3))).toEqual([[0, 4]]);
  });

  it('lets the scorer report the exact request index of each mismatch in a batch with gaps', () => {
    // A batch as retries produce it: indexes 10..12, then 40, then 7; the answers at 11 and 40 are wrong.
    const indexes = Uint32Array.of(10, 11, 12, 40, 7);
    const codes = Float64Array.of(100, 200, 300, 400, 500);
    const acc = new ScoreAccumulator({});
    const model = new ScoreAccumulator({}).model;
    const cos = new Int32Array(5);
    const sin = new Int32Array(5);
    model.evaluateInto(codes, cos, sin);
    cos[1] += 3;
    sin[3] -= 1;
    for (const [from, to] of contiguousRuns(indexes)) acc.add(codes.subarray(from, to), cos.subarray(from, to), sin.subarray(from, to), indexes[from]);
    const s = acc.summary();
    expect(s.mismatches.count).toBe(2);
    expect(s.mismatches.first.map((m) => [m.index, m.code])).toEqual([
      [11, 200],
      [40, 400],
    ]);
  });
});
