// Sessions with operating conditions and soak books: stored, shown, filtered by range, judged
// against maxUnstableCodes, and placed on the condition grid.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { packSamples } from '../../cli/run-server';
import { Board, Build, Core, SessionConditions } from '../../server/db/models';
import { modelConfigSchema } from '../../server/schemas/core';
import { createCordicModel } from '../../shared/numeric/cordic-model';
import { SoakAccumulator, type Conditions } from '../../shared/soak';
import { testApp, type Agent, type TestApp } from '../support/test-app';

const config = modelConfigSchema.parse({});
const N = 1024;
const codes = new Int32Array(N).map((_, i) => i * 64);
const cos = new Int32Array(N);
const sin = new Int32Array(N);
createCordicModel(config).evaluateInto(codes, cos, sin);
const packed = packSamples(codes, cos, sin, new Uint8Array(N).fill(1));

/** A 3-pass soak's books in which `unstable` codes answered differently in pass 2. */
function soakRecord(unstable: number) {
  const acc = new SoakAccumulator(codes);
  for (let p = 1; p <= 3; p++) {
    const c = Int32Array.from(cos);
    if (p === 2) for (let i = 0; i < unstable; i++) c[i * 7] ^= 1 << 12;
    acc.addPass({ codes, cos: c, sin, answered: new Uint8Array(N).fill(1), mismatches: p === 2 ? unstable : 0, maxAbsErrorLsb: 1, checkFailures: 0, retries: 0, atMs: p * 100, elapsedMs: 90 });
  }
  return JSON.parse(JSON.stringify(acc.record({ kind: 'passes', passes: 3 })));
}

let t: TestApp;
let engineer: Agent;
let reviewer: Agent;
let core: Core;
let build: Build;
let other: Build;

const upload = (over: Record<string, unknown>) =>
  engineer
    .post('/api/sessions')
    .field('session', JSON.stringify({ coreId: core.id, buildId: build.id, startedAt: '2026-05-01T09:00:00.000Z', plan: { kind: 'sweep', start: 0, step: 64, count: N }, transport: { kind: 'websocket' }, ...over }))
    .attach('samples', Buffer.from(packed), 'samples.bin');

const at = async (conditions: Conditions, unstable: number | null, b = build) => {
  const res = await upload({ buildId: b.id, conditions, ...(unstable !== null ? { soak: soakRecord(unstable) } : {}) }).expect(201);
  return res.body.id as number;
};

beforeAll(async () => {
  t = await testApp();
  core = await Core.create({ name: 'Thermal core', slug: 'thermal-core', linkProfile: {}, modelConfig: config, limits: { maxModelMismatches: 0, maxUnstableCodes: 0 }, baselineSessionId: null });
  build = await Build.create({ coreId: core.id, label: 't1', sourceRevision: 'a', toolVersion: 't', clockMHz: 100, createdById: t.users.engineer.id });
  other = await Build.create({ coreId: core.id, label: 't2', sourceRevision: 'b', toolVersion: 't', clockMHz: 100, createdById: t.users.engineer.id });
  await Board.create({ name: 'Chamber rig', serial: 'C-1', fpgaPart: 'p', adapter: 'usb-uart', location: 'chamber' });
  engineer = await t.signInAs('engineer');
  reviewer = await t.signInAs('reviewer');
});
afterAll(() => t.close());

