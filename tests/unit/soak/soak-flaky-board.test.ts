// Soaks against the simulated board in this process: the unstable codes the books list must be
// exactly the ones the board itself says it got wrong, and nothing else may pass for unstable.
import { describe, expect, it } from 'vitest';
import { LinkEngine, type RunResult } from '../../../shared/link-engine/link-engine';
import { confirmOffModel } from '../../../shared/link-engine/confirm-off-model';
import { createCordicModel, ScoreAccumulator } from '../../../shared/numeric';
import { runSoak, type UnstableCode } from '../../../shared/soak';
import { parseCoreFault } from '../../../mock-device/faulty-core';
import { parseFlakyFault, type CoreFlip } from '../../../mock-device/flaky-core';
import { parseLineFaults } from '../../../mock-device/line-faults';
import type { BoardSettings } from '../../../mock-device/board-session';
import { inProcessBoard, realEngineClock } from '../../support/in-process-board';

const PASSES = 20;
const REQUEST = { kind: 'sweep', start: 0, step: 16, count: 4096 } as const;

function score(result: RunResult) {
  const acc = new ScoreAccumulator({});
  const idx: number[] = [];
  for (let i = 0; i < result.codes.length; i++) if (result.answered[i]) idx.push(i);
  acc.add(idx.map((i) => result.codes[i]), idx.map((i) => result.cos[i]), idx.map((i) => result.sin[i]));
  const s = acc.summary();
  return { mismatches: s.mismatches.count, maxAbsErrorLsb: s.count > 0 ? s.overall.maxAbsLsb : null };
}

/** A soak of PASSES passes; `flips[p]` holds what the board flipped during pass p (1-based). */
async function soak(overrides: Partial<BoardSettings>) {
  const flips: CoreFlip[][] = [[]];
  const board = inProcessBoard({ baud: 12_000_000, ...overrides, onCoreFlip: (f) => flips[flips.length - 1].push(f) });
  const engine = new LinkEngine({ link: board.link, clock: realEngineClock, baud: 12_000_000 });
  await engine.hello();
  const mismatchesPerPass: number[] = [];
  const out = await runSoak({
    engine,
    request: REQUEST,
    spec: { kind: 'passes', passes: PASSES },
    clock: realEngineClock,
    score,
    handlers: { confirm: confirmOffModel({}) },
    onPassStart: (pass) => (flips[pass] = []),
    onPass: (point) => mismatchesPerPass.push(point.mismatches),
  });
  await board.link.close();
  expect(out.status).toBe('complete');
  return { acc: out.acc, flips, mismatchesPerPass, board };
}

