import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { packSamples } from '../../cli/run-server';
import { AuditEntry, BenchSession, Board, Build, Core } from '../../server/db/models';
import { modelConfigSchema } from '../../server/schemas/core';
import { createCordicModel } from '../../shared/numeric/cordic-model';
import { ScoreAccumulator } from '../../shared/numeric/score';
import { testApp, type Agent, type TestApp } from '../support/test-app';

// Sessions are scored on the server from the packed samples. The expected figures come from the
// shared ScoreAccumulator run here over the same codes; the samples are packed with the runner's
// own packSamples so the upload format is the one the runner sends.
const config = modelConfigSchema.parse({});

/** Every 16th code of the 16-bit circle, answered as the reference model does, `faults` aside. */
function run(faults: Array<[index: number, cosDelta: number]> = []) {
  const n = 4096;
  const codes = new Int32Array(n).map((_, i) => i * 16);
  const cos = new Int32Array(n);
  const sin = new Int32Array(n);
  createCordicModel(config).evaluateInto(codes, cos, sin);
  for (const [i, d] of faults) cos[i] += d;
  return { codes, cos, sin, packed: packSamples(codes, cos, sin, new Uint8Array(n).fill(1)) };
}

const expectedStats = (r: ReturnType<typeof run>) => JSON.parse(JSON.stringify(new ScoreAccumulator(config).add(r.codes, r.cos, r.sin).summary())) as unknown;

let t: TestApp;
let engineer: Agent;
let reviewer: Agent;
let core: Core;
let other: Core;
let build: Build;
let board: Board;

const sessionJson = (over: Record<string, unknown> = {}) =>
  JSON.stringify({
    coreId: core.id,
    buildId: build.id,
    boardId: board.id,
    startedAt: '2026-03-01T09:00:00.000Z',
    endedAt: '2026-03-01T09:01:00.000Z',
    plan: { kind: 'sweep', first: 0, count: 4096, step: 16 },
    transport: { kind: 'serial', device: '/dev/ttyUSB0', baud: 3_000_000 },
    deviceInfo: { id: 'bench-a' },
    link: { checkFailures: 0 },
    // What the runner claims; the server must not believe it.
    stats: { overall: { maxAbsLsb: 0 } },
    passed: true,
    ...over,
  });

const upload = (agent: Agent, samples: Uint8Array, over: Record<string, unknown> = {}, archive?: Uint8Array) => {
  const req = agent.post('/api/sessions').field('session', sessionJson(over)).attach('samples', Buffer.from(samples), 'samples.bin');
  return archive ? req.attach('archive', Buffer.from(archive), 'capture.abrc') : req;
};

beforeAll(async () => {
  t = await testApp({ uploadLimitBytes: 256 * 1024 });
  // Limits: 4 LSB of error is what the default model meets over every code (see the seeded
  // reference core); no answer may differ from the model.
  const limits = { maxAbsErrorLsb: 4, maxModelMismatches: 0, minSfdrDb: 80 };
  core = await Core.create({ name: 'Sessions core', slug: 'sessions-core', linkProfile: {}, modelConfig: config, limits, baselineSessionId: null });
  other = await Core.create({ name: 'Other core', slug: 'other-core', linkProfile: {}, modelConfig: config, limits, baselineSessionId: null });
  build = await Build.create({ coreId: core.id, label: 'b7', sourceRevision: 'f00d', toolVersion: 't', clockMHz: 100, createdById: t.users.engineer.id });
  board = await Board.create({ name: 'Rig 3', serial: 'R-3', fpgaPart: 'p', adapter: 'usb-uart', location: 'bay 2' });
  engineer = await t.signInAs('engineer');
  reviewer = await t.signInAs('reviewer');
});
afterAll(() => t.close());

