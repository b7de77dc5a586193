import { describe, expect, it } from 'vitest';
import { fromStoredRun, restoredProgress, StoredRunError, toStoredRun, UNSAVED_RUN_VERSION, type RunRecord } from '../../../src/features/bench/live/unsaved-run';
import { parseModelConfig, planCodes, type Plan } from '../../../shared/numeric';
import { SoakAccumulator } from '../../../shared/soak';

function record(plan: Plan = { kind: 'tone', cycles: 3, samples: 16 }): RunRecord {
  const config = parseModelConfig({});
  const codes = planCodes(plan, config);
  const n = codes.length;
  return {
    codes,
    cos: Int32Array.from({ length: n }, (_, i) => i * 10),
    sin: Int32Array.from({ length: n }, (_, i) => -i),
    answered: Uint8Array.from({ length: n }, (_, i) => (i === 5 ? 0 : 1)),
    plan,
    config,
    startedAt: new Date('2026-03-01T10:00:00Z'),
    endedAt: new Date('2026-03-01T10:00:02Z'),
    transportLabel: 'Simulated board ws://127.0.0.1:5175/',
    baud: 3_000_000,
    info: null,
    archive: Uint8Array.of(0x41, 0x42, 0x52, 0x43),
    outcome: { status: 'complete', elapsedMs: 2000, missing: 1 },
    figures: null,
    soak: null,
  };
}

describe('an unsaved run kept in the browser', () => {
  it('comes back as the same record after a structured clone (what IndexedDB stores)', () => {
    const r = record();
    const stored = structuredClone(toStoredRun(r, 1_770_000_000_000));
    expect(stored.version).toBe(UNSAVED_RUN_VERSION);
    expect('codes' in stored).toBe(false); // made again from the plan
    const back = fromStoredRun(stored);
    expect(back.codes).toEqual(r.codes);
    expect(back.cos).toEqual(r.cos);
    expect(back.sin).toEqual(r.sin);
    expect(back.answered).toEqual(r.answered);
    expect(back.plan).toEqual(r.plan);
    expect(back.config).toEqual(r.config);
    expect(back.startedAt.toISOString()).toBe('2026-03-01T10:00:00.000Z');
    expect(back.endedAt?.toISOString()).toBe('2026-03-01T10:00:02.000Z');
    expect(back.archive).toEqual(r.archive);
    expect(back.outcome).toEqual(r.outcome);
    expect(back.transportLabel).toBe(r.transportLabel);
  });

  it('keeps a soak’s books beside its last pass, and refuses books that no longer read', () => {
    const r = record();
    // Two passes of the 16 codes; code index 2 answered differently the second time.
    const acc = new SoakAccumulator(r.codes);
    const pass = (cos: Int32Array, atMs: number) => acc.addPass({ codes: r.codes, cos, sin: r.sin, answered: r.answered, mismatches: 0, maxAbsErrorLsb: 0, checkFailures: 0, retries: 0, atMs, elapsedMs: 100 });
    pass(r.cos, 0);
    pass(r.cos.map((c, i) => (i === 2 ? c + 1 : c)), 100);
    const soak = acc.record({ kind: 'passes', passes: 2 });
    const back = fromStoredRun(structuredClone(toStoredRun({ ...r, soak }, 0)));
    expect(back.soak).toEqual(soak);
    expect(back.soak?.unstable.codes.map((u) => [u.index, u.answers.length])).toEqual([[2, 2]]);
    // Stored before soaks were kept: no books, still a run.
    const { soak: _none, ...older } = toStoredRun(r, 0);
    expect(fromStoredRun(older).soak).toBeNull();
    expect(() => fromStoredRun({ ...toStoredRun(r, 0), soak: { ...soak, timeline: 'lost' } })).toThrow(/soak books no longer read/);
  });

  it('is refused, with the reason, when it was stored by another version', () => {
    const stored = { ...toStoredRun(record(), 0), version: 99 };
    expect(() => fromStoredRun(stored)).toThrow(StoredRunError);
    expect(() => fromStoredRun(stored)).toThrow(/another version/);
    expect(() => fromStoredRun(undefined)).toThrow(/nothing stored/);
  });

  it('is refused when its arrays do not match its plan', () => {
    const stored = toStoredRun(record(), 0);
    expect(() => fromStoredRun({ ...stored, cos: stored.cos.subarray(0, 8) })).toThrow(/8 entries for a plan of 16/);
    expect(() => fromStoredRun({ ...stored, answered: Array.from(stored.answered) })).toThrow(/typed arrays/);
    expect(() => fromStoredRun({ ...stored, plan: { kind: 'tone', cycles: 4, samples: 16 } })).toThrow(/plan or core profile no longer reads: .*coprime/);
  });
});

describe('where a restored run ended', () => {
  it('counts answered and missing results against the plan, with the run’s time and rate', () => {
    const r = { ...record(), figures: { resultsPerS: 2048 } as RunRecord['figures'] };
    expect(restoredProgress(r)).toEqual({ done: 16, answered: 15, missing: 1, total: 16, ratePerS: 2048, etaS: null, elapsedMs: 2000, paused: false });
  });
});
