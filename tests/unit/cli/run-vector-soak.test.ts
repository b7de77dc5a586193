// `run --soak` against a vectoring board (npm run mock's, in this process): the passes booked as a
// rotating soak's, the unstable vectors exactly the ones the flaky board says it flipped.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runRunCommand } from '../../../cli/run';
import { defaultBoardSettings } from '../../../mock-device/board-session';
import { parseFlakyFault } from '../../../mock-device/flaky-core';
import type { VectorCoreFlip } from '../../../mock-device/flaky-vector-core';
import { startMockServer, type MockServer } from '../../../mock-device/ws-server';
import { createVectorModel, parseVectorConfig } from '../../../shared/vectoring';
import { vectorSoakRecordSchema, type VectorSoakRecord } from '../../../shared/soak';
import { captureIo } from './run-support';

const CONFIG = { inBits: 12 };
let flaky: MockServer;
let healthy: MockServer;
const flips: VectorCoreFlip[] = [];

beforeAll(async () => {
  const settings = { ...defaultBoardSettings(), baud: 12_000_000, vector: { core: CONFIG } };
  flaky = await startMockServer({ ...settings, flaky: parseFlakyFault('flaky:0.004'), seed: 5, onVectorFlip: (f) => flips.push(f) }, 0, '127.0.0.1', () => {});
  healthy = await startMockServer(settings, 0, '127.0.0.1', () => {});
});
afterAll(async () => {
  await flaky.close();
  await healthy.close();
});

const run = async (device: string, ...args: string[]) => {
  const io = captureIo();
  const status = await runRunCommand(['--device', device, '--plan', 'grid:1024', '--core', 'vec-12', ...args], io, { stderrIsTty: false });
  return { status, out: io.out, err: io.err };
};

describe('run --soak on a vectoring board', { timeout: 60_000 }, () => {
  it('lists exactly the vectors the flaky board flipped, each with every answer it gave and how often', async () => {
    flips.length = 0;
    const r = await run(flaky.url, '--soak', '6', '--json');
    expect(r.err).not.toMatch(/^error/m);
    const out = JSON.parse(r.out) as { mode: string; soak: VectorSoakRecord };
    expect(out.mode).toBe('vectoring');
    const soak = vectorSoakRecordSchema.parse(out.soak);
    expect(soak.summary).toMatchObject({ passes: 6, codesPerPass: 1024, linkErrors: 0 });
    expect(soak.timeline.map((p) => p.pass)).toEqual([1, 2, 3, 4, 5, 6]);
    // The board's own record of its flips: about 0.4 % of 6,144 answers.
    expect(flips.length).toBeGreaterThan(5);
    const key = (v: { x: number; y: number }) => `${v.x},${v.y}`;
    const flipped = new Map<string, VectorCoreFlip[]>();
    for (const f of flips) flipped.set(key(f), [...(flipped.get(key(f)) ?? []), f]);
    expect(soak.unstable.vectors.map(key).sort()).toEqual([...flipped.keys()].sort());
    expect(soak.unstable.count).toBe(flipped.size);
    const model = createVectorModel(parseVectorConfig(CONFIG));
    for (const u of soak.unstable.vectors) {
      // Every answer the board gave: the model's in the passes it did not flip, and each flip.
      const wrong = flipped.get(key(u))!;
      const expected = new Map<string, number>();
      const healthyAnswer = model.answer(u.x, u.y);
      expected.set(`${healthyAnswer.angle},${healthyAnswer.magnitude}`, 6 - wrong.length);
      for (const f of wrong) expected.set(`${f.answer.angle},${f.answer.magnitude}`, (expected.get(`${f.answer.angle},${f.answer.magnitude}`) ?? 0) + 1);
      for (const [k, n] of expected) if (n === 0) expected.delete(k);
      expect(new Map(u.answers.map((a) => [`${a.angle},${a.magnitude}`, a.count]))).toEqual(expected);
    }
    expect(r.err).toMatch(/^soak pass 6\/6: 1,024 answered, \d+ mismatches, 0 link errors, \d+ unstable vectors so far/m);
  });

  it('finds nothing unstable on a healthy board, and prints the soak in the human report', async () => {
    const r = await run(healthy.url, '--soak', '3');
    expect(r.status).toBe(0);
    expect(r.out).toMatch(/^soak 3 passes: 3 passes of 1,024 vectors/m);
    expect(r.out).toMatch(/^ {2}unstable vectors: 0$/m);
  });
});