describe('POST /api/sessions', () => {
  it('scores an engineer’s upload on the server with the shared accumulator and answers 201', async () => {
    const r = run();
    const res = await upload(engineer, r.packed, {}, new Uint8Array([1, 2, 3])).expect(201);
    expect(res.body.stats).toEqual(expectedStats(r));
    expect(res.body.passed).toBe(true);
    expect(res.body.regression).toBe(false);
    expect(res.body.verdict.maxModelMismatches).toEqual({ limit: 0, measured: 0, pass: true });
    // SFDR is not measured on the server: reported, neither passing nor failing.
    expect(res.body.verdict.minSfdrDb).toEqual({ limit: 80, measured: null, pass: null });
    const row = await BenchSession.findByPk(res.body.id);
    expect(row?.sampleCount).toBe(4096);
    expect(row?.operatorId).toBe(t.users.engineer.id);
    expect(await AuditEntry.count({ where: { entity: 'session', entityId: res.body.id } })).toBe(1);

    const samples = await reviewer.get(`/api/sessions/${res.body.id}/samples`).buffer(true).expect(200);
    expect(Buffer.compare(samples.body as Buffer, Buffer.from(r.packed))).toBe(0);
    const archive = await reviewer.get(`/api/sessions/${res.body.id}/archive`).buffer(true).expect(200);
    expect([...(archive.body as Buffer)]).toEqual([1, 2, 3]);
    const detail = await reviewer.get(`/api/sessions/${res.body.id}`).expect(200);
    expect(detail.body.session.samples).toBeUndefined();
    expect(detail.body.session.archive).toBeUndefined();
  });

  it('finds the core by slug and fails a session whose answers differ from the model', async () => {
    const r = run([[10, 40]]);
    const res = await upload(engineer, r.packed, { coreId: undefined, coreSlug: 'sessions-core' }).expect(201);
    expect(res.body.stats).toEqual(expectedStats(r));
    expect(res.body.passed).toBe(false);
    expect(res.body.verdict.maxModelMismatches).toMatchObject({ measured: 1, pass: false });
  });

  it('refuses a reviewer with 403', async () => {
    await upload(reviewer, run().packed).expect(403);
  });

  it('refuses truncated samples, bad JSON and unknown fields with 400 and stores nothing', async () => {
    const before = await BenchSession.count();
    const truncated = await upload(engineer, run().packed.slice(0, 4096 * 12 - 5)).expect(400);
    expect(truncated.body.error.message).toMatch(/^samples:/);
    await engineer.post('/api/sessions').field('session', '{"coreId":').attach('samples', Buffer.alloc(12), 'samples.bin').expect(400);
    const unknown = await upload(engineer, run().packed, { colour: 'red' }).expect(400);
    expect(unknown.body.error.message).toMatch(/^session/);
    // An angle code outside the 16-bit circle.
    const bad = run();
    bad.codes[0] = 70_000;
    await upload(engineer, packSamples(bad.codes, bad.cos, bad.sin, new Uint8Array(4096).fill(1))).expect(400);
    expect(await BenchSession.count()).toBe(before);
  });

  it('refuses samples over the upload limit with 413', async () => {
    const before = await BenchSession.count();
    await upload(engineer, new Uint8Array(300 * 1024)).expect(413);
    expect(await BenchSession.count()).toBe(before);
  });

  it('flags a regression when the core’s baseline passed a limit this session fails', async () => {
    const base = await upload(engineer, run().packed, { coreId: other.id, buildId: null }).expect(201);
    await other.update({ baselineSessionId: base.body.id });
    const same = await upload(engineer, run().packed, { coreId: other.id, buildId: null }).expect(201);
    expect(same.body.regression).toBe(false);
    const worse = await upload(engineer, run([[3, 40]]).packed, { coreId: other.id, buildId: null }).expect(201);
    expect(worse.body).toMatchObject({ passed: false, regression: true });
  });
});

