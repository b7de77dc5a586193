import { describe, expect, it } from 'vitest';
import { ScoringError } from '../../../shared/numeric/errors';
import { VectorInputError } from '../../../shared/vectoring/errors';
import { VectorCoverage } from '../../../shared/vectoring/vector-coverage';
import { createVectorModel } from '../../../shared/vectoring/vector-model';
import { VectorScoreAccumulator, wrapAngleError } from '../../../shared/vectoring/vector-score';

// 8-bit inputs and binary angles of 256 codes a turn; the multiply removes the gain, and the
// magnitude keeps the input's fraction bits, so the exact magnitude is hypot(x, y) in input codes.
const SMALL = { inBits: 8, inFrac: 6, angleBits: 8, magBits: 10, magFrac: 6, gainCompensation: 'multiply' as const };

describe('angle errors wrap at half a turn', () => {
  it('reads 255 against 0 as −1 and 1 against 255 as +1 in a 256-code turn', () => {
    expect(wrapAngleError(255 - 0, 256)).toBe(-1);
    expect(wrapAngleError(1 - 255, 256)).toBe(2);
    expect(wrapAngleError(128, 256)).toBe(-128); // exactly half a turn reads as −½
    expect(wrapAngleError(127.5, 256)).toBe(127.5);
  });
});

describe('scoring a vectoring core', () => {
  it('gives the hand-computed angle, magnitude and ppm statistics of five answers', () => {
    const s = new VectorScoreAccumulator(SMALL);
    // (10, 0): exact angle 0, magnitude 10; answered 255 (−1 after the wrap) and 11 (+1, +100000 ppm).
    // (0, 20): exact 64 and 20; answered 65 (+1) and 20.
    // (−30, 0): exact 128 and 30; answered 127 (−1) and 29 (−1, −33333.3 ppm).
    // (0, 0): the zero vector; its angle (5) is left out, its magnitude 0 is exact.
    // (3, 4): atan(4/3) = 2·atan(1/2) = 0.92729521800161223 rad = 37.7814 codes; answered 38
    //   (+0.2186); magnitude 5 exact (a 3-4-5 triangle).
    s.add([10, 0, -30, 0, 3], [0, 20, 0, 0, 4], [255, 65, 127, 5, 38], [11, 20, 29, 0, 5]);
    const r = s.summary();
    expect(r.count).toBe(5);
    expect(r.angleLsb.count).toBe(4);
    expect(r.angleLsb.mean).toBeCloseTo(-0.195352, 5); // (−1 + 1 − 1 + 0.218594) / 4
    expect(r.angleLsb.rms).toBeCloseTo(0.872895, 5); // √((1 + 1 + 1 + 0.047783) / 4)
    expect(r.angleLsb.maxAbs).toBe(1);
    expect(r.angleLsb.worst).toEqual({ x: -30, y: 0 }); // a tie goes to the lowest x, then y
    expect(r.magnitudeLsb).toMatchObject({ count: 5, mean: 0, maxAbs: 1, worst: { x: -30, y: 0 } });
    expect(r.magnitudeLsb.rms).toBeCloseTo(Math.sqrt(2 / 5), 12);
    expect(r.magnitudePpm.count).toBe(4);
    expect(r.magnitudePpm.maxAbs).toBeCloseTo(100000, 6);
    expect(r.magnitudePpm.worst).toEqual({ x: 10, y: 0 });
    expect(r.magnitudePpm.mean).toBeCloseTo((100000 - 100000 / 3) / 4, 6);
    // Quarter-LSB bins over ±8 LSB: −1 falls in bin (−1 + 8)·4 = 28, +1 in 36, 0 in 32, +0.2186 in 32.
    expect(r.histogram.angle[28]).toBe(2);
    expect(r.histogram.angle[36]).toBe(1);
    expect(r.histogram.angle[32]).toBe(1);
    expect(r.histogram.magnitude[28]).toBe(1);
    expect(r.histogram.magnitude[32]).toBe(3);
    expect(r.histogram.magnitude[36]).toBe(1);
    expect(r.coverage.zeroVectors).toBe(1);
  });

  it('wraps radian angle errors at ±π', () => {
    // 5 fraction bits: a turn is 2π·32 = 201.06 codes. (−30, 1) lies at π − atan(1/30) = 3.108271 rad = 99.465 codes;
    // an answer of −100 (−3.125 rad) is 0.0499 rad past −π, so +1.597 codes from the exact angle, not −199.5.
    const s = new VectorScoreAccumulator({ ...SMALL, angleFormat: 'rad', angleBits: 8, angleFrac: 5 });
    s.add([-30], [1], [-100], [30]);
    expect(s.summary().angleLsb.mean).toBeCloseTo(1.597, 3);
  });

  it('counts answers that differ from the model, wrapping angles, and keeps the first by request index', () => {
    const model = createVectorModel(SMALL);
    const xs = Int32Array.from([10, 50, -60, 0, 1]);
    const ys = Int32Array.from([0, -1, 7, 0, 1]);
    const angles = new Int32Array(5);
    const mags = new Int32Array(5);
    model.answerInto(xs, ys, angles, mags);
    const clean = new VectorScoreAccumulator(SMALL).add(xs, ys, angles, mags).summary();
    expect(clean.mismatches).toEqual({ count: 0, maxAbsDiffLsb: 0, first: [] });
    const wrong = Array.from(angles);
    wrong[0] = (angles[0] + 255) % 256; // one code clockwise, across 0 if the model says 0
    const wrongMag = Array.from(mags);
    wrongMag[4] += 3;
    const r = new VectorScoreAccumulator(SMALL, { keepMismatches: 1 }).add(xs, ys, wrong, wrongMag, 100).summary();
    expect(r.mismatches.count).toBe(2);
    expect(r.mismatches.maxAbsDiffLsb).toBe(3);
    expect(r.mismatches.first).toEqual([{ index: 100, x: 10, y: 0, angle: wrong[0], magnitude: mags[0], modelAngle: angles[0], modelMagnitude: mags[0] }]);
  });

  it('merges pieces into what one pass over all answers gives', () => {
    const model = createVectorModel(SMALL);
    const xs = Int32Array.from({ length: 200 }, (_, k) => -128 + ((k * 37) % 256));
    const ys = Int32Array.from({ length: 200 }, (_, k) => -128 + ((k * 91) % 256));
    const angles = new Int32Array(200);
    const mags = new Int32Array(200);
    model.answerInto(xs, ys, angles, mags);
    mags[150] += 2;
    const whole = new VectorScoreAccumulator(SMALL).add(xs, ys, angles, mags).summary();
    const a = new VectorScoreAccumulator(SMALL).add(xs.subarray(0, 120), ys.subarray(0, 120), angles.subarray(0, 120), mags.subarray(0, 120));
    const b = new VectorScoreAccumulator(SMALL).add(xs.subarray(120), ys.subarray(120), angles.subarray(120), mags.subarray(120), 120);
    const merged = b.merge(a).summary();
    expect(merged.count).toBe(whole.count);
    expect(merged.angleLsb.maxAbs).toBe(whole.angleLsb.maxAbs);
    expect(merged.angleLsb.worst).toEqual(whole.angleLsb.worst);
    expect(merged.angleLsb.rms).toBeCloseTo(whole.angleLsb.rms, 12);
    expect(merged.magnitudePpm.mean).toBeCloseTo(whole.magnitudePpm.mean, 9);
    expect(merged.histogram).toEqual(whole.histogram);
    expect(merged.coverage).toEqual(whole.coverage);
    expect(merged.mismatches).toEqual(whole.mismatches);
    expect(whole.mismatches.first[0]).toMatchObject({ index: 150, x: xs[150], y: ys[150] });
    expect(() => a.merge(new VectorScoreAccumulator({ ...SMALL, iterations: 5 }))).toThrow(ScoringError);
  });

  it('refuses answers the formats cannot hold and batches of unequal length', () => {
    const s = new VectorScoreAccumulator(SMALL);
    // The first answer differs from the model; the second is refused, and so is the whole batch.
    expect(() => s.add([1, 1], [1, 1], [99, 256], [0, 0])).toThrow(/answers\[1\]: angle 256/);
    expect(() => s.add([1], [1], [0], [512])).toThrow(/answers\[0\]: magnitude 512 is not an integer -512\.\.511/);
    expect(() => s.add([1], [128], [0], [0])).toThrow(VectorInputError);
    expect(() => s.add([1, 2], [1], [0], [0])).toThrow(ScoringError);
    expect(s.summary().count).toBe(0); // nothing half-added
    expect(s.summary().mismatches.count).toBe(0);
  });
});

