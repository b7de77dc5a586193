import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { packSamples } from '../../cli/run-server';
import { Core } from '../../server/db/models';
import { modelConfigSchema } from '../../server/schemas/core';
import { diffSessions } from '../../server/services/session-diff';
import { createCordicModel } from '../../shared/numeric';
import { testApp, type Agent, type TestApp } from '../support/test-app';

// Sessions side by side: summaries, and the first session's answers against each other's, bit
// for bit, on the codes both covered.
const config = modelConfigSchema.parse({});
const model = createCordicModel(config);

/** The model's answers for `codes`, with `faults` added to cos (by index) and sin. */
function answers(codes: ArrayLike<number>, faults: Array<[index: number, cosDelta: number, sinDelta: number]> = []) {
  const n = codes.length;
  const c = Int32Array.from(codes);
  const cos = new Int32Array(n);
  const sin = new Int32Array(n);
  model.evaluateInto(c, cos, sin);
  for (const [i, dc, ds] of faults) {
    cos[i] += dc;
    sin[i] += ds;
  }
  return { codes: c, cos, sin, packed: packSamples(c, cos, sin, new Uint8Array(n).fill(1)) };
}
const range = (n: number, f: (i: number) => number) => Array.from({ length: n }, (_, i) => f(i));

let t: TestApp;
let reviewer: Agent;
let engineer: Agent;
let core: Core;
const ids: Record<'base' | 'faulty' | 'disjoint' | 'half' | 'partial', number> = { base: 0, faulty: 0, disjoint: 0, half: 0, partial: 0 };
let base: ReturnType<typeof answers>;

const upload = async (samples: Uint8Array): Promise<number> => {
  const session = { coreId: core.id, startedAt: '2026-03-01T09:00:00.000Z', plan: { kind: 'sweep' }, transport: { kind: 'serial' }, link: { checkFailures: 0 } };
  const res = await engineer.post('/api/sessions').field('session', JSON.stringify(session)).attach('samples', Buffer.from(samples), 'samples.bin').expect(201);
  return res.body.id as number;
};

beforeAll(async () => {
  t = await testApp();
  core = await Core.create({ name: 'Compare core', slug: 'compare-core', linkProfile: {}, modelConfig: config, limits: { maxAbsErrorLsb: 4, maxModelMismatches: 0 }, baselineSessionId: null });
  engineer = await t.signInAs('engineer');
  reviewer = await t.signInAs('reviewer');
  // Every 16th code; the same with three wrong answers; the odd codes only; every 8th code of
  // the first half of the circle, in reverse order.
  base = answers(range(4096, (i) => i * 16));
  ids.base = await upload(base.packed);
  ids.faulty = await upload(answers(range(4096, (i) => i * 16), [[7, 2, 0], [100, 0, -5], [4000, 1, 1]]).packed);
  ids.disjoint = await upload(answers(range(4096, (i) => i * 16 + 1)).packed);
  ids.half = await upload(answers(range(4096, (i) => (4095 - i) * 8)).packed);
  // Upper half of the base codes (with two wrong answers) plus as many codes the base never asked.
  partialCodes = [...range(2048, (i) => (2048 + i) * 16), ...range(2048, (i) => i * 16 + 8)];
  ids.partial = await upload(answers(partialCodes, [[10, 0, 3], [2000, -1, 0]]).packed);
});
let partialCodes: number[] = [];
afterAll(() => t.close());

