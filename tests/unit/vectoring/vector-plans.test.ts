import { describe, expect, it } from 'vitest';
import { PlanError } from '../../../shared/numeric/errors';
import { bindVectorPlan, edgePairs, planVectors, vectorPlanInto } from '../../../shared/vectoring/vector-plans';

const pairsOf = ({ xs, ys }: { xs: Int32Array; ys: Int32Array }) => Array.from(xs, (x, k) => `${x},${ys[k]}`);

describe('vectoring plans', () => {
  it('exhaustive: every pair of an 8 + 8-bit core once, x-major; refuses wider inputs with a clear error', () => {
    const all = planVectors({ kind: 'exhaustive' }, { inBits: 8 });
    expect(all.xs.length).toBe(65536);
    expect(new Set(pairsOf(all)).size).toBe(65536);
    expect([all.xs[0], all.ys[0], all.xs[1], all.ys[1], all.xs[65535], all.ys[65535]]).toEqual([-128, -128, -128, -127, 127, 127]);
    expect(() => planVectors({ kind: 'exhaustive' }, { inBits: 9 })).toThrow(PlanError);
    expect(() => planVectors({ kind: 'exhaustive' }, { inBits: 9 })).toThrow(/^kind: exhaustive plans take inputs of at most 8 bits.*use grid or random/);
  });

  it('grid: every pair when the target allows, else a power-of-two stride that keeps the axes and the origin', () => {
    const full = planVectors({ kind: 'grid', target: 300 }, { inBits: 4 });
    expect(full.xs.length).toBe(256);
    expect(new Set(pairsOf(full)).size).toBe(256);
    const wide = planVectors({ kind: 'grid', target: 10000 }, { inBits: 16 });
    // √10000 = 100 codes an axis at most: 65536 / 100 = 655.4, so a stride of 1024 and 64 codes an axis.
    expect(wide.xs.length).toBe(64 * 64);
    const pairs = new Set(pairsOf(wide));
    expect(pairs.size).toBe(4096);
    for (const p of ['0,0', '-32768,-32768', '1024,0', '0,-1024', '31744,31744']) expect(pairs.has(p)).toBe(true);
    expect(planVectors({ kind: 'grid', target: 4096 }, { inBits: 16 }).xs.length).toBe(4096); // an exact fit
    expect(planVectors({ kind: 'grid', target: 1 }, { inBits: 16 }).xs.length).toBe(1);
  });

  it('circle: the requested number of points on the circle, the axes and diagonals exact', () => {
    const c = planVectors({ kind: 'circle', radius: 1000, points: 8 }, { inBits: 12 });
    // cos and sin of k·45°: 707.1 rounds to 707 (√2/2 = 0.70710678, Abramowitz & Stegun chapter 4, closed form).
    expect(Array.from(c.xs)).toEqual([1000, 707, 0, -707, -1000, -707, 0, 707]);
    expect(Array.from(c.ys)).toEqual([0, 707, 1000, 707, 0, -707, -1000, -707]);
    const many = planVectors({ kind: 'circle', radius: 2047, points: 5000 }, { inBits: 12 });
    expect(many.xs.length).toBe(5000);
    for (let k = 0; k < 5000; k++) expect(Math.abs(Math.hypot(many.xs[k], many.ys[k]) - 2047)).toBeLessThanOrEqual(Math.SQRT1_2);
    expect(() => planVectors({ kind: 'circle', radius: 2048, points: 4 }, { inBits: 12 })).toThrow(/^radius: must be at most 2047/);
  });

  it('random: reproducible from the seed, different for another seed, and spread over the whole square', () => {
    const a = planVectors({ kind: 'random', seed: 7, count: 16000 }, { inBits: 16 });
    expect(planVectors({ kind: 'random', seed: 7, count: 16000 }, { inBits: 16 })).toEqual(a);
    expect(planVectors({ kind: 'random', seed: 8, count: 16000 }, { inBits: 16 }).xs).not.toEqual(a.xs);
    // 16 equal cells (4 × 4) of 1000 expected each; Pearson's chi-square with 15 degrees of freedom
    // stays below 37.70 but for p = 0.001 (docs/references.md "Statistics").
    const cells = new Array<number>(16).fill(0);
    for (let k = 0; k < 16000; k++) cells[Math.floor((a.xs[k] + 32768) / 16384) * 4 + Math.floor((a.ys[k] + 32768) / 16384)]++;
    expect(cells.reduce((s, n) => s + (n - 1000) ** 2 / 1000, 0)).toBeLessThan(37.7);
    expect(Math.min(...a.xs)).toBeGreaterThanOrEqual(-32768);
    expect(Math.max(...a.ys)).toBeLessThanOrEqual(32767);
  });

  it('edges: the axes, diagonals, corners, origin and its neighbours, the negative x axis, each once', () => {
    const e = edgePairs({ inBits: 16 });
    const keys = e.map(([x, y]) => `${x},${y}`);
    expect(new Set(keys).size).toBe(keys.length);
    const expected = [
      '0,0', // the zero vector
      '1,0', '0,1', '-1,0', '0,-1', // the smallest magnitudes
      '32767,0', '-32768,0', '0,32767', '0,-32768', // the axes at full scale
      '32767,32767', '-32768,-32768', '32767,-32767', '-32768,32767', '32767,-32768', // diagonals and corners
      '-32768,1', '-32768,-1', '-1,1', '-1,-1', // either side of the negative x axis
      '2,2', '-2,1', '1,-2', // near the origin
    ];
    for (const p of expected) expect(keys).toContain(p);
    const sorted = [...e].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
    expect(e).toEqual(sorted);
    // The tiniest format still gives only codes it holds.
    for (const [x, y] of edgePairs({ inBits: 2 })) for (const v of [x, y]) expect(v >= -2 && v <= 1).toBe(true);
    expect(planVectors({ kind: 'edges' }, { inBits: 16 }).xs.length).toBe(e.length);
  });

  it('list: the given pairs, each checked against the format', () => {
    expect(pairsOf(planVectors({ kind: 'list', points: [[1, 2], [-3, 4]] }, { inBits: 8 }))).toEqual(['1,2', '-3,4']);
    expect(() => planVectors({ kind: 'list', points: [[1, 2], [-3, 400]] }, { inBits: 8 })).toThrow(/^points\.1\.1: y 400/);
    expect(() => planVectors({ kind: 'list', points: [] }, { inBits: 8 })).toThrow(/^points: /);
    expect(() => planVectors({ kind: 'spiral' }, { inBits: 8 })).toThrow(PlanError);
  });

  it('reads long plans in chunks that join up to the whole', () => {
    const plan = { kind: 'random' as const, seed: 3, count: 1000 };
    const whole = planVectors(plan, { inBits: 10 });
    const bound = bindVectorPlan(plan, { inBits: 10 });
    const xs = new Int32Array(300);
    const ys = new Int32Array(300);
    const got: number[] = [];
    for (let start = 0; start < bound.length; start += 300) {
      const n = vectorPlanInto(bound, start, xs, ys);
      for (let k = 0; k < n; k++) got.push(xs[k], ys[k]);
    }
    expect(got).toEqual(Array.from(whole.xs).flatMap((x, k) => [x, whole.ys[k]]));
    expect(() => planVectors({ kind: 'random', seed: 1, count: 2 ** 25 }, { inBits: 10 })).toThrow(/more than 16777216 at once/);
  });
});
