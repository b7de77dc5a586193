// The batch paths of the statistics (addAll) are written for speed; each must count exactly what
// its one-value add() counts, including the edges of the histogram and every octant.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { CodeCoverage, octantOfCode } from '../../../shared/numeric/coverage';
import { ErrorHistogram } from '../../../shared/numeric/error-stats';
import { angleCodeRange, type AngleFormat } from '../../../shared/numeric/formats';

const formats: AngleFormat[] = [
  { angleFormat: 'turn', angleBits: 16, angleFrac: 0 },
  { angleFormat: 'turn', angleBits: 3, angleFrac: 0 },
  { angleFormat: 'rad', angleBits: 16, angleFrac: 12 },
  { angleFormat: 'rad', angleBits: 10, angleFrac: 3 },
];

describe('CodeCoverage.addAll', () => {
  it.each(formats)('counts what add() counts, overall and per octant (%o)', (f) => {
    const { min, max } = angleCodeRange(f);
    fc.assert(
      fc.property(fc.array(fc.integer({ min, max }), { maxLength: 3000 }), (codes) => {
        const one = new CodeCoverage(f);
        for (const c of codes) one.add(c);
        const all = new CodeCoverage(f);
        all.addAll(Float64Array.from(codes), codes.length);
        expect(all.summary()).toEqual(one.summary());
        expect(all.distinct).toBe(new Set(codes).size);
      }),
      { numRuns: 40 },
    );
  });
});

describe('CodeCoverage octants', () => {
  // Counted in the bit set at summary time for `turn` from 6 bits up; checked here against
  // octantOfCode's classification of each distinct code.
  it.each([6, 7, 16])('counts each octant\'s distinct codes as octantOfCode classifies them (turn, %i bits)', (bits) => {
    const f: AngleFormat = { angleFormat: 'turn', angleBits: bits, angleFrac: 0 };
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 2 ** bits - 1 }), { maxLength: 3000 }), (codes) => {
        const cov = new CodeCoverage(f);
        cov.addAll(Float64Array.from(codes), codes.length);
        const want = new Array<number>(8).fill(0);
        for (const c of new Set(codes)) want[octantOfCode(f, c)]++;
        expect(cov.summary().octants.map((o) => o.distinct)).toEqual(want);
      }),
      { numRuns: 40 },
    );
  });
});

describe('ErrorHistogram.addAll', () => {
  it('puts every value in the bin add() puts it in, including both edges and far outside', () => {
    const edges = [-8, -8 - 1e-12, -7.75, 7.75, 8, 8 - 1e-12, 0, -0, 1e12, -1e12, 3.999999];
    fc.assert(
      fc.property(fc.array(fc.double({ min: -20, max: 20, noNaN: true }), { maxLength: 500 }), (values) => {
        const xs = [...values, ...edges];
        const one = new ErrorHistogram();
        for (const x of xs) one.add(x);
        const all = new ErrorHistogram();
        all.addAll(Float64Array.from(xs), xs.length);
        expect(Array.from(all.counts)).toEqual(Array.from(one.counts));
        expect([all.below, all.above]).toEqual([one.below, one.above]);
      }),
      { numRuns: 100 },
    );
  });

  it('bins by hand: −8 is the first bin, 8 is above, −8.25 below (quarter-LSB bins over ±8 LSB)', () => {
    const h = new ErrorHistogram();
    h.addAll(Float64Array.from([-8, 7.99, 8, -8.25, 0]), 5);
    expect(h.counts[0]).toBe(1);
    expect(h.counts[63]).toBe(1);
    expect(h.counts[32]).toBe(1);
    expect([h.below, h.above]).toEqual([1, 1]);
    // One at a time (as the scorer's loop adds them), the same bins.
    const one = new ErrorHistogram();
    for (const x of [-8, 7.99, 8, -8.25, 0]) one.add(x);
    expect(Array.from(one.counts)).toEqual(Array.from(h.counts));
    expect([one.below, one.above]).toEqual([1, 1]);
  });
});