describe('sessions with conditions and a soak', () => {
  it('stores them, judges maxUnstableCodes, and returns them in the detail', async () => {
    const res = await upload({ conditions: { temperature_c: 85, vccint_v: 0.95, other: { chamber: 'B' } }, soak: soakRecord(4) }).expect(201);
    expect(res.body.passed).toBe(false);
    expect(res.body.verdict.maxUnstableCodes).toEqual({ limit: 0, measured: 4, pass: false });
    const row = await SessionConditions.findOne({ where: { sessionId: res.body.id } });
    expect(row).toMatchObject({ temperatureC: 85, vccintV: 0.95, clockMhz: null, soakPasses: 3, unstableCodes: 4 });
    const detail = (await reviewer.get(`/api/sessions/${res.body.id}`).expect(200)).body.session;
    expect(detail.conditions).toEqual({ temperature_c: 85, vccint_v: 0.95, other: { chamber: 'B' } });
    expect(detail.unstableCodes).toBe(4);
    expect(detail.soak.summary).toMatchObject({ passes: 3, unstableCodes: 4 });
    expect(detail.soak.unstable.codes.map((u: { code: number }) => u.code)).toEqual([0, 7, 14, 21].map((i) => i * 64));
    expect(detail.soak.timeline).toHaveLength(3);
  });

  it('leaves maxUnstableCodes unchecked for a single-pass session and shows no conditions', async () => {
    const res = await upload({}).expect(201);
    expect(res.body.verdict.maxUnstableCodes).toEqual({ limit: 0, measured: null, pass: null });
    expect(res.body.passed).toBe(true);
    const detail = (await reviewer.get(`/api/sessions/${res.body.id}`).expect(200)).body.session;
    expect(detail).toMatchObject({ conditions: {}, soak: null, unstableCodes: null });
  });

  it('refuses out-of-range or malformed conditions and a soak whose books do not add up', async () => {
    const bad = [
      [{ conditions: { temperature_c: 400 } }, /session\.conditions\.temperature_c: temperature_c must be at most 200 °C/],
      [{ conditions: { vccint_v: '0.95' } }, /vccint_v must be a number/],
      [{ conditions: { humidity: 40 } }, /conditions/],
      [{ soak: { ...soakRecord(2), unstable: { count: 1, listed: 2, codes: soakRecord(2).unstable.codes } } }, /session\.soak/],
    ] as const;
    for (const [over, message] of bad) {
      const res = await upload(over).expect(400);
      expect(res.body.error.message).toMatch(message);
    }
  });

  it('filters the list by condition ranges', async () => {
    const hot = await at({ temperature_c: 125, vccint_v: 0.9 }, null, other);
    const cold = await at({ temperature_c: -40, vccint_v: 1.0 }, null, other);
    const ids = async (q: string) => ((await reviewer.get(`/api/sessions?buildId=${other.id}&${q}`).expect(200)).body.items as Array<{ id: number }>).map((s) => s.id).sort();
    expect(await ids('temperatureMin=100')).toEqual([hot]);
    expect(await ids('temperatureMax=0')).toEqual([cold]);
    expect(await ids('vccintMin=0.95&vccintMax=1.05')).toEqual([cold]);
    expect(await ids('temperatureMin=-50&temperatureMax=130')).toEqual([hot, cold].sort());
    expect(await ids('clockMin=1')).toEqual([]);
    const listed = (await reviewer.get(`/api/sessions?buildId=${other.id}&temperatureMin=100`).expect(200)).body.items[0];
    expect(listed.conditions).toEqual({ temperature_c: 125, vccint_v: 0.9 });
    expect(listed.soak).toBeUndefined();
    await reviewer.get('/api/sessions?temperatureMin=900').expect(400);
  });
});

describe('GET /api/condition-grid', () => {
  it('places every session of a build at its pair of conditions with the expected verdicts', async () => {
    const grid = await Build.create({ coreId: core.id, label: 'grid', sourceRevision: 'c', toolVersion: 't', clockMHz: 100, createdById: t.users.engineer.id });
    const s25 = await at({ temperature_c: 25, vccint_v: 0.95 }, 0, grid);
    const s85lo = await at({ temperature_c: 85, vccint_v: 0.9 }, 3, grid);
    const s85hi = await at({ temperature_c: 85, vccint_v: 0.95 }, 0, grid);
    const s85hi2 = await at({ temperature_c: 85, vccint_v: 0.95 }, 0, grid);
    const none = await at({ clock_mhz: 200 }, null, grid);
    const res = await reviewer.get(`/api/condition-grid?buildId=${grid.id}&x=temperature_c&y=vccint_v`).expect(200);
    expect(res.body.xs).toEqual([25, 85]);
    expect(res.body.ys).toEqual([0.9, 0.95]);
    expect(res.body.cells).toEqual([
      { x: 85, y: 0.9, verdict: 'unstable', counts: { pass: 0, fail: 0, unstable: 1 }, sessionIds: [s85lo] },
      { x: 25, y: 0.95, verdict: 'pass', counts: { pass: 1, fail: 0, unstable: 0 }, sessionIds: [s25] },
      { x: 85, y: 0.95, verdict: 'pass', counts: { pass: 2, fail: 0, unstable: 0 }, sessionIds: [s85hi, s85hi2] },
    ]);
    const unplaced = res.body.sessions.find((s: { id: number }) => s.id === none);
    expect(unplaced).toMatchObject({ x: null, y: null, verdict: 'pass', unstableCodes: null });
    expect(res.body.sessions.find((s: { id: number }) => s.id === s85lo)).toMatchObject({ x: 85, y: 0.9, unstableCodes: 3, passed: false, mismatches: 0, maxAbsErrorLsb: expect.any(Number) });
  });

  it('refuses a query without one build or core, or with one condition twice', async () => {
    expect((await reviewer.get('/api/condition-grid?x=temperature_c&y=vccint_v').expect(400)).body.error.message).toMatch(/buildId or coreId/);
    expect((await reviewer.get(`/api/condition-grid?coreId=${core.id}&x=vccint_v&y=vccint_v`).expect(400)).body.error.message).toMatch(/two different/);
    expect((await reviewer.get(`/api/condition-grid?coreId=${core.id}&x=humidity&y=vccint_v`).expect(400)).body.error.message).toMatch(/x/);
    await reviewer.get('/api/condition-grid?buildId=99999&x=temperature_c&y=vccint_v').expect(404);
  });
});
