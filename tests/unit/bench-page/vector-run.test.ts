import { describe, expect, it, vi } from 'vitest';
import { BenchController } from '../../../src/features/bench/live/bench-controller';
import type { UnsavedRunStore } from '../../../src/features/bench/live/unsaved-run-store';
import { fromStoredVectorRun, isStoredVectorRun, type VectorRunRecord } from '../../../src/features/bench/live/vector-run';
import { createVectorModel, parseVectorConfig, planVectors } from '../../../shared/vectoring';
import { inProcessBoard } from '../../support/in-process-board';

// Scoring runs in a Web Worker, which Node lacks; these tests are about the run and its record.
vi.mock('../../../src/features/bench/live/vector-score-client', () => ({
  VectorScoreClient: class {
    queue() {}
    finish() {}
    terminate() {}
  },
}));

const CORE = { inBits: 8, iterations: 8 };

function memoryStore() {
  const puts: Parameters<UnsavedRunStore['put']>[0][] = [];
  const store: UnsavedRunStore = { put: async (r) => void puts.push(r), get: async () => puts.at(-1), clear: async () => undefined };
  return { puts, store };
}

async function connected() {
  const board = inProcessBoard({ baud: 12_000_000, vector: { core: CORE } });
  const { puts, store } = memoryStore();
  const c = new BenchController(store);
  await c.connect(async () => board.link, 'in-process board', 12_000_000);
  return { c, puts, board };
}
const bytesWritten = (board: ReturnType<typeof inProcessBoard>) => board.link.written.reduce((n, b) => n + b.length, 0);

describe('a vectoring run on the Bench controller', () => {
  it('finds the vectoring core in MODE_INFO after HELLO', async () => {
    const { c } = await connected();
    const s = c.getSnapshot();
    expect(s.status).toBe('connected');
    expect(s.modes?.vectoring).toMatchObject({ inBits: 8, iterations: 8 });
    await c.disconnect();
  });

  it('asks a grid as VEC_GRID segments: every pair of the plan answered once, as the model answers it, and put away for a reload', async () => {
    const { c, puts, board } = await connected();
    const config = parseVectorConfig(CORE);
    const plan = { kind: 'grid', target: 1024 } as const;
    const before = bytesWritten(board);
    c.startVectorRun(plan, config);
    await vi.waitFor(() => expect(c.getSnapshot().run?.state).toBe('finished'), { timeout: 15_000, interval: 20 });
    const run = c.getSnapshot().run!;
    expect(run.mode).toBe('vectoring');
    expect(run.result?.status).toBe('complete');
    const r = c.record as VectorRunRecord;
    const planned = planVectors(plan, config);
    // The plan's pairs in the plan's order (VEC_GRID walks y fastest, as the plan does).
    expect(Array.from(r.xs)).toEqual(Array.from(planned.xs));
    expect(Array.from(r.ys)).toEqual(Array.from(planned.ys));
    expect(r.answered.every((a) => a === 1)).toBe(true);
    // One VEC_GRID frame of 20 payload bytes asks for all 1,024 pairs; as listed pairs they would take 2 bytes each at least.
    expect(bytesWritten(board) - before).toBeLessThan(100);
    const angles = new Int32Array(r.xs.length);
    const mags = new Int32Array(r.xs.length);
    createVectorModel(config).answerInto(r.xs, r.ys, angles, mags);
    expect(Array.from(r.angle)).toEqual(Array.from(angles));
    expect(Array.from(r.magnitude)).toEqual(Array.from(mags));

    await vi.waitFor(() => expect(puts).toHaveLength(1));
    expect(isStoredVectorRun(puts[0])).toBe(true);
    const back = fromStoredVectorRun(puts[0]);
    expect(Array.from(back.angle)).toEqual(Array.from(r.angle));
    expect(back.plan).toEqual(plan);
    await c.disconnect();
  });

  it('asks a circle as pairs in the plan’s order', async () => {
    const { c } = await connected();
    const config = parseVectorConfig(CORE);
    const plan = { kind: 'circle', radius: 100, points: 40 } as const;
    c.startVectorRun(plan, config);
    await vi.waitFor(() => expect(c.getSnapshot().run?.state).toBe('finished'), { timeout: 15_000, interval: 20 });
    const r = c.record as VectorRunRecord;
    const planned = planVectors(plan, config);
    expect(Array.from(r.xs)).toEqual(Array.from(planned.xs));
    expect(Array.from(r.ys)).toEqual(Array.from(planned.ys));
    expect(c.getSnapshot().run?.progress).toMatchObject({ answered: 40, total: 40 });
    await c.disconnect();
  });

  it('refuses a vectoring run on a board that only rotates', async () => {
    const board = inProcessBoard({ baud: 12_000_000 });
    const c = new BenchController(memoryStore().store);
    await c.connect(async () => board.link, 'in-process board', 12_000_000);
    expect(c.getSnapshot().modes?.vectoring).toBeNull();
    expect(() => c.startVectorRun({ kind: 'edges' }, parseVectorConfig(CORE))).toThrow(/serves no vectoring core/);
    await c.disconnect();
  });

  it('refuses a stored vectoring run whose columns disagree', () => {
    const good = { version: 1, mode: 'vectoring', plan: { kind: 'edges' }, config: CORE, xs: new Int32Array(2), ys: new Int32Array(2), angle: new Int32Array(2), magnitude: new Int32Array(1), answered: new Uint8Array(2), storedAt: 0, startedAt: new Date(0).toISOString(), endedAt: null };
    expect(() => fromStoredVectorRun(good)).toThrow(/differ in length/);
    expect(() => fromStoredVectorRun({ ...good, plan: { kind: 'spiral' } })).toThrow(/plan no longer reads/);
  });
});
