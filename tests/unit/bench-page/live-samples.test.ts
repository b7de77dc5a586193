import { describe, expect, it } from 'vitest';
import { COLUMNS, LiveSamples, RAW_LIMIT } from '../../../src/features/bench/live/live-samples';
import { angleCodeRange, angleCodeToDegrees, parseModelConfig, type ModelConfig } from '../../../shared/numeric';

/** The chart store the long way: angleCodeToDegrees per code, min and max per column, one sample at a time. */
function byDefinition(config: ModelConfig, codes: number[], cos: number[], sin: number[], errCos: number[], errSin: number[]) {
  const r = angleCodeRange(config);
  const lo = angleCodeToDegrees(config, r.min);
  const span = angleCodeToDegrees(config, r.max) - lo || 1;
  const scale = 2 ** -config.outFrac;
  const min = { cos: new Float64Array(COLUMNS).fill(Infinity), sin: new Float64Array(COLUMNS).fill(Infinity), errCos: new Float64Array(COLUMNS).fill(Infinity), errSin: new Float64Array(COLUMNS).fill(Infinity) };
  const max = { cos: new Float64Array(COLUMNS).fill(-Infinity), sin: new Float64Array(COLUMNS).fill(-Infinity), errCos: new Float64Array(COLUMNS).fill(-Infinity), errSin: new Float64Array(COLUMNS).fill(-Infinity) };
  const rawX: number[] = [];
  codes.forEach((code, k) => {
    const x = angleCodeToDegrees(config, code);
    if (rawX.length < RAW_LIMIT) rawX.push(x);
    const c = Math.min(COLUMNS - 1, Math.max(0, Math.floor(((x - lo) / span) * COLUMNS)));
    const v = { cos: cos[k] * scale, sin: sin[k] * scale, errCos: Math.fround(errCos[k]), errSin: Math.fround(errSin[k]) };
    for (const s of ['cos', 'sin', 'errCos', 'errSin'] as const) {
      min[s][c] = Math.min(min[s][c], v[s]);
      max[s][c] = Math.max(max[s][c], v[s]);
    }
  });
  return { rawX, min, max };
}

describe('the live chart store', () => {
  // A turn-format core and a rad-format one: the two ways a code becomes degrees.
  for (const input of [{ angleBits: 16 }, { angleFormat: 'rad', angleBits: 14, angleFrac: 11, outBits: 18, outFrac: 16 }]) {
    it(`holds, for ${JSON.stringify(input)}, exactly the angles and per-column extremes of the definition`, () => {
      const config = parseModelConfig(input);
      const r = angleCodeRange(config);
      // A seeded walk over the codes, more than RAW_LIMIT of them, fed in uneven batches.
      let seed = 12345;
      const next = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31);
      const n = RAW_LIMIT + 20_000;
      const codes = Array.from({ length: n }, () => r.min + (next() % r.count));
      const cos = codes.map(() => (next() % 65_536) - 32_768);
      const sin = codes.map(() => (next() % 65_536) - 32_768);
      const errCos = codes.map(() => ((next() % 2001) - 1000) / 997);
      const errSin = codes.map(() => ((next() % 2001) - 1000) / 991);
      const s = new LiveSamples(config);
      for (let from = 0; from < n; from += 3_001) {
        const to = Math.min(n, from + 3_001);
        s.add(Float64Array.from(codes.slice(from, to)), Int32Array.from(cos.slice(from, to)), Int32Array.from(sin.slice(from, to)), Float32Array.from(errCos.slice(from, to)), Float32Array.from(errSin.slice(from, to)));
      }
      const want = byDefinition(config, codes, cos, sin, errCos, errSin);
      expect(s.count).toBe(n);
      expect(Array.from(s.raw.x)).toEqual(want.rawX);
      for (const k of ['cos', 'sin', 'errCos', 'errSin'] as const) {
        expect(Array.from(s.min[k])).toEqual(Array.from(want.min[k]));
        expect(Array.from(s.max[k])).toEqual(Array.from(want.max[k]));
      }
      expect(s.filled.reduce((a, b) => a + b, 0)).toBe(want.min.cos.filter(Number.isFinite).length);
    });
  }
});