describe('GET /api/compare', () => {
  it('summarises each session and diffs the first against the others on their common codes', async () => {
    const res = await reviewer.get(`/api/compare?ids=${ids.base},${ids.faulty},${ids.disjoint},${ids.half}`).expect(200);
    expect(res.body.sessions.map((s: { id: number }) => s.id)).toEqual([ids.base, ids.faulty, ids.disjoint, ids.half]);
    expect(res.body.sessions[0]).toMatchObject({ id: ids.base, core: { id: core.id, slug: 'compare-core' }, build: null, passed: true, sampleCount: 4096 });
    expect(res.body.sessions[0].stats).toMatchObject({ count: 4096, modelMismatches: 0 });
    expect(res.body.sessions[1]).toMatchObject({ passed: false, stats: { modelMismatches: 3 } });
    expect(res.body.sessions[0].verdict.maxModelMismatches).toMatchObject({ pass: true });

    const [faulty, disjoint, half] = res.body.pairs;
    expect(faulty).toMatchObject({ a: ids.base, b: ids.faulty, common: 4096, differing: 3, maxAbsDiffLsb: 5 });
    expect(faulty.firstDiffering).toMatchObject([
      { code: 7 * 16, a: { cos: base.cos[7], sin: base.sin[7] }, b: { cos: base.cos[7] + 2, sin: base.sin[7] } },
      { code: 100 * 16, a: { cos: base.cos[100], sin: base.sin[100] }, b: { cos: base.cos[100], sin: base.sin[100] - 5 } },
      { code: 4000 * 16, a: { cos: base.cos[4000], sin: base.sin[4000] }, b: { cos: base.cos[4000] + 1, sin: base.sin[4000] + 1 } },
    ]);
    expect(disjoint).toMatchObject({ a: ids.base, b: ids.disjoint, common: 0, differing: 0, maxAbsDiffLsb: 0, firstDiffering: [] });
    // Multiples of 16 below 32,768: half of the base session's codes, all answered alike.
    expect(half).toMatchObject({ a: ids.base, b: ids.half, common: 2048, differing: 0, maxAbsDiffLsb: 0, firstDiffering: [] });
  });

  it('refuses fewer than 2, more than 6, repeated or malformed ids with 400', async () => {
    for (const q of ['', '?ids=', `?ids=${ids.base}`, '?ids=1,2,3,4,5,6,7', `?ids=${ids.base},${ids.base}`, '?ids=a,b', '?ids=1,,2', '?ids=0,1', `?ids=${ids.base},${ids.faulty}&colour=red`]) {
      await reviewer.get(`/api/compare${q}`).expect(400);
    }
  });

  it('answers 404 for an unknown id and 401 to a signed-out caller', async () => {
    const res = await reviewer.get(`/api/compare?ids=${ids.base},999999`).expect(404);
    expect(res.body.error.message).toMatch(/999999/);
    await (await t.visitor()).get(`/api/compare?ids=${ids.base},${ids.faulty}`).expect(401);
  });
});