describe('a soak of 20 passes of 4,096 codes', { timeout: 30_000 }, () => {
  it('on a seeded flaky board lists exactly the codes the board flipped, with every answer it gave', async () => {
    const { acc, flips } = await soak({ flaky: parseFlakyFault('flaky:0.002'), seed: 7 });
    const model = createCordicModel({});
    // The board's own record, pass by pass: each flipped code's answer in every pass.
    const byCode = new Map<number, Array<{ cos: number; sin: number }>>();
    for (let p = 1; p <= PASSES; p++) {
      for (const f of flips[p]) {
        const list = byCode.get(f.code) ?? Array.from({ length: PASSES }, () => model.evaluate(f.code));
        // The board's healthy answer is the model's: a flip is the only difference.
        expect(f.healthy).toEqual(model.evaluate(f.code));
        list[p - 1] = f.answer;
        byCode.set(f.code, list);
      }
    }
    expect(byCode.size).toBeGreaterThan(50);
    const expected: Array<Omit<UnstableCode, 'index'>> = [];
    for (const [code, answers] of [...byCode.entries()].sort((a, b) => a[0] - b[0])) {
      const distinct: Array<{ cos: number; sin: number; count: number }> = [];
      for (const a of answers) {
        const d = distinct.find((x) => x.cos === a.cos && x.sin === a.sin);
        if (d) d.count++;
        else distinct.push({ ...a, count: 1 });
      }
      const firstPass = answers.findIndex((a) => a.cos !== answers[0].cos || a.sin !== answers[0].sin) + 1;
      expected.push({ code, firstPass, answers: distinct, otherAnswers: 0 });
    }
    // Every flipped code differs between passes (none was flipped the same way in all 20).
    expect(expected.every((e) => e.answers.length >= 2)).toBe(true);
    expect(acc.unstableCount).toBe(byCode.size);
    expect(acc.unstableCodes().map(({ index: _i, ...u }) => u)).toEqual(expected);
    expect(acc.summary()).toMatchObject({ passes: PASSES, linkErrors: 0, checkFailures: 0, answered: PASSES * 4096 });
  });

  it('on a healthy board over a damaged line finds no unstable code and counts the damage as link errors', async () => {
    const { acc, flips } = await soak({ lineFaults: parseLineFaults('ber=2e-5,seed=11') });
    expect(flips.flat()).toEqual([]);
    expect(acc.unstableCount).toBe(0);
    const s = acc.summary();
    expect(s.checkFailures).toBeGreaterThan(0);
    expect(s.linkErrors).toBe(s.checkFailures + s.missing);
    expect(s.retries).toBeGreaterThan(0);
    expect(s.mismatches).toBe(0);
    expect(acc.timeline().reduce((n, p) => n + p.checkFailures, 0)).toBe(s.checkFailures);
  });

  it('on a deterministic defect finds no unstable code and the same mismatches every pass', async () => {
    const { acc, mismatchesPerPass } = await soak({ coreFault: parseCoreFault('sign:5') });
    expect(acc.unstableCount).toBe(0);
    expect(mismatchesPerPass).toHaveLength(PASSES);
    expect(mismatchesPerPass[0]).toBeGreaterThan(3000);
    expect(new Set(mismatchesPerPass)).toEqual(new Set([mismatchesPerPass[0]]));
    expect(acc.summary().passesWithMismatches).toBe(PASSES);
  });
});

describe('the flaky core', () => {
  it('stays healthy until its onset and flips high bits more often than low ones', async () => {
    const { createFlakyCore } = await import('../../../mock-device/flaky-core');
    const { createSimCore } = await import('../../../mock-device/faulty-core');
    let now = 0;
    const seen: CoreFlip[] = [];
    const sim = createSimCore({});
    const { outBits } = sim.config;
    const core = createFlakyCore(sim, parseFlakyFault('flaky:0.5@2'), { seed: 3, now: () => now, onFlip: (f) => seen.push(f) });
    for (let c = 0; c < 1000; c++) core.evaluate(c);
    expect(seen).toEqual([]);
    now = 2000;
    for (let c = 0; c < 20_000; c++) core.evaluate(c & 0xffff);
    expect(seen.length).toBeGreaterThan(9000);
    const low = seen.filter((f) => f.bit < outBits / 2).length;
    const high = seen.filter((f) => f.bit >= outBits / 2).length;
    expect(high).toBeGreaterThan(3 * low);
    for (const f of seen.slice(0, 200)) {
      const [a, h] = f.channel === 'cos' ? [f.answer.cos, f.healthy.cos] : [f.answer.sin, f.healthy.sin];
      // Exactly one bit differs, in the outBits-wide two's complement of the output.
      expect(((a ^ h) & (2 ** outBits - 1)) >>> 0).toBe(2 ** f.bit);
      expect(f.bit).toBeLessThan(outBits);
    }
  });

  it('refuses malformed fault texts clearly', () => {
    expect(() => parseFlakyFault('flaky:')).toThrow(/flaky:RATE or flaky:RATE@SECONDS/);
    expect(() => parseFlakyFault('flaky:2')).toThrow(/above 0 and at most 1/);
    expect(() => parseFlakyFault('flaky:0')).toThrow(/above 0 and at most 1/);
    expect(() => parseFlakyFault('flaky:0.1@x')).toThrow(/flaky:RATE or flaky:RATE@SECONDS/);
    expect(parseFlakyFault('flaky:1e-3@30')).toEqual({ kind: 'flaky', rate: 0.001, onsetS: 30 });
  });
});