describe('GET /api/sessions', () => {
  // Five sessions of their own, on a day no other test uses, so the counts hold in any order:
  // two on listCore (one failing), three on listOther (a passing baseline, a pass, a regression).
  const DAY = { from: '2031-05-01T00:00:00Z', to: '2031-05-01T23:59:59Z' };
  const onDay = (query = '') => `/api/sessions?from=${DAY.from}&to=${DAY.to}${query ? `&${query}` : ''}`;
  let listCore: Core;
  let listOther: Core;
  let listBuild: Build;
  let withoutArchive: number;
  beforeAll(async () => {
    const limits = { maxAbsErrorLsb: 4, maxModelMismatches: 0 };
    listCore = await Core.create({ name: 'List core', slug: 'list-core', linkProfile: {}, modelConfig: config, limits, baselineSessionId: null });
    listOther = await Core.create({ name: 'List other', slug: 'list-other', linkProfile: {}, modelConfig: config, limits, baselineSessionId: null });
    listBuild = await Build.create({ coreId: listCore.id, label: 'l1', sourceRevision: 'beef', toolVersion: 't', clockMHz: 100, createdById: t.users.engineer.id });
    const at = (minute: number) => ({ startedAt: `2031-05-01T09:0${minute}:00.000Z`, endedAt: `2031-05-01T09:0${minute}:30.000Z` });
    withoutArchive = (await upload(engineer, run().packed, { coreId: listCore.id, buildId: listBuild.id, ...at(0) }).expect(201)).body.id;
    await upload(engineer, run([[10, 40]]).packed, { coreId: listCore.id, buildId: listBuild.id, ...at(1) }).expect(201);
    const base = await upload(engineer, run().packed, { coreId: listOther.id, buildId: null, ...at(2) }).expect(201);
    await listOther.update({ baselineSessionId: base.body.id });
    await upload(engineer, run().packed, { coreId: listOther.id, buildId: null, ...at(3) }).expect(201);
    await upload(engineer, run([[3, 40]]).packed, { coreId: listOther.id, buildId: null, ...at(4) }).expect(201);
  });

  it('filters by core, passed and regression and pages the result without BLOBs', async () => {
    const all = await reviewer.get(onDay()).expect(200);
    expect(all.body).toMatchObject({ total: 5, page: 1, pageSize: 25 });
    expect(all.body.items[0].samples).toBeUndefined();
    const ofOther = await reviewer.get(onDay(`coreId=${listOther.id}`)).expect(200);
    expect(ofOther.body.total).toBe(3);
    const failed = await reviewer.get(onDay('passed=false')).expect(200);
    expect(failed.body.total).toBe(2);
    const regressions = await reviewer.get(onDay('regression=true')).expect(200);
    expect(regressions.body.total).toBe(1);
    const byBuild = await reviewer.get(onDay(`buildId=${listBuild.id}&boardId=${board.id}&operatorId=${t.users.engineer.id}`)).expect(200);
    expect(byBuild.body.total).toBe(2);

    const page1 = await reviewer.get(onDay('sort=id&pageSize=2&page=1')).expect(200);
    const page3 = await reviewer.get(onDay('sort=id&pageSize=2&page=3')).expect(200);
    expect(page1.body.items.map((s: { id: number }) => s.id)).toEqual([all.body.items[4].id, all.body.items[3].id]);
    expect(page3.body.items).toHaveLength(1);
    expect(page3.body.total).toBe(5);
  });

  it('filters by start date', async () => {
    const none = await reviewer.get('/api/sessions?from=2031-05-02T00:00:00Z&to=2031-05-31T00:00:00Z').expect(200);
    expect(none.body.total).toBe(0);
    const some = await reviewer.get(onDay()).expect(200);
    expect(some.body.total).toBe(5);
    const firstTwo = await reviewer.get(`/api/sessions?from=${DAY.from}&to=2031-05-01T09:01:00Z`).expect(200);
    expect(firstTwo.body.total).toBe(2);
  });

  it('refuses a page size over 100 and unknown filters with 400', async () => {
    await reviewer.get('/api/sessions?pageSize=101').expect(400);
    await reviewer.get('/api/sessions?colour=red').expect(400);
  });

  it('answers 404 for an unknown session and for a session without an archive', async () => {
    await reviewer.get('/api/sessions/999999').expect(404);
    await reviewer.get(`/api/sessions/${withoutArchive}`).expect(200);
    await reviewer.get(`/api/sessions/${withoutArchive}/archive`).expect(404);
  });
});

describe('the runner’s upload', () => {
  it('is accepted as the runner sends it, its build and board labels looked up by name', async () => {
    const r = run();
    const res = await upload(engineer, r.packed, {
      coreSlug: 'sessions-core',
      buildId: undefined,
      boardId: undefined,
      build: 'b7',
      board: 'Rig 3',
      verdict: { passed: true, checks: [] },
      sampleCount: 4096,
      transport: { kind: 'websocket', device: 'ws://localhost:8765', baud: 3_000_000, crc: null },
    }).expect(201);
    const row = await BenchSession.findByPk(res.body.id);
    expect(row).toMatchObject({ buildId: build.id, boardId: board.id, sampleCount: 4096 });
  });
});