describe('GET /api/compare, what the compare page draws', () => {
  it('diffs sessions whose codes overlap in part: only common codes count, each placed in its bin', async () => {
    const res = await reviewer.get(`/api/compare?ids=${ids.base},${ids.partial}`).expect(200);
    const [pair] = res.body.pairs;
    const wrong = [partialCodes[10], partialCodes[2000]];
    expect(pair).toMatchObject({ common: 2048, differing: 2, maxAbsDiffLsb: 3 });
    expect(pair.firstDiffering.map((d: { code: number; degrees: number }) => [d.code, d.degrees])).toEqual(wrong.map((c) => [c, (c / 65536) * 360]));
    // 720 bins over 65,536 codes: the two wrong answers land in bins 720·code/65536.
    const bins = pair.byBin.differing as number[];
    expect(bins).toHaveLength(720);
    expect(bins.reduce((x, y) => x + y, 0)).toBe(2);
    for (const c of wrong) expect(bins[Math.floor((c / 65536) * 720)]).toBe(1);
    expect(pair.byBin.maxAbsDiffLsb[Math.floor((wrong[0] / 65536) * 720)]).toBe(3);
    expect(pair.byBin.maxAbsDiffLsb[Math.floor((wrong[1] / 65536) * 720)]).toBe(1);
  });

  it('reports disjoint sessions as nothing in common: empty bins, no differing codes', async () => {
    const res = await reviewer.get(`/api/compare?ids=${ids.base},${ids.disjoint}`).expect(200);
    const [pair] = res.body.pairs;
    expect(pair).toMatchObject({ common: 0, differing: 0, maxAbsDiffLsb: 0, firstDiffering: [] });
    expect(pair.byBin.differing.every((n: number) => n === 0)).toBe(true);
    expect(res.body.sessions[1].stats.count).toBe(4096);
  });

  it('does not diff a session of another core: its codes stand for other angles', async () => {
    const other = await Core.create({ name: 'Other core', slug: 'other-core', linkProfile: {}, modelConfig: config, limits: {}, baselineSessionId: null });
    const session = { coreId: other.id, startedAt: '2026-03-01T09:00:00.000Z', plan: { kind: 'sweep' }, transport: { kind: 'serial' } };
    const posted = await engineer.post('/api/sessions').field('session', JSON.stringify(session)).attach('samples', Buffer.from(base.packed), 's.bin').expect(201);
    const res = await reviewer.get(`/api/compare?ids=${ids.base},${posted.body.id},${ids.faulty}`).expect(200);
    expect(res.body.pairs[0]).toMatchObject({ b: posted.body.id, sameCore: false, common: 0, differing: 0, firstDiffering: [] });
    expect(res.body.pairs[1]).toMatchObject({ b: ids.faulty, sameCore: true, common: 4096, differing: 3 });
    expect(res.body.sessions[1].core).toMatchObject({ slug: 'other-core' });
  });

  it('gives each session an error envelope that matches errors computed here with Math.cos and Math.sin', async () => {
    const res = await reviewer.get(`/api/compare?ids=${ids.faulty},${ids.half}`).expect(200);
    const [faulty, half] = res.body.sessions;
    const env = faulty.errorEnvelope as { degrees: number[]; lo: (number | null)[]; hi: (number | null)[] };
    expect(env.degrees).toHaveLength(720);
    expect(env.degrees[0]).toBeCloseTo(0.25, 2);
    // The outside check: the platform's Math.cos/Math.sin (double precision) at 2π·code/65536,
    // scaled by 2^outFrac; the model's output rounding keeps every error well under 0.5 LSB apart.
    const f = answers(range(4096, (i) => i * 16), [[7, 2, 0], [100, 0, -5], [4000, 1, 1]]);
    const lo = new Array<number>(720).fill(Infinity);
    const hi = new Array<number>(720).fill(-Infinity);
    for (let i = 0; i < f.codes.length; i++) {
      const a = (2 * Math.PI * f.codes[i]) / 65536;
      const errs = [f.cos[i] - Math.cos(a) * 2 ** config.outFrac, f.sin[i] - Math.sin(a) * 2 ** config.outFrac];
      const b = Math.floor((f.codes[i] / 65536) * 720);
      lo[b] = Math.min(lo[b], ...errs);
      hi[b] = Math.max(hi[b], ...errs);
    }
    for (let b = 0; b < 720; b++) {
      expect(env.lo[b]).toBeCloseTo(lo[b], 2);
      expect(env.hi[b]).toBeCloseTo(hi[b], 2);
    }
    // The sin answer made 5 LSB low shows as the lowest point of the whole envelope.
    expect(Math.min(...(env.lo as number[]))).toBe(env.lo[Math.floor(((100 * 16) / 65536) * 720)]);
    // Codes below 32,768 only: the upper half of the circle has no answers, so no envelope.
    expect(half.errorEnvelope.hi.slice(0, 360).every((v: number | null) => v !== null)).toBe(true);
    expect(half.errorEnvelope.hi.slice(360).every((v: number | null) => v === null)).toBe(true);
  });

  it('gives each session its error histogram, cos and sin together, every answer counted once per channel', async () => {
    const res = await reviewer.get(`/api/compare?ids=${ids.base},${ids.faulty}`).expect(200);
    for (const s of res.body.sessions) {
      const h = s.histogram as { counts: number[]; edgesLsb: number[]; below: number; above: number };
      expect(h.counts).toHaveLength(h.edgesLsb.length);
      expect(h.counts.reduce((x, y) => x + y, 0) + h.below + h.above).toBe(2 * 4096);
    }
  });

  // Its time is the `compare` figure of `npm run bench -- list-compare`.
  it('compares two 1,048,576-sample sessions through the API', async () => {
    const wide = modelConfigSchema.parse({ angleBits: 20 });
    const wideModel = createCordicModel(wide);
    const wideCore = await Core.create({ name: 'Wide core', slug: 'wide-core', linkProfile: {}, modelConfig: wide, limits: { maxModelMismatches: 0 }, baselineSessionId: null });
    const n = 1 << 20;
    const codes = Int32Array.from({ length: n }, (_, i) => i);
    const cos = new Int32Array(n);
    const sin = new Int32Array(n);
    wideModel.evaluateInto(codes, cos, sin);
    const post = async () => {
      const session = { coreId: wideCore.id, startedAt: '2026-03-02T09:00:00.000Z', plan: { kind: 'exhaustive' }, transport: { kind: 'serial' } };
      const r = await engineer.post('/api/sessions').field('session', JSON.stringify(session)).attach('samples', Buffer.from(packSamples(codes, cos, sin, new Uint8Array(n).fill(1))), 's.bin').expect(201);
      return r.body.id as number;
    };
    const first = await post();
    cos[123_456] += 4;
    const second = await post();
    const res = await reviewer.get(`/api/compare?ids=${first},${second}`).expect(200);
    expect(res.body.pairs[0]).toMatchObject({ common: n, differing: 1, maxAbsDiffLsb: 4 });
    expect(res.body.pairs[0].firstDiffering[0].code).toBe(123_456);
    // The reply stays small: envelopes, not samples.
    expect(JSON.stringify(res.body).length).toBeLessThan(200_000);
  }, 60_000);
});

