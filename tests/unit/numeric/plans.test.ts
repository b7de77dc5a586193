import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Decimal from 'decimal.js';
import { bindPlan, planCodes, planCodesInto, PlanError, type AngleFormat } from '../../../shared/numeric';

const turn16: AngleFormat = { angleFormat: 'turn', angleBits: 16, angleFrac: 0 };
const rad16: AngleFormat = { angleFormat: 'rad', angleBits: 16, angleFrac: 12 };

describe('plans', () => {
  it('ask one angle, or a list in its own order', () => {
    expect(Array.from(planCodes({ kind: 'one', code: 0x2000 }, turn16))).toEqual([0x2000]);
    expect(Array.from(planCodes({ kind: 'list', codes: [5, -3, 0] }, rad16))).toEqual([5, -3, 0]);
  });

  it('sweep by wrapping binary angles and saturating radians, as the bench link does', () => {
    // docs/protocol.md "Host → board": SWEEP codes start + i·step, wrapped (turn) or saturated (rad).
    expect(Array.from(planCodes({ kind: 'sweep', start: 65534, step: 1, count: 4 }, turn16))).toEqual([65534, 65535, 0, 1]);
    expect(Array.from(planCodes({ kind: 'sweep', start: 2, step: -3, count: 3 }, turn16))).toEqual([2, 65535, 65532]);
    expect(Array.from(planCodes({ kind: 'sweep', start: 32760, step: 5, count: 3 }, rad16))).toEqual([32760, 32765, 32767]);
  });

  it('sweep 32-bit binary angles exactly where i·step passes 2^53', () => {
    // BigInt as the exact reference for the modular product.
    const f: AngleFormat = { angleFormat: 'turn', angleBits: 32, angleFrac: 0 };
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2 ** 32 - 1 }), fc.integer({ min: -(2 ** 31), max: 2 ** 31 - 1 }), fc.integer({ min: 0, max: 2 ** 32 - 1 }), (start, step, i) => {
        const bound = bindPlan({ kind: 'sweep', start, step, count: 2 ** 32 }, f);
        const m = 1n << 32n;
        const want = Number((((BigInt(start) + BigInt(i) * BigInt(step)) % m) + m) % m);
        expect(bound.codeAt(i)).toBe(want);
      }),
    );
  });

  it('go through every code once, in order, when exhaustive', () => {
    const codes = planCodes({ kind: 'exhaustive' }, { angleFormat: 'rad', angleBits: 10, angleFrac: 7 });
    expect(codes.length).toBe(1024);
    expect(codes[0]).toBe(-512);
    expect(codes.every((c, i) => c === -512 + i)).toBe(true);
  });

  it('hand long plans out in chunks instead of one array', () => {
    const bound = bindPlan({ kind: 'exhaustive' }, { angleFormat: 'turn', angleBits: 32, angleFrac: 0 });
    expect(bound.length).toBe(2 ** 32);
    expect(() => planCodes({ kind: 'exhaustive' }, { angleFormat: 'turn', angleBits: 32, angleFrac: 0 })).toThrow(PlanError);
    const chunk = new Float64Array(4);
    expect(planCodesInto(bound, 2 ** 32 - 2, chunk)).toBe(2);
    expect(Array.from(chunk.subarray(0, 2))).toEqual([2 ** 32 - 2, 2 ** 32 - 1]);
  });

  it('draw the same random codes from the same seed, other codes from another seed', () => {
    const a = planCodes({ kind: 'random', seed: 42, count: 1000 }, turn16);
    const b = planCodes({ kind: 'random', seed: 42, count: 1000 }, turn16);
    const c = planCodes({ kind: 'random', seed: 43, count: 1000 }, turn16);
    expect(Array.from(a)).toEqual(Array.from(b));
    expect(a.filter((v, i) => v === c[i]).length).toBeLessThan(10);
    // Pinned: a saved session keeps only { seed, count }, so these codes must never change between
    // versions (recorded from this implementation when the plan format was fixed).
    expect(Array.from(a.subarray(0, 8))).toEqual([5927, 41183, 53601, 31597, 25512, 63643, 50252, 21492]);
    expect(Array.from(a.subarray(998))).toEqual([15170, 5853]);
    expect(Array.from(planCodes({ kind: 'random', seed: 42, count: 4 }, rad16))).toEqual([-26841, 8415, 20833, -1171]);
  });

  it('spread random codes evenly over the format, 32-bit included', () => {
    // Pearson's chi-square test, 15 degrees of freedom: 37.70 at p = 0.001 (standard statistical tables; common practice).
    for (const f of [turn16, rad16, { angleFormat: 'turn' as const, angleBits: 32, angleFrac: 0 }]) {
      const n = 65536;
      const codes = planCodes({ kind: 'random', seed: 7, count: n }, f);
      const min = f.angleFormat === 'turn' ? 0 : -(2 ** (f.angleBits - 1));
      const bins = new Array<number>(16).fill(0);
      for (const c of codes) bins[Math.floor(((c - min) * 16) / 2 ** f.angleBits)]++;
      const chi2 = bins.reduce((s, o) => s + (o - n / 16) ** 2 / (n / 16), 0);
      expect(chi2).toBeLessThan(37.7);
    }
  });

  it('collect the edges of a binary angle: 0, quarters, half turn, their neighbours, octant boundaries, ends', () => {
    const edges = new Set(planCodes({ kind: 'edges' }, turn16));
    for (const c of [0, 1, 65535, 0x4000 - 1, 0x4000, 0x4000 + 1, 0x8000 - 1, 0x8000, 0x8000 + 1, 0xc000 - 1, 0xc000, 0xc000 + 1]) expect(edges.has(c)).toBe(true);
    for (let k = 0; k < 8; k++) expect(edges.has(k * 0x2000)).toBe(true);
    // Eight boundaries with two neighbours each; of the ends and their inner neighbours only 65534 is new.
    expect(edges.has(65534)).toBe(true);
    expect(edges.size).toBe(8 * 3 + 1);
  });

  it('collect the edges of a rad format at the codes nearest ±π/2 and ±π and at the format ends', () => {
    // decimal.js supplies π to 40 digits.
    const pi = Decimal.acos(-1);
    const near = (m: number) => pi.mul(m).mul(4096).toDecimalPlaces(0, Decimal.ROUND_HALF_UP).toNumber();
    const edges = new Set(planCodes({ kind: 'edges' }, rad16));
    for (const m of [-1, -0.5, 0, 0.5, 1, 0.25, -0.75, 2]) for (const d of [-1, 0, 1]) expect(edges.has(near(m) + d)).toBe(true);
    for (const c of [-32768, -32767, 32766, 32767]) expect(edges.has(c)).toBe(true);
  });

  it('visit as many distinct phases as samples in a coherent tone', () => {
    // Blair, "Selecting test frequencies for sinewave tests of ADCs", IMTC 2002: M cycles in N samples, gcd 1.
    const codes = planCodes({ kind: 'tone', cycles: 1021, samples: 4096 }, turn16);
    expect(new Set(codes).size).toBe(4096);
    expect(codes[1]).toBe(1021 * 16);
    expect(() => planCodes({ kind: 'tone', cycles: 6, samples: 4096 }, turn16)).toThrow(/coprime/);
    expect(() => planCodes({ kind: 'tone', cycles: 7, samples: 1000 }, turn16)).toThrow(/^samples: /);
  });

  it('are plain data: a plan saved as JSON and read back gives the same codes', () => {
    for (const plan of [{ kind: 'random', seed: 9, count: 50 }, { kind: 'tone', cycles: 3, samples: 64 }, { kind: 'sweep', start: 0, step: 7, count: 20 }]) {
      expect(Array.from(planCodes(JSON.parse(JSON.stringify(plan)), rad16))).toEqual(Array.from(planCodes(plan, rad16)));
    }
  });

  it('name the field at fault', () => {
    expect(() => planCodes({ kind: 'one', code: 70000 }, turn16)).toThrow(/^code: angle code 70000/);
    expect(() => planCodes({ kind: 'list', codes: [1, 2.5] }, turn16)).toThrow(/^codes\.1: /);
    expect(() => planCodes({ kind: 'sweep', start: 0, step: 1, count: 0 }, turn16)).toThrow(/^count: /);
    expect(() => planCodes({ kind: 'spiral' }, turn16)).toThrow(/^kind: /);
  });
});
