// The Bench page's soak timeline: columns built from the shared books, per pass or against time.
import { describe, expect, it } from 'vitest';
import { SoakAccumulator, type SoakPassInput } from '../../../shared/soak';
import { SoakLive, soakTimelineData, UNSTABLE_ON_PAGE } from '../../../src/features/bench/live/soak-live';

const CODES = Float64Array.from({ length: 40 }, (_, i) => i * 100);
const healthy = Int32Array.from(CODES, (c) => c + 1);

/** One pass: `flip` lists plan positions answered one higher than healthy; `lost` ones unanswered. */
function pass(atMs: number, o: { flip?: number[]; lost?: number[]; mismatches?: number; checkFailures?: number; retries?: number } = {}): SoakPassInput {
  const cos = healthy.slice();
  for (const i of o.flip ?? []) cos[i]++;
  const answered = new Uint8Array(CODES.length).fill(1);
  for (const i of o.lost ?? []) answered[i] = 0;
  return { codes: CODES, cos, sin: healthy, answered, mismatches: o.mismatches ?? 0, maxAbsErrorLsb: 1, checkFailures: o.checkFailures ?? 0, retries: o.retries ?? 0, atMs, elapsedMs: 30_000 };
}

describe('the soak timeline on the Bench page', () => {
  it('draws per pass: mismatches, unstable codes so far, link errors (bad CHECK + never answered) and re-asked', () => {
    const acc = new SoakAccumulator(CODES);
    acc.addPass(pass(0));
    acc.addPass(pass(30_000, { flip: [3, 7], mismatches: 2, checkFailures: 1, retries: 1 }));
    acc.addPass(pass(60_000, { flip: [3, 9], lost: [0], mismatches: 2 }));
    const [x, mismatches, unstable, linkErrors, retries] = soakTimelineData(acc.timeline(), { kind: 'passes', passes: 3 });
    expect(x).toEqual([1, 2, 3]);
    expect(mismatches).toEqual([0, 2, 2]);
    // 3 and 7 differ from pass 1 in pass 2; 9 in pass 3 (3 stays counted once).
    expect(unstable).toEqual([0, 2, 3]);
    expect(linkErrors).toEqual([0, 1, 1]);
    expect(retries).toEqual([0, 1, 0]);
  });

  it('draws a duration soak against minutes from its start to each point’s end', () => {
    const acc = new SoakAccumulator(CODES);
    acc.addPass(pass(0));
    acc.addPass(pass(30_000));
    const [x] = soakTimelineData(acc.timeline(), { kind: 'duration', ms: 120_000 });
    expect(x).toEqual([0.5, 1]);
  });

  it('puts a merged point at its last pass, with its passes summed, as the saved timeline has it', () => {
    const acc = new SoakAccumulator(CODES, { maxTimelinePoints: 2 });
    for (let p = 0; p < 4; p++) acc.addPass(pass(p * 30_000, { mismatches: p + 1 }));
    const [x, mismatches] = soakTimelineData(acc.timeline(), { kind: 'passes', passes: 4 });
    expect(x).toEqual([2, 4]);
    expect(mismatches).toEqual([1 + 2, 3 + 4]);
  });

  it('reads the books only when asked, lists the first unstable codes, and moves its version per booked pass', () => {
    const live = new SoakLive({ kind: 'passes', passes: 3 });
    expect(live.view()).toEqual({ spec: { kind: 'passes', passes: 3 }, pass: 0, summary: null, unstable: { count: 0, first: [] } });
    expect(soakTimelineData([], live.spec)).toEqual([[], [], [], [], []]);
    const acc = new SoakAccumulator(CODES);
    live.passStarted(1);
    acc.addPass(pass(0));
    live.passBooked(acc);
    live.passStarted(2);
    const all = Array.from({ length: 20 }, (_, i) => i);
    acc.addPass(pass(30_000, { flip: all }));
    live.passBooked(acc);
    expect(live.version).toBe(2);
    const v = live.view();
    expect(v.pass).toBe(2);
    expect(v.summary?.passes).toBe(2);
    expect(v.unstable.count).toBe(20);
    expect(v.unstable.first.map((u) => u.index)).toEqual(all.slice(0, UNSTABLE_ON_PAGE));
    expect(v.unstable.first[0].answers).toEqual([{ cos: healthy[0], sin: healthy[0], count: 1 }, { cos: healthy[0] + 1, sin: healthy[0], count: 1 }]);
    expect(live.timelineData()[0]).toEqual([1, 2]);
  });
});