describe('diffSessions', () => {
  it('compares two 1,048,576-sample sessions, each code once by its first answer', () => {
    const n = 1 << 20;
    const mk = (step: number, offset: number) => {
      const codes = new Float64Array(n);
      const cos = new Int32Array(n);
      const sin = new Int32Array(n);
      for (let i = 0; i < n; i++) {
        codes[i] = (i * step + offset) % 2 ** 32;
        cos[i] = codes[i] % 1000;
        sin[i] = -cos[i];
      }
      return { codes, cos, sin };
    };
    // a: 0, 4096, 8192, … in a scrambled order; b: every 2048th code, so half of b is common.
    const a = mk(4096 * 40_503, 0);
    const b = mk(2048, 0);
    b.cos[2] += 9; // code 4096
    // Its time is the `diff-scrambled` figure of `npm run bench -- hot-paths`.
    const d = diffSessions(a, b);
    expect(d).toMatchObject({ common: n / 2, differing: 1, maxAbsDiffLsb: 9 });
    expect(d.firstDiffering).toEqual([{ code: 4096, a: { cos: 96, sin: -96 }, b: { cos: 105, sin: -96 } }]);
  });

  it('counts a repeated code once and keeps at most 50 differing codes', () => {
    const a = { codes: Float64Array.from([5, 5, 1, 2]), cos: Int32Array.from([1, 9, 0, 0]), sin: Int32Array.from([0, 0, 0, 0]) };
    const b = { codes: Float64Array.from([5, 3]), cos: Int32Array.from([1, 0]), sin: Int32Array.from([0, 0]) };
    expect(diffSessions(a, b)).toEqual({ common: 1, differing: 0, maxAbsDiffLsb: 0, firstDiffering: [] });
    const m = 200;
    const x = { codes: Float64Array.from(range(m, (i) => i)), cos: new Int32Array(m), sin: new Int32Array(m) };
    const y = { codes: Float64Array.from(range(m, (i) => m - 1 - i)), cos: new Int32Array(m).fill(1), sin: new Int32Array(m) };
    const d = diffSessions(x, y);
    expect(d).toMatchObject({ common: m, differing: m, maxAbsDiffLsb: 1 });
    expect(d.firstDiffering.map((f) => f.code)).toEqual(range(50, (i) => i));
  });
});
