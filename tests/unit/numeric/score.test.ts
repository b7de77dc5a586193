import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { codesPerOctant, createCordicModel, idealOutputCodes, planCodes, ScoreAccumulator, type ModelConfigInput, type ScoreSummary } from '../../../shared/numeric';

const base: ModelConfigInput = { angleBits: 10, outBits: 12, outFrac: 10, iterations: 12 };

/** Codes and the answers a faulty core would give: the model's, with `fault` applied. */
function answers(cfg: ModelConfigInput, codes: ArrayLike<number>, fault: (code: number, r: { cos: number; sin: number }) => { cos: number; sin: number } = (_, r) => r) {
  const m = createCordicModel(cfg);
  const cos: number[] = [];
  const sin: number[] = [];
  for (const c of Array.from(codes)) {
    const r = fault(c, m.evaluate(c));
    cos.push(r.cos);
    sin.push(r.sin);
  }
  return { codes: Array.from(codes), cos, sin };
}

describe('scoring', () => {
  it('finds a core that returns the ideal codes within half an LSB of exact, bias near zero', () => {
    // Rounding once to the output grid errs by at most ½ LSB (common practice, no source).
    const cfg = { ...base, angleFormat: 'turn' as const };
    const codes = planCodes({ kind: 'exhaustive' }, { angleFormat: 'turn', angleBits: 10, angleFrac: 0 });
    const ideal = Array.from(codes, (c) => idealOutputCodes({ angleFormat: 'turn', angleBits: 10, angleFrac: 0, outBits: 12, outFrac: 10 }, c));
    const s = new ScoreAccumulator(cfg).add(codes, ideal.map((r) => r.cos), ideal.map((r) => r.sin)).summary();
    expect(s.overall.maxAbsLsb).toBeLessThanOrEqual(0.5);
    expect(Math.abs(s.overall.meanLsb)).toBeLessThan(0.05);
    // Bennett 1948: a uniform rounding error has RMS Δ/√12 ≈ 0.2887 LSB.
    expect(s.overall.rmsLsb).toBeGreaterThan(0.2887 - 0.03);
    expect(s.overall.rmsLsb).toBeLessThan(0.2887 + 0.03);
    expect(s.overall.rms).toBeCloseTo(s.overall.rmsLsb * 2 ** -10, 15);
  });

  it('counts no mismatches when the core answers as the model does', () => {
    const codes = planCodes({ kind: 'exhaustive' }, { angleFormat: 'turn', angleBits: 10, angleFrac: 0 });
    const a = answers(base, codes);
    const s = new ScoreAccumulator(base).add(a.codes, a.cos, a.sin).summary();
    expect(s.mismatches).toEqual({ count: 0, maxAbsDiffLsb: 0, first: [] });
    expect(s.count).toBe(1024);
  });

  it('sees a +3 LSB offset on cos as bias, mismatches and the worst case where it happened', () => {
    const codes = planCodes({ kind: 'exhaustive' }, { angleFormat: 'turn', angleBits: 10, angleFrac: 0 });
    const good = new ScoreAccumulator(base).add(...tuple(answers(base, codes))).summary();
    const a = answers(base, codes, (c, r) => (c >= 500 && c < 600 ? { cos: r.cos + 3, sin: r.sin } : r));
    const s = new ScoreAccumulator(base, { keepMismatches: 4 }).add(a.codes, a.cos, a.sin).summary();
    expect(s.mismatches.count).toBe(100);
    expect(s.mismatches.maxAbsDiffLsb).toBe(3);
    expect(s.mismatches.first.map((m) => m.code)).toEqual([500, 501, 502, 503]);
    expect(s.cos.meanLsb - good.cos.meanLsb).toBeCloseTo((3 * 100) / 1024, 10);
    expect(s.sin).toEqual(good.sin);
    expect(s.cos.maxAbsCode).toBeGreaterThanOrEqual(500);
    expect(s.cos.maxAbsCode).toBeLessThan(600);
  });

  it('reads a 1% gain error as magnitude error and a one-code rotation as phase error', () => {
    const f = { angleFormat: 'turn' as const, angleBits: 12, angleFrac: 0, outBits: 20, outFrac: 18 };
    const codes = planCodes({ kind: 'exhaustive' }, f);
    const scaled = Array.from(codes, (c) => idealOutputCodes(f, c));
    const gain = new ScoreAccumulator(f).add(codes, scaled.map((r) => Math.round(r.cos * 1.01)), scaled.map((r) => Math.round(r.sin * 1.01))).summary();
    expect(gain.magnitude.mean).toBeCloseTo(0.01, 4);
    const turned = Array.from(codes, (c) => idealOutputCodes(f, (c + 1) % 4096));
    const phase = new ScoreAccumulator(f).add(codes, turned.map((r) => r.cos), turned.map((r) => r.sin)).summary();
    expect(phase.phase.meanRad).toBeCloseTo((2 * Math.PI) / 4096, 6);
    expect(Math.abs(phase.magnitude.mean)).toBeLessThan(1e-5);
  });

  it('measures phase as atan2(sin, cos) − angle wrapped to [−π, π), small or large', () => {
    // The direct definition, computed here without the scorer's small-angle series.
    const f = { angleFormat: 'turn' as const, angleBits: 12, angleFrac: 0, outBits: 16, outFrac: 14 };
    const codes = planCodes({ kind: 'exhaustive' }, f);
    const direct = (cos: number[], sin: number[]) => {
      let sum = 0;
      let sumSq = 0;
      let maxAbs = 0;
      codes.forEach((code, k) => {
        let d = Math.atan2(sin[k], cos[k]) - (2 * Math.PI * code) / 4096;
        d -= 2 * Math.PI * Math.floor((d + Math.PI) / (2 * Math.PI));
        sum += d;
        sumSq += d * d;
        maxAbs = Math.max(maxAbs, Math.abs(d));
      });
      return { meanRad: sum / codes.length, rmsRad: Math.sqrt(sumSq / codes.length), maxAbsRad: maxAbs };
    };
    const faults: Record<string, (code: number) => { cos: number; sin: number }> = {
      healthy: (c) => createCordicModel(f).evaluate(c),
      'turned by 3 codes': (c) => idealOutputCodes(f, (c + 3) % 4096),
      'sign of sin flipped': (c) => ({ ...idealOutputCodes(f, c), sin: -idealOutputCodes(f, c).sin }),
      'stuck at zero': () => ({ cos: 0, sin: 0 }),
    };
    for (const [name, answer] of Object.entries(faults)) {
      const a = Array.from(codes, answer);
      const cos = a.map((r) => r.cos);
      const sin = a.map((r) => r.sin);
      const got = new ScoreAccumulator(f).add(codes, cos, sin).summary().phase;
      const want = direct(cos, sin);
      // atan2(…) − angle cancels to about 1e−16 rad absolute; the series is more accurate still.
      expect(Math.abs(got.meanRad - want.meanRad), name).toBeLessThan(1e-12);
      expect(Math.abs(got.rmsRad - want.rmsRad), name).toBeLessThan(1e-12);
      expect(Math.abs(got.maxAbsRad - want.maxAbsRad), name).toBeLessThan(1e-12);
    }
  });

  it('reports coverage of all codes and of each octant', () => {
    const f = { angleFormat: 'turn' as const, angleBits: 10, angleFrac: 0 };
    const even = Array.from(planCodes({ kind: 'exhaustive' }, f)).filter((c) => c % 2 === 0 || c < 128);
    const a = answers(base, even);
    const cov = new ScoreAccumulator(base).add(a.codes, a.cos, a.sin).summary().coverage;
    expect(cov.total).toBe(1024);
    expect(cov.distinct).toBe(even.length);
    expect(cov.octants[0].share).toBe(1);
    for (let o = 1; o < 8; o++) expect(cov.octants[o].share).toBe(0.5);
  });

  it('splits a rad format into octants that add up to every code', () => {
    const f = { angleFormat: 'rad' as const, angleBits: 12, angleFrac: 8 };
    const sizes = codesPerOctant(f);
    expect(sizes.reduce((a, b) => a + b, 0)).toBe(4096);
    // Counted again from the intervals [o·π/4, (o+1)·π/4) + 2πm that meet [-8, 8) rad.
    for (let o = 0; o < 8; o++) {
      let want = 0;
      for (let m = -3; m <= 3; m++) {
        const lo = Math.max(-8, (o / 8 + m) * 2 * Math.PI);
        const hi = Math.min(8, ((o + 1) / 8 + m) * 2 * Math.PI);
        if (hi > lo) want += Math.ceil(hi * 256) - Math.ceil(lo * 256);
      }
      expect(Math.abs(sizes[o] - want)).toBeLessThanOrEqual(1);
    }
  });

  it('keeps every error it sees in the histogram or its over and under counts', () => {
    const codes = planCodes({ kind: 'random', seed: 3, count: 2000 }, { angleFormat: 'turn', angleBits: 10, angleFrac: 0 });
    const a = answers(base, codes, (c, r) => (c % 7 === 0 ? { cos: r.cos + 20, sin: r.sin - 20 } : r));
    const h = new ScoreAccumulator(base, { histogram: { limitLsb: 4, binsPerLsb: 2 } }).add(a.codes, a.cos, a.sin).summary().histogram;
    const inside = h.cos.reduce((x, y) => x + y, 0) + h.sin.reduce((x, y) => x + y, 0);
    expect(inside + h.below + h.above).toBe(4000);
    const faulted = a.codes.filter((c) => c % 7 === 0).length;
    expect(faulted).toBeGreaterThan(0);
    expect(h.above).toBeGreaterThanOrEqual(faulted);
    expect(h.below).toBeGreaterThanOrEqual(faulted);
    expect(h.edgesLsb[0]).toBe(-4);
    expect(h.edgesLsb).toHaveLength(16);
  });

  it('gives the same statistics merged from pieces in any order as from the whole', () => {
    const codes = planCodes({ kind: 'random', seed: 11, count: 600 }, { angleFormat: 'turn', angleBits: 10, angleFrac: 0 });
    const a = answers(base, codes, (c, r) => (c % 13 === 0 ? { cos: r.cos - 2, sin: r.sin + 1 } : r));
    const whole = new ScoreAccumulator(base, { keepMismatches: 5 }).add(a.codes, a.cos, a.sin).summary();
    fc.assert(
      fc.property(fc.uniqueArray(fc.integer({ min: 1, max: 599 }), { maxLength: 12 }), fc.integer(), (cuts, shuffleSeed) => {
        const edges = [0, ...cuts.sort((x, y) => x - y), 600];
        const pieces = edges.slice(0, -1).map((from, i) => {
          const to = edges[i + 1];
          return new ScoreAccumulator(base, { keepMismatches: 5 }).add(a.codes.slice(from, to), a.cos.slice(from, to), a.sin.slice(from, to), from);
        });
        // Merge in a shuffled order.
        const order = pieces.map((p, i) => ({ p, key: Math.sin(i * 12.9898 + shuffleSeed) })).sort((x, y) => x.key - y.key);
        const merged = order.slice(1).reduce((acc, { p }) => acc.merge(p), order[0].p).summary();
        expectSameSummary(merged, whole);
      }),
      { numRuns: 60 },
    );
  });

  it('scores the same to the last bit in RESULTS-sized frames, in random pieces or in one batch', () => {
    // Short batches are gathered before scoring; every sum must still run in answer order.
    const cfg: ModelConfigInput = { angleBits: 14, outBits: 14, outFrac: 12, iterations: 13 };
    const codes = planCodes({ kind: 'exhaustive' }, { angleFormat: 'turn', angleBits: 14, angleFrac: 0 });
    const a = answers(cfg, codes, (c, r) => (c % 7 === 0 ? { cos: r.cos + 1, sin: r.sin } : c % 1000 === 5 ? { cos: 0, sin: 0 } : r));
    const opts = { profileBins: 64, envelopeBins: 100 };
    const whole = new ScoreAccumulator(cfg, opts).add(a.codes, a.cos, a.sin);
    const framed = new ScoreAccumulator(cfg, opts);
    for (let at = 0; at < codes.length; at += 62) framed.add(a.codes.slice(at, at + 62), a.cos.slice(at, at + 62), a.sin.slice(at, at + 62), at);
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 1, max: 3000 }), { minLength: 1, maxLength: 40 }), (sizes) => {
        const pieces = new ScoreAccumulator(cfg, opts);
        let at = 0;
        for (let i = 0; at < codes.length; i++) {
          const n = sizes[i % sizes.length];
          pieces.add(a.codes.slice(at, at + n), a.cos.slice(at, at + n), a.sin.slice(at, at + n), at);
          // Reading the statistics midway must not change what comes after.
          if (i % 5 === 4) pieces.summary();
          at += n;
        }
        expect(pieces.summary()).toEqual(whole.summary());
        expect(pieces.profile()).toEqual(whole.profile());
        expect(pieces.envelope()).toEqual(whole.envelope());
      }),
      { numRuns: 15 },
    );
    expect(framed.summary()).toEqual(whole.summary());
    expect(framed.envelope()).toEqual(whole.envelope());
    expect(whole.summary().mismatches.count).toBe(a.codes.filter((c) => c % 7 === 0 || c % 1000 === 5).length);
  });

  it('refuses a batch with a bad value whole, naming the value, and keeps what it had', () => {
    const a = answers(base, [1, 2, 3, 4]);
    const acc = new ScoreAccumulator(base).add(a.codes.slice(0, 2), a.cos.slice(0, 2), a.sin.slice(0, 2));
    const before = acc.summary();
    expect(() => acc.add([3, 4, 1024], [a.cos[2], a.cos[3], 0], [a.sin[2], a.sin[3], 0])).toThrow(/^codes\[2\]: angle code 1024 is not an integer 0\.\.1023/);
    expect(() => acc.add([3, 4], [a.cos[2], 2048], [a.sin[2], 0])).toThrow(/output code 2048/);
    expect(() => acc.add([3, 4.5], [0, 0], [0, 0])).toThrow(/codes\[1\]: angle code 4\.5/);
    expect(acc.summary()).toEqual(before);
    acc.add(a.codes.slice(2), a.cos.slice(2), a.sin.slice(2));
    expect(acc.summary()).toEqual(new ScoreAccumulator(base).add(a.codes, a.cos, a.sin).summary());
  });

  it('refuses answers the output format cannot hold and batches of unequal length', () => {
    const acc = new ScoreAccumulator(base);
    expect(() => acc.add([1], [4096], [0])).toThrow(/output code 4096/);
    expect(() => acc.add([1, 2], [0], [0])).toThrow(/differ in length/);
    expect(() => acc.merge(new ScoreAccumulator({ ...base, iterations: 11 }))).toThrow(/different model configurations/);
  });
});

