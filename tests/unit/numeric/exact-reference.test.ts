import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Decimal from 'decimal.js';
import { exactSinCos, exactSinCosInto, exactSinCosOfTurns, idealOutputCode, idealOutputCodes } from '../../../shared/numeric/exact-reference';
import { angleCodeRange, type AngleFormat } from '../../../shared/numeric/formats';

Decimal.set({ precision: 40 });
// Published values are kept as text with all their digits; a double holds about 17 of them.
const PI = Decimal.acos(-1);

/** sin and cos of the angle a code stands for, in 40-digit decimal arithmetic (decimal.js). */
function decimalSinCos(f: AngleFormat, code: number) {
  const rad = f.angleFormat === 'turn' ? PI.mul(2).mul(code).div(2 ** f.angleBits) : new Decimal(code).div(2 ** f.angleFrac);
  return { cos: Decimal.cos(rad), sin: Decimal.sin(rad) };
}

const formatAndCode = fc
  .oneof(
    fc.integer({ min: 2, max: 32 }).map((angleBits): AngleFormat => ({ angleFormat: 'turn', angleBits, angleFrac: 0 })),
    fc.integer({ min: 2, max: 32 }).chain((angleBits) => fc.integer({ min: 0, max: angleBits }).map((angleFrac): AngleFormat => ({ angleFormat: 'rad', angleBits, angleFrac }))),
  )
  .chain((f) => fc.tuple(fc.constant(f), fc.integer({ min: angleCodeRange(f).min, max: angleCodeRange(f).max })));

describe('the exact reference', () => {
  it('agrees with 40-digit decimal sin and cos to within a few units of double rounding', () => {
    // decimal.js as the outside arbitrary-precision reference.
    fc.assert(
      fc.property(formatAndCode, ([f, code]) => {
        const e = exactSinCos(f, code);
        const d = decimalSinCos(f, code);
        expect(Math.abs(e.cos - d.cos.toNumber())).toBeLessThan(4e-16);
        expect(Math.abs(e.sin - d.sin.toNumber())).toBeLessThan(4e-16);
      }),
      { numRuns: 2000 },
    );
  });

  it('gives the closed forms sin 30° = 1/2, sin 45° = √2/2, sin 60° = √3/2', () => {
    // Abramowitz & Stegun, Handbook of Mathematical Functions (1964), ch. 4 (closed forms).
    expect(exactSinCosOfTurns(1 / 12).sin).toBeCloseTo(0.5, 15);
    expect(exactSinCosOfTurns(1 / 8).sin).toBeCloseTo(Math.SQRT2 / 2, 15);
    expect(exactSinCosOfTurns(1 / 8).cos).toBeCloseTo(Math.SQRT2 / 2, 15);
    expect(exactSinCosOfTurns(1 / 6).sin).toBeCloseTo(Math.sqrt(3) / 2, 15);
    expect(exactSinCosOfTurns(1 / 6).cos).toBeCloseTo(0.5, 15);
  });

  it('matches the tabulated sin and cos of 1°, 5°, 10°, 18°, 36° and 1 rad', () => {
    // docs/references.md "Exact values" (recomputed in arbitrary precision; A&S ch. 4 tabulates the same).
    const table: [number, number, number][] = [
      [1, Number('0.0174524064372835128'), Number('0.999847695156391239')],
      [5, Number('0.0871557427476581736'), Number('0.996194698091745532')],
      [10, Number('0.173648177666930349'), Number('0.984807753012208059')],
      [18, Number('0.309016994374947424'), Number('0.951056516295153572')],
      [36, Number('0.587785252292473129'), Number('0.809016994374947424')],
    ];
    for (const [deg, sin, cos] of table) {
      const e = exactSinCosOfTurns(deg / 360);
      expect(e.sin).toBeCloseTo(sin, 15);
      expect(e.cos).toBeCloseTo(cos, 15);
    }
    // 1 rad is exactly code 4096 with 12 fraction bits.
    const oneRad = exactSinCos({ angleFormat: 'rad', angleBits: 16, angleFrac: 12 }, 4096);
    expect(oneRad.sin).toBeCloseTo(Number('0.841470984807896507'), 15);
    expect(oneRad.cos).toBeCloseTo(Number('0.540302305868139717'), 15);
  });

  it('keeps the symmetries of binary angles exact: zeros at quarter turns, mirrored octants', () => {
    // sin(π − a) = sin a, cos(−a) = cos a (A&S ch. 4, 4.3.13 and 4.3.14 from memory).
    const f: AngleFormat = { angleFormat: 'turn', angleBits: 16, angleFrac: 0 };
    expect(exactSinCos(f, 0x8000)).toEqual({ cos: -1, sin: 0 });
    expect(exactSinCos(f, 0x4000)).toEqual({ cos: 0, sin: 1 });
    expect(exactSinCos(f, 0xc000)).toEqual({ cos: 0, sin: -1 });
    for (const k of [1, 1000, 5461, 8191, 12345]) {
      expect(exactSinCos(f, 0x8000 - k).sin).toBe(exactSinCos(f, k).sin);
      expect(exactSinCos(f, 65536 - k).cos).toBe(exactSinCos(f, k).cos);
    }
  });

  it('fills caller arrays in a batch with the one-at-a-time values', () => {
    const f: AngleFormat = { angleFormat: 'rad', angleBits: 20, angleFrac: 16 };
    const codes = [-524288, -1, 0, 1, 102944, 524287];
    const cos = new Float64Array(codes.length);
    const sin = new Float64Array(codes.length);
    exactSinCosInto(f, codes, cos, sin);
    codes.forEach((code, k) => expect({ cos: cos[k], sin: sin[k] }).toEqual(exactSinCos(f, code)));
  });
});

describe('the ideal output codes', () => {
  it('round the exact value once, half away from zero, as decimal arithmetic does', () => {
    // decimal.js ROUND_HALF_UP rounds half away from zero.
    const f = { angleFormat: 'turn' as const, angleBits: 16, angleFrac: 0, outBits: 16, outFrac: 14 };
    for (const code of [1, 182, 1820, 5461, 0x2000, 30000, 50000]) {
      const d = decimalSinCos(f, code);
      const round = (v: Decimal) => v.mul(2 ** 14).toDecimalPlaces(0, Decimal.ROUND_HALF_UP).toNumber();
      expect(idealOutputCodes(f, code)).toEqual({ cos: round(d.cos), sin: round(d.sin) });
    }
  });

  it('saturate at the format ends, so Q15 gives 32767 for 1.0', () => {
    // docs/references.md "Number formats": Q15 tops out at 1 − 2^-15 (common practice).
    expect(idealOutputCode({ outBits: 16, outFrac: 15 }, 1)).toBe(32767);
    expect(idealOutputCode({ outBits: 16, outFrac: 15 }, -1)).toBe(-32768);
  });
});