describe('coverage of the input plane', () => {
  it('covers every cell, sector and ring, and counts each pair once, on every input of a 4 + 4-bit core', () => {
    const c = new VectorCoverage({ inBits: 4 });
    const xs: number[] = [];
    const ys: number[] = [];
    for (let x = -8; x < 8; x++) for (let y = -8; y < 8; y++) {
        xs.push(x);
        ys.push(y);
      }
    c.addAll(xs, ys, xs.length);
    c.addAll(xs, ys, xs.length); // seen twice, still 256 distinct
    const r = c.summary();
    expect(r.distinct).toBe(256);
    expect(r.total).toBe(256);
    expect(r.cells).toMatchObject({ occupied: 256, total: 256, share: 1 });
    expect(r.cells.counts.every((n) => n === 2)).toBe(true);
    expect(r.sectors).toMatchObject({ occupied: 16, share: 1 });
    expect(r.rings).toMatchObject({ occupied: 8, share: 1 });
    expect(r.zeroVectors).toBe(2);
    expect(r.sectors.counts.reduce((a, b) => a + b, 0)).toBe(2 * 255); // the zero vector lies in no sector
  });

  it('places single vectors in the cell, sector and ring they belong to', () => {
    const c = new VectorCoverage({ inBits: 8 }, { cellsPerAxis: 2, sectors: 4, rings: 2 });
    // (100, −1): right half, lower half → cell 1 (row 0, column 1); angle just below a full turn → sector 3;
    // radius 100 of √2·128 = 181 → ring 1.
    c.addAll([100], [-1], 1);
    const r = c.summary();
    expect(r.cells.counts).toEqual([0, 1, 0, 0]);
    expect(r.sectors.counts).toEqual([0, 0, 0, 1]);
    expect(r.rings.counts).toEqual([0, 1]);
    expect(r.cells.share).toBe(0.25);
    expect(new VectorCoverage({ inBits: 13 }).summary().distinct).toBeNull(); // 26 bits of pairs: no exact count
  });
});