function tuple(a: { codes: number[]; cos: number[]; sin: number[] }): [number[], number[], number[]] {
  return [a.codes, a.cos, a.sin];
}

/** Exact equality for counts, extremes, histogram, mismatches and coverage; sums to rounding. */
function expectSameSummary(got: ScoreSummary, want: ScoreSummary) {
  for (const ch of ['cos', 'sin', 'overall'] as const) {
    expect(got[ch].count).toBe(want[ch].count);
    expect(got[ch].maxAbsLsb).toBe(want[ch].maxAbsLsb);
    expect(got[ch].maxAbsCode).toBe(want[ch].maxAbsCode);
    expect(got[ch].meanLsb).toBeCloseTo(want[ch].meanLsb, 10);
    expect(got[ch].rmsLsb).toBeCloseTo(want[ch].rmsLsb, 10);
  }
  expect(got.magnitude.maxAbs).toBe(want.magnitude.maxAbs);
  expect(got.phase.maxAbsRad).toBe(want.phase.maxAbsRad);
  expect(got.phase.rmsRad).toBeCloseTo(want.phase.rmsRad, 12);
  expect(got.histogram).toEqual(want.histogram);
  expect(got.mismatches).toEqual(want.mismatches);
  expect(got.coverage).toEqual(want.coverage);
}
