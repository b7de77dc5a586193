import { describe, expect, it } from 'vitest';
import { MAP_CELLS, RAW_POINTS, VectorPlotData, vectorErrorsInto, vectorHistogramData } from '../../../src/components/charts/vector-plot-data';
import { mapColour, mapPeak, mapWords } from '../../../src/components/charts/error-map';
import { vectorStatRows } from '../../../src/components/vector-stat-rows';
import { createVectorModel, parseVectorConfig, planVectors, VectorScoreAccumulator } from '../../../shared/vectoring';

// 16-bit binary angles: a quarter turn is 2^14 codes (the binary angle's definition, common practice, no source).
const config = parseVectorConfig({ inBits: 8, inFrac: 6, angleBits: 16 });
const scratch = () => ({ angle: new Float64Array(8), magnitude: new Float64Array(8) });

describe('vectorErrorsInto', () => {
  it('measures angles against atan2 in angle LSB, wrapped at half a turn, and leaves the zero vector without one', () => {
    const xs = [64, 0, -64, 0];
    const ys = [0, 64, 0, 0];
    // (64, 0) is 0 turns; (0, 64) a quarter turn; (−64, 0) half a turn; answered 3 LSB high, 2 low, and −1 (wrapping to just below a turn) for 0.
    const angles = [3, 2 ** 14 - 2, 2 ** 15, 0];
    const ae = new Float32Array(4);
    const me = new Float32Array(4);
    vectorErrorsInto(config, xs, ys, angles, [0, 0, 0, 0], scratch(), ae, me);
    expect(Array.from(ae.subarray(0, 3))).toEqual([3, -2, 0]);
    expect(Number.isNaN(ae[3])).toBe(true);
    const wrapped = new Float32Array(1);
    vectorErrorsInto(config, [64], [0], [2 ** 16 - 1], [0], scratch(), wrapped, new Float32Array(1));
    expect(wrapped[0]).toBe(-1);
  });

  it('agrees with the scorer: the same largest |error| over a plan', () => {
    const { xs, ys } = planVectors({ kind: 'random', seed: 7, count: 500 }, config);
    const a = new Int32Array(500);
    const m = new Int32Array(500);
    createVectorModel(config).answerInto(xs, ys, a, m);
    const ae = new Float32Array(500);
    const me = new Float32Array(500);
    vectorErrorsInto(config, xs, ys, a, m, { angle: new Float64Array(500), magnitude: new Float64Array(500) }, ae, me);
    const s = new VectorScoreAccumulator(config).add(xs, ys, a, m).summary();
    const maxAbs = (v: Float32Array) => Math.max(...Array.from(v).filter(Number.isFinite).map(Math.abs));
    expect(maxAbs(ae)).toBeCloseTo(s.angleLsb.maxAbs, 3);
    expect(maxAbs(me)).toBeCloseTo(s.magnitudeLsb.maxAbs, 3);
  });
});

describe('VectorPlotData', () => {
  it('places each answer by direction, magnitude and map cell', () => {
    const p = new VectorPlotData(config);
    p.add([64, 0, 0, -128], [0, 64, 0, -128], [1, -2, NaN, 4], [0.5, -0.25, 0.75, 1]);
    const c = p.charts();
    // Directions in degrees, ascending: (−128, −128) is −135°, (64, 0) 0°, (0, 64) 90°; the zero vector has none.
    expect(c.angleError[0]).toEqual([-135, 0, 90]);
    expect(c.angleError[1]).toEqual([4, 1, -2]);
    // Magnitudes in input units (64 codes = 1.0 with 6 fraction bits); the zero vector at 0.
    expect(c.magnitudeError[0]).toEqual([0, 1, 1, Math.SQRT2 * 2]);
    const cell = (x: number, y: number) => Math.floor(((y + 128) / 256) * MAP_CELLS) * MAP_CELLS + Math.floor(((x + 128) / 256) * MAP_CELLS);
    expect(c.map.angle[cell(64, 0)]).toBe(1);
    expect(c.map.angle[cell(0, 64)]).toBe(2);
    expect(c.map.angle[cell(0, 0)]).toBe(-1);
    expect(c.map.magnitude[cell(0, 0)]).toBe(0.75);
    expect(c.map.angle[0]).toBe(4);
    expect(mapPeak(c.map.angle, MAP_CELLS)).toEqual({ value: 4, cx: 0, cy: 0 });
    // Cell 0 holds codes −128..−125: its centre, −126 codes, is −1.96875 in input units.
    expect(mapWords(c.map, 'angle')).toMatch(/3 of 4096 cells answered; the largest, 4\.00 LSB, near x = -1\.97, y = -1\.97/);
  });

  it('keeps two points per column once past the raw limit, the extremes of each', () => {
    const p = new VectorPlotData(config);
    const n = RAW_POINTS + 10;
    const xs = new Int32Array(n).fill(64);
    const ys = new Int32Array(n).fill(0);
    const err = Float32Array.from({ length: n }, (_, i) => (i % 7) - 3);
    p.add(xs, ys, err, err);
    const c = p.charts();
    expect(c.angleError[0].length).toBe(2);
    expect(c.angleError[1]).toEqual([-3, 3]);
  });
});

describe('the error map colours and the figures', () => {
  it('runs from pale teal to the fail red', () => {
    expect(mapColour(0)).toBe('rgb(211, 236, 232)');
    expect(mapColour(1)).toBe('rgb(168, 64, 47)');
  });

  it('lists the figures of a summary in words', () => {
    const { xs, ys } = planVectors({ kind: 'edges' }, config);
    const a = new Int32Array(xs.length);
    const m = new Int32Array(xs.length);
    createVectorModel(config).answerInto(xs, ys, a, m);
    const s = new VectorScoreAccumulator(config).add(xs, ys, a, m).summary();
    const rows = Object.fromEntries(vectorStatRows(s).map((r) => [r.key, r.value]));
    expect(rows.count).toBe(xs.length.toLocaleString('en-US'));
    expect(rows.mismatches).toBe('0');
    expect(rows['angle-max']).toMatch(new RegExp(`^${s.angleLsb.maxAbs.toFixed(3)} LSB at \\(-?\\d+, -?\\d+\\)$`));
    expect(vectorStatRows(null)).toEqual([]);
    expect(vectorHistogramData(s.histogram)[1]).toEqual(s.histogram.angle);
  });
});
