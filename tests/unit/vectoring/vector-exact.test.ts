import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Decimal from 'decimal.js';
import { VectorInputError } from '../../../shared/vectoring/errors';
import { inputRange, parseVectorConfig, type VectorConfig } from '../../../shared/vectoring/vector-config';
import { exactVector, exactVectorInto, idealVectorCodes, nominalGain } from '../../../shared/vectoring/vector-exact';

Decimal.set({ precision: 40 });
const PI = Decimal.acos(-1);

/** The exact angle (output LSB) and magnitude (output LSB) in 40-digit decimal arithmetic. */
function decimalVector(c: VectorConfig, x: number, y: number): { angle: Decimal; magnitude: Decimal } {
  let a = x === 0 && y === 0 ? new Decimal(0) : Decimal.atan2(y, x);
  if (c.angleFormat === 'turn') {
    a = a.div(PI.times(2)).times(new Decimal(2).pow(c.angleBits));
    if (a.isNegative()) a = a.plus(new Decimal(2).pow(c.angleBits));
  } else {
    a = a.times(new Decimal(2).pow(c.angleFrac));
  }
  let growth = new Decimal(1);
  if (c.gainCompensation === 'none') for (let i = 0; i < c.iterations; i++) growth = growth.times(new Decimal(1).plus(new Decimal(2).pow(-2 * i)).sqrt());
  const magnitude = new Decimal(x).pow(2).plus(new Decimal(y).pow(2)).sqrt().times(growth).times(new Decimal(2).pow(c.magFrac - c.inFrac));
  return { angle: a, magnitude };
}

describe('the exact reference of a vectoring core', () => {
  it('agrees with atan2 and sqrt in 40-digit decimal arithmetic on random inputs (seeded)', () => {
    // decimal.js as the outside arbitrary-precision reference (docs/references.md "Reference libraries").
    const configs = [
      parseVectorConfig({}),
      parseVectorConfig({ angleFormat: 'rad', angleBits: 24, inBits: 24, inFrac: 20, gainCompensation: 'multiply', magBits: 28, magFrac: 22 }),
      parseVectorConfig({ inBits: 8, angleBits: 31, iterations: 7 }),
    ];
    for (const c of configs) {
      const r = inputRange(c);
      fc.assert(
        fc.property(fc.integer({ min: r.min, max: r.max }), fc.integer({ min: r.min, max: r.max }), (x, y) => {
          const e = exactVector(c, x, y);
          const d = decimalVector(c, x, y);
          // A double holds about 16 digits: a relative 1e-14 of the value, or 1e-9 LSB near zero.
          expect(Math.abs(e.angle - d.angle.toNumber())).toBeLessThanOrEqual(Math.max(1e-9, Math.abs(d.angle.toNumber()) * 1e-14));
          expect(Math.abs(e.magnitude - d.magnitude.toNumber())).toBeLessThanOrEqual(Math.max(1e-9, d.magnitude.toNumber() * 1e-14));
        }),
        { numRuns: 400, seed: 22 },
      );
    }
  });

  it('gives the tabulated arctangents in radians', () => {
    // atan(1/2), atan(2), atan(3), atan(1/5): digits from memory, recomputed with decimal.js
    // (docs/references.md "CORDIC, vectoring mode"); atan 1 = π/4 (Abramowitz & Stegun chapter 4, closed form).
    const c = parseVectorConfig({ angleFormat: 'rad', angleBits: 31, angleFrac: 28 });
    const rad = (x: number, y: number) => exactVector(c, x, y).angle / 2 ** 28;
    const table: [number, number, string][] = [
      [2, 1, '0.46364760900080611621'],
      [1, 2, '1.10714871779409050302'],
      [1, 3, '1.24904577239825442583'],
      [5, 1, '0.19739555984988075837'],
      [1, 1, '0.78539816339744830962'],
    ];
    for (const [x, y, v] of table) expect(Math.abs(rad(x, y) - Number(v))).toBeLessThan(1e-15);
    // The other quadrants follow by symmetry: atan2(y, −x) = π − atan2(y, x), atan2(−y, x) = −atan2(y, x).
    expect(Math.abs(rad(-2, 1) - (Math.PI - Number('0.46364760900080611621')))).toBeLessThan(1e-15);
    expect(Math.abs(rad(2, -1) + Number('0.46364760900080611621'))).toBeLessThan(1e-15);
    expect(rad(-1, 0)).toBe(Math.PI); // atan2(+0, −1) = +π: the branch cut belongs to +π
  });

  it('reads binary angles as a turn from 0: the axes and diagonals exactly, negative angles as a turn minus them', () => {
    // docs/references.md "Number formats": 16-bit binary angles, 45° = 0x2000, 90° = 0x4000, 180° = 0x8000.
    const c = parseVectorConfig({});
    const angle = (x: number, y: number) => exactVector(c, x, y).angle;
    expect([angle(5, 0), angle(5, 5), angle(0, 5), angle(-5, 5), angle(-5, 0), angle(-5, -5), angle(0, -5), angle(5, -5)]).toEqual([
      0, 0x2000, 0x4000, 0x6000, 0x8000, 0xa000, 0xc000, 0xe000,
    ]);
    expect(angle(0, 0)).toBe(0);
    expect(angle(32767, -1)).toBeGreaterThan(65535);
    expect(angle(32767, -1)).toBeLessThan(65536);
  });

  it('gives Pythagorean magnitudes exactly, times the CORDIC gain when the core leaves it in', () => {
    // 3-4-5, 5-12-13, 8-15-17 (common practice, no source); 1/K_16 = 1.6467602578654548145
    // (docs/references.md "CORDIC, rotation mode", Volder 1959; Walther 1971).
    const compensated = parseVectorConfig({ gainCompensation: 'multiply', inFrac: 14, magFrac: 12 });
    expect(exactVector(compensated, 3, 4).magnitude).toBe(5 / 4);
    expect(exactVector(compensated, -12, 5).magnitude).toBe(13 / 4);
    expect(exactVector(compensated, 8, -15).magnitude).toBe(17 / 4);
    const grown = parseVectorConfig({ iterations: 16 });
    expect(nominalGain(grown)).toBeCloseTo(Number('1.6467602578654548145'), 15);
    expect(exactVector(grown, 3, 4).magnitude).toBeCloseTo(5 * Number('1.6467602578654548145'), 12);
    expect(nominalGain(compensated)).toBe(1);
  });

  it('rounds once to the ideal codes, wrapping binary angles and saturating the magnitude', () => {
    const c = parseVectorConfig({ inBits: 8, inFrac: 6, magBits: 8, magFrac: 6, gainCompensation: 'multiply' });
    expect(idealVectorCodes(c, 3, 4)).toEqual({ angle: Math.round((Math.atan2(4, 3) / (2 * Math.PI)) * 65536), magnitude: 5 });
    expect(idealVectorCodes(c, 127, 127).magnitude).toBe(127);
    // atan(1/127) ≈ 1/127 − 1/(3·127³) = 0.0078739 rad = 82.13 codes of 65536/2π: 65536 − 82.13 → 65454.
    expect(idealVectorCodes(c, 127, -1).angle).toBe(65454);
    expect(idealVectorCodes(c, 127, 0).angle).toBe(0);
  });

  it('refuses inputs the format cannot hold, naming the pair', () => {
    const c = parseVectorConfig({ inBits: 8 });
    expect(() => exactVector(c, 128, 0)).toThrow(VectorInputError);
    const a = new Float64Array(2);
    expect(() => exactVectorInto(c, [0, 1], [0, -129], a, a)).toThrow(/inputs\[1\]: \(1, -129\)/);
  });
});
