import { describe, expect, it } from 'vitest';
import { parseSoakRecord, SoakAccumulator, type SoakPassInput } from '../../../shared/soak';

const CODES = [10, 20, 30, 40];

function pass(cos: number[], sin: number[], extra: Partial<SoakPassInput> = {}): SoakPassInput {
  return { codes: CODES, cos, sin, answered: [1, 1, 1, 1], mismatches: 0, maxAbsErrorLsb: 1, checkFailures: 0, retries: 0, atMs: 0, elapsedMs: 10, ...extra };
}

describe('the soak accumulator', () => {
  it('lists a code as unstable with every distinct answer and its count', () => {
    const acc = new SoakAccumulator(CODES);
    acc.addPass(pass([1, 2, 3, 4], [5, 6, 7, 8]));
    acc.addPass(pass([1, 2, 3 ^ 64, 4], [5, 6, 7, 8], { atMs: 10 }));
    acc.addPass(pass([1, 2, 3, 4], [5, 6, 7, 8], { atMs: 20 }));
    const last = acc.addPass(pass([1, 2, 3, 4], [5, 6, 7 ^ 1024, 8], { atMs: 30 }));
    expect(acc.unstableCount).toBe(1);
    expect(last.unstableCodes).toBe(1);
    expect(last.newUnstable).toBe(0);
    expect(acc.unstableCodes()).toEqual([
      {
        code: 30,
        index: 2,
        firstPass: 2,
        answers: [
          { cos: 3, sin: 7, count: 2 },
          { cos: 3 ^ 64, sin: 7, count: 1 },
          { cos: 3, sin: 7 ^ 1024, count: 1 },
        ],
        otherAnswers: 0,
      },
    ]);
  });

  it('does not call a wrong answer that repeats every pass unstable', () => {
    const acc = new SoakAccumulator(CODES);
    for (let i = 0; i < 5; i++) acc.addPass(pass([1, 99, 3, 4], [5, 6, 7, 8], { mismatches: 1 }));
    expect(acc.unstableCount).toBe(0);
    expect(acc.summary()).toMatchObject({ passes: 5, mismatches: 5, passesWithMismatches: 5, unstableCodes: 0, answered: 20 });
  });

  it('skips unanswered codes and counts them as link errors, apart from bad CHECKs', () => {
    const acc = new SoakAccumulator(CODES);
    acc.addPass(pass([1, 2, 3, 4], [5, 6, 7, 8]));
    const p = acc.addPass(pass([0, 0, 0, 0], [0, 0, 0, 0], { answered: [1, 0, 0, 1], cos: [1, 0, 0, 4], sin: [5, 0, 0, 8], checkFailures: 3, retries: 9 }));
    expect(p).toMatchObject({ answered: 2, missing: 2, checkFailures: 3, retries: 9, linkErrors: 5, unstableCodes: 0 });
    expect(acc.unstableCount).toBe(0);
  });

  it('refuses a pass of another plan', () => {
    const acc = new SoakAccumulator(CODES);
    expect(() => acc.addPass({ ...pass([1, 2, 3], [1, 2, 3]), codes: [10, 20, 30] })).toThrow(/3 codes, the plan 4/);
    expect(() => acc.addPass({ ...pass([1, 2, 3, 4], [1, 2, 3, 4]), codes: [10, 20, 31, 40] })).toThrow(/code 31 at position 2/);
  });

  it('keeps the timeline bounded by merging neighbouring passes, totals intact', () => {
    const acc = new SoakAccumulator(CODES, { maxTimelinePoints: 8 });
    for (let i = 0; i < 100; i++) acc.addPass(pass([1, 2, 3, 4], [5, 6, 7, 8], { atMs: i * 10, mismatches: i % 3 === 0 ? 1 : 0, checkFailures: 1 }));
    const t = acc.timeline();
    expect(t.length).toBeLessThanOrEqual(8);
    expect(t.reduce((s, p) => s + p.passes, 0)).toBe(100);
    expect(t.reduce((s, p) => s + p.mismatches, 0)).toBe(34);
    expect(t.reduce((s, p) => s + p.checkFailures, 0)).toBe(100);
    expect(t[0].pass).toBe(1);
    for (let i = 1; i < t.length; i++) expect(t[i].pass).toBe(t[i - 1].pass + t[i - 1].passes);
    expect(acc.summary()).toMatchObject({ passes: 100, elapsedMs: 1000, mismatches: 34, checkFailures: 100 });
  });

  it('caps the listed codes and the answers per code but counts every unstable code', () => {
    const codes = Array.from({ length: 10 }, (_, i) => i);
    const acc = new SoakAccumulator(codes, { maxListedUnstable: 3, maxAnswersPerCode: 2 });
    const ones = new Array(10).fill(1);
    for (let p = 0; p < 4; p++) acc.addPass({ codes, cos: codes.map(() => p), sin: codes.map(() => 0), answered: ones, mismatches: 0, maxAbsErrorLsb: 0, checkFailures: 0, retries: 0, atMs: p, elapsedMs: 1 });
    expect(acc.unstableCount).toBe(10);
    const listed = acc.unstableCodes();
    expect(listed.map((u) => u.code)).toEqual([0, 1, 2]);
    expect(listed[0].answers).toHaveLength(2);
    expect(listed[0].otherAnswers).toBe(2);
    // What a session keeps passes the upload's own validation.
    const rec = acc.record({ kind: 'passes', passes: 4 });
    expect(parseSoakRecord(JSON.parse(JSON.stringify(rec)))).toEqual(rec);
  });
});
