import { describe, expect, it } from 'vitest';
import Decimal from 'decimal.js';
import { buildCordicTables, cordicGain } from '../../../shared/numeric/cordic-tables';
import { parseModelConfig } from '../../../shared/numeric/model-config';

Decimal.set({ precision: 40 });
// Published values are kept as text with all their digits; a double holds about 17 of them.

describe('the CORDIC gain K_n', () => {
  it('matches the published K_n for 8, 12, 16, 20 and 24 iterations', () => {
    // docs/references.md "CORDIC, rotation mode": K_n = Π (1+2^-2i)^-1/2 (Volder 1959; Walther 1971).
    const table: [number, number, number][] = [
      [8, Number('0.60725911229889273006'), Number('1.6467435065969011554')],
      [12, Number('0.60725295913894481363'), Number('1.6467601926846950316')],
      [16, Number('0.60725293510313931731'), Number('1.6467602578654548145')],
      [20, Number('0.60725293500924945172'), Number('1.6467602581200671685')],
      [24, Number('0.60725293500888269443'), Number('1.6467602581210617481')],
    ];
    for (const [n, k, inv] of table) {
      expect(Math.abs(cordicGain(n) - k)).toBeLessThan(1e-15);
      expect(Math.abs(1 / cordicGain(n) - inv)).toBeLessThan(1e-14);
    }
  });

  it('tends to 0.6072529350088812561694 as iterations grow', () => {
    // docs/references.md "CORDIC, rotation mode": K_∞ = 0.6072529350088812561694 (Volder 1959; Walther 1971).
    expect(Math.abs(cordicGain(40) - Number('0.6072529350088812561694'))).toBeLessThan(1e-15);
  });

  it('agrees with the product computed in 40-digit decimal arithmetic', () => {
    // decimal.js as the outside arbitrary-precision reference.
    for (const n of [1, 2, 5, 10, 17, 31]) {
      let k = new Decimal(1);
      for (let i = 0; i < n; i++) k = k.div(new Decimal(1).plus(new Decimal(2).pow(-2 * i)).sqrt());
      expect(Math.abs(cordicGain(n) - k.toNumber())).toBeLessThan(1e-15); // a few ulps of rounding in the double product
    }
  });

  it('starts x at 19898 in Q15 for many iterations, the usual gain-compensated constant', () => {
    // docs/references.md "CORDIC, rotation mode": round(K_∞ · 32768) = 19898 (0x4DBA), ≈ 0.60725 (common practice, no source).
    const t = buildCordicTables(parseModelConfig({ outBits: 16, outFrac: 15, guardBits: 0, iterations: 32 }));
    expect(t.x0).toBe(19898);
    expect(t.x0).toBe(0x4dba);
    expect(cordicGain(32)).toBeCloseTo(0.60725, 5);
  });
});

describe('the arctangent table', () => {
  it('holds atan(2^-i) as 16-bit binary angles exactly as published', () => {
    // docs/references.md "CORDIC, rotation mode": 16-bit binary-angle codes of atan(2^-i), i = 0..15.
    const t = buildCordicTables(parseModelConfig({ angleBits: 16, zGuardBits: 0, iterations: 16 }));
    expect(Array.from(t.atan)).toEqual([8192, 4836, 2555, 1297, 651, 326, 163, 81, 41, 20, 10, 5, 3, 1, 1, 0]);
  });

  it('holds atan(2^-i) in radians that match the published values', () => {
    // docs/references.md "CORDIC, rotation mode": atan(2^-i) for i = 0, 1, 2, 3, 4, 8, 16.
    const published: [number, number][] = [
      [0, Number('0.78539816339744830962')],
      [1, Number('0.46364760900080611621')],
      [2, Number('0.24497866312686415417')],
      [3, Number('0.12435499454676143503')],
      [4, Number('0.062418809995957348474')],
      [8, Number('0.0039062301319669718276')],
      [16, Number('1.5258789061315762107e-5')],
    ];
    // 32 fraction bits of z: each entry is the value rounded to 2^-32 rad.
    const t = buildCordicTables(parseModelConfig({ angleFormat: 'rad', angleBits: 32, angleFrac: 30, zGuardBits: 2, iterations: 17 }));
    for (const [i, v] of published) {
      expect(t.atan[i]).toBe(new Decimal(v).mul(2 ** 32).toDecimalPlaces(0, Decimal.ROUND_HALF_UP).toNumber());
    }
  });

  it('sums to the convergence range of about 1.7433 rad (99.88°), beyond a quarter turn', () => {
    // docs/references.md "CORDIC, rotation mode": Σ atan(2^-i) = 1.7432866204723400035 rad (Walther gives ≈ 1.74; Andraka).
    const t = buildCordicTables(parseModelConfig({ angleFormat: 'rad', angleBits: 32, angleFrac: 30, iterations: 40 }));
    const sum = t.atan.reduce((a, b) => a + b, 0) / 2 ** 32;
    expect(Math.abs(sum - Number('1.7432866204723400035'))).toBeLessThan(40 * 2 ** -33);
    expect(sum).toBeGreaterThan(Math.PI / 2);
  });

  it('counts one turn as 2^zBits for binary angles and round(2π·2^zFrac) for radians', () => {
    const turn = buildCordicTables(parseModelConfig({ angleBits: 12, zGuardBits: 3 }));
    expect([turn.zTurn, turn.zHalf, turn.zQuarter]).toEqual([2 ** 15, 2 ** 14, 2 ** 13]);
    const rad = buildCordicTables(parseModelConfig({ angleFormat: 'rad', angleBits: 16, angleFrac: 12, zGuardBits: 2 }));
    // decimal.js supplies π to 40 digits.
    const pi = Decimal.acos(-1);
    const scaled = (m: number) => pi.mul(m).mul(2 ** 14).toDecimalPlaces(0, Decimal.ROUND_HALF_UP).toNumber();
    expect([rad.zTurn, rad.zHalf, rad.zQuarter]).toEqual([scaled(2), scaled(1), scaled(0.5)]);
  });
});
