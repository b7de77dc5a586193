import { describe, expect, it } from 'vitest';
import { COLUMNS, PlotBuilder, RAW_LIMIT } from '../../../src/features/sessions/scoring/plot-builder';
import { angleCodeToDegrees, createCordicModel, exactSinCosInto, parseModelConfig } from '../../../shared/numeric';

const config = parseModelConfig({});

/** The model's answers for `codes`, with their errors against exact math in LSB. */
function answers(codes: Float64Array) {
  const n = codes.length;
  const cos = new Int32Array(n);
  const sin = new Int32Array(n);
  createCordicModel(config).evaluateInto(codes, cos, sin);
  const ec = new Float64Array(n);
  const es = new Float64Array(n);
  exactSinCosInto(config, codes, ec, es);
  const scale = 2 ** config.outFrac;
  return { cos, sin, errCos: cos.map((c, k) => c - ec[k] * scale), errSin: Float64Array.from(sin, (s, k) => s - es[k] * scale) };
}

describe('chart data from stored samples', () => {
  it('keeps up to RAW_LIMIT samples as they are, in angle order, whatever order they came in', () => {
    const codes = Float64Array.from({ length: 100 }, (_, i) => (i * 7919) % 65536);
    const a = answers(codes);
    const b = new PlotBuilder(config, codes.length);
    b.add(codes, a.cos, a.sin, Float64Array.from(a.errCos), a.errSin);
    const d = b.build();
    expect(b.raw).toBe(true);
    const x = Array.from(d.errorCos[0] as Float64Array);
    expect(x).toHaveLength(100);
    expect(x).toEqual([...x].sort((p, q) => p - q));
    // Each point is still the sample it came from.
    const k = codes.findIndex((c) => angleCodeToDegrees(config, c) === x[10]);
    expect((d.errorCos[1] as Float64Array)[10]).toBeCloseTo(a.errCos[k], 12);
    expect((d.values[2] as Float64Array)[10]).toBe(a.cos[k] / 2 ** config.outFrac);
  });

  it('reduces an exhaustive run to min and max per column, in chunks, keeping the extremes', () => {
    const codes = Float64Array.from({ length: 65536 }, (_, i) => i);
    expect(codes.length).toBeGreaterThan(RAW_LIMIT);
    const a = answers(codes);
    const b = new PlotBuilder(config, codes.length);
    for (let at = 0; at < codes.length; at += 10_000) {
      const end = Math.min(codes.length, at + 10_000);
      b.add(codes.subarray(at, end), a.cos.subarray(at, end), a.sin.subarray(at, end), Float64Array.from(a.errCos.subarray(at, end)), a.errSin.subarray(at, end));
    }
    const d = b.build();
    expect(b.raw).toBe(false);
    const ys = d.errorSin[1] as Float64Array;
    expect(ys).toHaveLength(2 * COLUMNS);
    // The envelope holds the true extremes of the whole run.
    expect(Math.max(...ys)).toBe(Math.max(...a.errSin));
    expect(Math.min(...ys)).toBe(Math.min(...a.errSin));
    for (let j = 0; j < COLUMNS; j++) expect(ys[2 * j]).toBeLessThanOrEqual(ys[2 * j + 1]);
    // One XY point per column, sorted by cos, on the unit circle within the output's LSBs.
    const [xc, xs] = d.xy as Float64Array[];
    expect(xc).toHaveLength(COLUMNS);
    for (let j = 1; j < xc.length; j++) expect(xc[j]).toBeGreaterThanOrEqual(xc[j - 1]);
    for (let j = 0; j < xc.length; j++) expect(Math.abs(Math.hypot(xc[j], xs[j]) - 1)).toBeLessThan(1e-3);
  });

  it('refuses more samples than it was told to expect in raw mode', () => {
    const b = new PlotBuilder(config, 1);
    expect(() => b.add([0, 1], [0, 0], [0, 0], [0, 0], [0, 0])).toThrow(/more samples/);
  });
});
