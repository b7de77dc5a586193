import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BenchSession, Core, SessionEnvelope } from '../../server/db/models';
import { modelConfigSchema } from '../../server/schemas/core';
import { simBoardSettings } from '../../server/sockets/sim-board-settings';
import { packSamples } from '../../shared/link-engine/sample-pack';
import { VECTOR_CSV_HEADER } from '../../shared/link-engine/vector-sample-csv';
import { packVectorSamples } from '../../shared/link-engine/vector-sample-pack';
import { createCordicModel } from '../../shared/numeric';
import { createVectorModel, parseVectorConfig, planVectors, VectorScoreAccumulator } from '../../shared/vectoring';
import { testApp, type Agent, type TestApp } from '../support/test-app';

// A vectoring core end to end: created through the API, a session answered by the shared
// vectoring model with deliberate defects uploaded, scored and judged by the server, exported as
// CSV, imported back, and compared. The expected figures are the shared scorer's over the same
// answers, computed here; the defects are counted from what this test changed.
const CONFIG_INPUT = { inBits: 10, iterations: 12, angleBits: 12, gainCompensation: 'multiply' } as const;
const config = parseVectorConfig(CONFIG_INPUT);
const TURN = 2 ** config.angleBits;
// The model itself reaches 10 LSB of angle close to the origin (at (−16, 0)) and 1.4 LSB of magnitude on this grid.
const LIMITS = { maxAngleErrorLsb: 12, maxAngleRmsLsb: 2, maxMagnitudeErrorLsb: 2, maxMagnitudeErrorPpm: 1e6, maxModelMismatches: 0, maxLinkErrors: 0, minPlaneCoveragePct: 90 };

/** The model's answers to a 64 × 64 grid of the 10-bit plane; `defects` edits some of them. */
function answers(defects = false) {
  const { xs, ys } = planVectors({ kind: 'grid', target: 4096 }, config);
  const angles = new Int32Array(xs.length);
  const magnitudes = new Int32Array(xs.length);
  createVectorModel(config).answerInto(xs, ys, angles, magnitudes);
  const edited: number[] = [];
  if (defects) {
    for (let i = 0; i < xs.length; i++) {
      // A wrong angle on every 97th answer (wrapping round the turn), a wrong magnitude on every 89th.
      if (i % 97 === 5) angles[i] = (angles[i] + 20) % TURN;
      if (i % 89 === 7) magnitudes[i] += 3;
      if (i % 97 === 5 || i % 89 === 7) edited.push(i);
    }
  }
  return { xs, ys, angles, magnitudes, edited };
}
type Answers = ReturnType<typeof answers>;
const expectedStats = (a: Answers) => JSON.parse(JSON.stringify(new VectorScoreAccumulator(config).add(a.xs, a.ys, a.angles, a.magnitudes).summary())) as Record<string, unknown>;

let t: TestApp;
let engineer: Agent;
let reviewer: Agent;
let coreId: number;
const ids = { clean: 0, defective: 0, imported: 0, rotation: 0, rotationCore: 0 };

const upload = (agent: Agent, packed: Uint8Array, session: Record<string, unknown> = {}) =>
  agent
    .post('/api/sessions')
    .field('session', JSON.stringify({ coreId, startedAt: '2026-03-01T10:00:00Z', plan: { kind: 'grid', target: 4096 }, transport: { kind: 'serial' }, link: { checkFailures: 0 }, ...session }))
    .attach('samples', Buffer.from(packed), 'samples.bin');
const importCsv = (agent: Agent, text: string, id = coreId) =>
  agent.post('/api/sessions/import').field('session', JSON.stringify({ coreId: id })).attach('file', Buffer.from(text), 'vectors.csv');

beforeAll(async () => {
  t = await testApp();
  engineer = await t.signInAs('engineer');
  reviewer = await t.signInAs('reviewer');
  const rotation = await Core.create({ name: 'Rotation core', slug: 'rotation-core', linkProfile: {}, modelConfig: modelConfigSchema.parse({}), limits: {}, baselineSessionId: null });
  ids.rotationCore = rotation.id;
});
afterAll(() => t.close());

describe('vectoring cores', () => {
  it('are created with mode "vectoring" and a vectoring configuration, defaults filled, no rotation configuration', async () => {
    const res = await engineer.post('/api/cores').send({ name: 'Phase detector', slug: 'phase-det', mode: 'vectoring', vectorConfig: CONFIG_INPUT, limits: LIMITS }).expect(201);
    coreId = res.body.core.id;
    expect(res.body.core).toMatchObject({ mode: 'vectoring', modelConfig: null, limits: LIMITS });
    // Derived defaults (docs/model.md): inFrac = inBits − 2, magBits = inBits + 2.
    expect(res.body.core.vectorConfig).toEqual(config);
    expect(res.body.core.vectorConfig).toMatchObject({ inFrac: 8, magBits: 12 });
    const detail = await reviewer.get(`/api/cores/${coreId}`).expect(200);
    expect(detail.body.core.mode).toBe('vectoring');
    // A rotation core as before: mode rotation, no vectoring configuration.
    const rotation = await engineer.post('/api/cores').send({ name: 'Plain', slug: 'plain' }).expect(201);
    expect(rotation.body.core).toMatchObject({ mode: 'rotation', vectorConfig: null, modelConfig: modelConfigSchema.parse({}) });
  });

  it.each([
    [{ mode: 'vectoring', modelConfig: {} }, 'body.modelConfig', /a vectoring core has no rotation model configuration/],
    [{ vectorConfig: {} }, 'body.vectorConfig', /a rotation core has no vectoring configuration/],
    [{ mode: 'vectoring', limits: { maxAbsErrorLsb: 3 } }, 'body.limits.maxAbsErrorLsb', /a limit of rotation cores/],
    [{ limits: { maxAngleErrorLsb: 3 } }, 'body.limits.maxAngleErrorLsb', /a limit of vectoring cores/],
    [{ mode: 'vectoring', vectorConfig: { inBits: 8, inFrac: 8 } }, 'body.vectorConfig.inFrac', /must be below inBits/],
    [{ mode: 'vectoring', vectorConfig: { fold: true } }, 'body.vectorConfig', /fold/],
    [{ mode: 'spiral' }, 'body.mode', /rotation|vectoring/],
  ])('refuses %j with a 400 naming %s', async (extra, path, message) => {
    const res = await engineer.post('/api/cores').send({ name: 'Bad', slug: 'bad-core', ...extra }).expect(400);
    expect(res.body.error.message.startsWith(`${path}`)).toBe(true);
    expect(res.body.error.message).toMatch(message);
  });

  it('keep their mode and take only their own configuration and limits in an edit', async () => {
    const edit = (id: number, body: Record<string, unknown>) => engineer.patch(`/api/cores/${id}`).send(body);
    expect((await edit(coreId, { mode: 'rotation' }).expect(400)).body.error.message).toMatch(/^body\.mode: a core's mode is fixed/);
    expect((await edit(coreId, { modelConfig: {} }).expect(400)).body.error.message).toMatch(/^body\.modelConfig: a vectoring core has no rotation/);
    expect((await edit(coreId, { limits: { minSfdrDb: 80 } }).expect(400)).body.error.message).toMatch(/^body\.limits\.minSfdrDb: a limit of rotation cores/);
    expect((await edit(ids.rotationCore, { vectorConfig: {} }).expect(400)).body.error.message).toMatch(/^body\.vectorConfig: a rotation core has no vectoring/);
    const ok = await edit(coreId, { mode: 'vectoring', name: 'Phase detector, 10-bit' }).expect(200);
    expect(ok.body.core).toMatchObject({ name: 'Phase detector, 10-bit', mode: 'vectoring', vectorConfig: config });
  });

  it('get a vectoring hosted simulated board of their own configuration; asking it to rotate is a clear 400', async () => {
    const settings = await simBoardSettings(new URLSearchParams({ core: 'phase-det' }));
    expect(settings.vector?.core).toMatchObject(config);
    await expect(simBoardSettings(new URLSearchParams({ core: 'phase-det', mode: 'rotation' }))).rejects.toMatchObject({ status: 400, message: expect.stringMatching(/mode/) });
  });
});

describe('sessions of a vectoring core', () => {
  it('are uploaded as 16-byte records and scored by the server: statistics, verdict and mismatches of the defective answers', async () => {
    const a = answers(true);
    const res = await upload(engineer, packVectorSamples(a), { stats: { made: 'up' }, passed: true }).expect(201);
    ids.defective = res.body.id;
    expect(res.body.stats).toEqual({ count: a.xs.length, vectoring: expectedStats(a) });
    const v = res.body.stats.vectoring;
    // Every edited answer, and only those, differs from the model; the first is request 5.
    expect(v.mismatches.count).toBe(a.edited.length);
    expect(v.mismatches.first[0]).toMatchObject({ index: 5, x: a.xs[5], y: a.ys[5], angle: a.angles[5] });
    expect(v.mismatches.maxAbsDiffLsb).toBe(20);
    expect(res.body.passed).toBe(false);
    expect(res.body.verdict.maxModelMismatches).toEqual({ limit: 0, measured: a.edited.length, pass: false });
    // 20 LSB wrong angles against a limit of 12; magnitudes 3 LSB off against 2.
    expect(res.body.verdict.maxAngleErrorLsb).toMatchObject({ limit: 12, pass: false });
    expect(res.body.verdict.maxAngleErrorLsb.measured).toBeGreaterThanOrEqual(19);
    expect(res.body.verdict.maxMagnitudeErrorLsb.pass).toBe(false);
    expect(res.body.verdict.minPlaneCoveragePct).toEqual({ limit: 90, measured: 100, pass: true });
    expect(res.body.verdict.maxLinkErrors).toEqual({ limit: 0, measured: 0, pass: true });
    expect(Object.keys(res.body.verdict).sort()).toEqual(Object.keys(LIMITS).sort());
    // The compare view's envelope is kept, as for rotation sessions.
    expect(await SessionEnvelope.findByPk(ids.defective)).not.toBeNull();
  });

  it('pass when every answer is the model’s, and the clean session may become the baseline; the defective one is then a regression', async () => {
    const a = answers();
    const res = await upload(engineer, packVectorSamples(a)).expect(201);
    ids.clean = res.body.id;
    expect(res.body.passed).toBe(true);
    expect(res.body.stats.vectoring.mismatches.count).toBe(0);
    await engineer.patch(`/api/sessions/${ids.clean}`).send({ baseline: true }).expect(200);
    const again = await upload(engineer, packVectorSamples(answers(true))).expect(201);
    expect(again.body.regression).toBe(true);
    await engineer.delete(`/api/sessions/${again.body.id}`).expect(204);
  });

  it('land as the runner would send them: a bearer token, build and board by label, its own score ignored, its link errors judged', async () => {
    const build = await engineer.post('/api/builds').send({ coreId, label: 'pd10-r1', sourceRevision: 'abc', toolVersion: 't', clockMHz: 100 }).expect(201);
    const token = (await engineer.post('/api/tokens').send({ name: 'bench runner' }).expect(201)).body.token as string;
    const runner = (await t.visitor()).set('authorization', `Bearer ${token}`);
    const a = answers();
    const res = await upload(runner, packVectorSamples(a), { coreId: undefined, coreSlug: 'phase-det', build: 'pd10-r1', board: 'no such board', link: { checkFailures: 2, retries: 1 }, verdict: { passed: true }, sampleCount: 1 }).expect(201);
    expect(res.body).toMatchObject({ passed: false, verdict: { maxLinkErrors: { limit: 0, measured: 2, pass: false }, maxModelMismatches: { measured: 0, pass: true } } });
    const stored = await BenchSession.findByPk(res.body.id);
    expect(stored).toMatchObject({ buildId: build.body.build.id, boardId: null, sampleCount: 4096, transport: { kind: 'serial', linkFigures: { checkFailures: 2, retries: 1 } } });
    await engineer.delete(`/api/sessions/${res.body.id}`).expect(204);
  });

  it('refuse samples that are not whole 16-byte records, or answers the formats cannot hold, storing nothing', async () => {
    const before = await BenchSession.count();
    const a = answers();
    const rotationShaped = packSamples([1, 2, 3, 4], [0, 0, 0, 0], [0, 0, 0, 0], [1, 1, 1, 1]);
    expect((await upload(engineer, rotationShaped.subarray(0, 40)).expect(400)).body.error).toMatchObject({ code: 'bad_samples', message: expect.stringMatching(/^samples: 40 bytes is not a whole number of 16-byte/) });
    a.angles[3] = TURN; // one past the 12-bit angle range
    expect((await upload(engineer, packVectorSamples(a)).expect(400)).body.error.message).toMatch(/^samples: .*angle 4096 is not an integer 0\.\.4095/);
    const b = answers();
    b.xs[0] = 512; // one past the 10-bit input range
    expect((await upload(engineer, packVectorSamples(b)).expect(400)).body.error.message).toMatch(/^samples: inputs\[0\]: input x 512 is not an integer -512\.\.511/);
    expect((await upload(engineer, packVectorSamples(answers()), { soak: {} }).expect(400)).body.error.message).toMatch(/^session\.soak/);
    expect(await BenchSession.count()).toBe(before);
  });

  it('show their statistics in the detail and the list, with the core’s mode and a 64-bin angle-error profile', async () => {
    const detail = await reviewer.get(`/api/sessions/${ids.defective}`).expect(200);
    expect(detail.body.session).toMatchObject({ core: { id: coreId, mode: 'vectoring' }, passed: false, sampleCount: 4096 });
    expect(detail.body.session.stats.vectoring.angleLsb.maxAbs).toBeGreaterThanOrEqual(19);
    const profile = detail.body.session.profile as number[];
    expect(profile).toHaveLength(64);
    expect(Math.max(...profile)).toBe(detail.body.session.stats.vectoring.angleLsb.maxAbs);
    const list = await reviewer.get(`/api/sessions?coreId=${coreId}&sort=id`).expect(200);
    expect(list.body.items.map((s: { id: number }) => s.id)).toEqual([ids.defective, ids.clean]);
    expect(list.body.items[0]).toMatchObject({ core: { mode: 'vectoring' }, passed: false, verdict: { maxModelMismatches: { pass: false } } });
    expect(list.body.items[1].stats.vectoring.count).toBe(4096);
  });

  it('export as CSV x_code,y_code,angle_code,magnitude_code, which imports back to the same score', async () => {
    const a = answers(true);
    const res = await reviewer.get(`/api/sessions/${ids.defective}/export.csv`).expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    const lines = res.text.trimEnd().split('\n');
    expect(lines[0]).toBe(VECTOR_CSV_HEADER);
    expect(lines).toHaveLength(4097);
    expect(lines[6]).toBe(`${a.xs[5]},${a.ys[5]},${a.angles[5]},${a.magnitudes[5]}`);

    const back = await importCsv(engineer, res.text).expect(201);
    ids.imported = back.body.id;
    expect(back.body.stats).toEqual({ count: 4096, vectoring: expectedStats(a) });
    // The same verdict, but for the link errors a CSV has no count of.
    const { maxLinkErrors, ...uploaded } = (await reviewer.get(`/api/sessions/${ids.defective}`)).body.session.verdict;
    expect(maxLinkErrors.pass).toBe(true);
    expect(back.body.verdict).toEqual({ ...uploaded, maxLinkErrors: { limit: 0, measured: null, pass: null } });
    const stored = await BenchSession.findByPk(ids.imported);
    expect(stored!.plan).toMatchObject({ kind: 'imported', from: 'csv' });
    expect(Buffer.compare(stored!.samples, Buffer.from(packVectorSamples(a)))).toBe(0);
  });

  it('refuse an import that is not a vectoring CSV, naming the line', async () => {
    const bad = await importCsv(engineer, `${VECTOR_CSV_HEADER}\n1,2,3,4\n5,6,seven,8\n`).expect(400);
    expect(bad.body.error).toMatchObject({ code: 'bad_csv', message: 'file: line 3: angle_code "seven" is not an integer' });
    const rotationCsv = await importCsv(engineer, 'angle_code,cos_code,sin_code\n1,2,3\n').expect(400);
    expect(rotationCsv.body.error.message).toBe(`file: line 1: the header must be "${VECTOR_CSV_HEADER}"`);
    // Codes the core's formats cannot hold are the scorer's to refuse, as for uploads.
    expect((await importCsv(engineer, `${VECTOR_CSV_HEADER}\n600,0,0,0\n`).expect(400)).body.error.message).toMatch(/^samples: .*600/);
    // A vectoring CSV for a rotation core: its header is wrong there.
    expect((await importCsv(engineer, `${VECTOR_CSV_HEADER}\n1,2,3,4\n`, ids.rotationCore).expect(400)).body.error.message).toMatch(/^file: line 1: the header must be "angle_code,cos_code,sin_code"/);
  });

  it('compare vector by vector: the defects of one session against the clean one, none against its own import', async () => {
    const a = answers(true);
    const res = await reviewer.get(`/api/compare?ids=${ids.clean},${ids.defective},${ids.imported}`).expect(200);
    expect(res.body.sessions.map((s: { mode: string }) => s.mode)).toEqual(['vectoring', 'vectoring', 'vectoring']);
    expect(res.body.sessions[1].stats).toMatchObject({ count: 4096, modelMismatches: a.edited.length, coveragePct: 100, maxAbsErrorLsb: null });
    expect(res.body.sessions[1].stats.angleMaxAbsLsb).toBeGreaterThanOrEqual(19);
    expect(res.body.sessions[0].errorEnvelope.degrees).toHaveLength(720);
    const [defective, imported] = res.body.pairs;
    expect(defective).toMatchObject({ sameCore: true, common: 4096, differing: a.edited.length, maxAbsDiffLsb: 20, firstDiffering: [] });
    expect(defective.vector).toMatchObject({ maxAbsAngleDiffLsb: 20, maxAbsMagnitudeDiffLsb: 3 });
    // In (x, y) order: the grid is written x-major, so the first differing vector is the first edited answer.
    const first = a.edited[0];
    const clean = answers();
    expect(defective.vector.firstDiffering[0]).toMatchObject({ x: a.xs[first], y: a.ys[first], a: { angle: clean.angles[first], magnitude: clean.magnitudes[first] }, b: { angle: a.angles[first], magnitude: a.magnitudes[first] } });
    expect(defective.byBin.differing.reduce((x: number, y: number) => x + y, 0)).toBe(a.edited.length);
    expect(imported).toMatchObject({ common: 4096, differing: a.edited.length });
    const self = await reviewer.get(`/api/compare?ids=${ids.defective},${ids.imported}`).expect(200);
    expect(self.body.pairs[0]).toMatchObject({ common: 4096, differing: 0, maxAbsDiffLsb: 0, vector: { firstDiffering: [] } });
  });

  it('give the compare view an envelope of the angle error by direction that matches errors computed here with Math.atan2', async () => {
    const a = answers(true);
    const lo = new Array<number>(720).fill(Infinity);
    const hi = new Array<number>(720).fill(-Infinity);
    for (let i = 0; i < a.xs.length; i++) {
      if (a.xs[i] === 0 && a.ys[i] === 0) continue; // no direction, no angle error
      const turns = (Math.atan2(a.ys[i], a.xs[i]) / (2 * Math.PI) + 1) % 1;
      let e = a.angles[i] - turns * TURN;
      e -= TURN * Math.round(e / TURN);
      const bin = Math.min(719, Math.floor(turns * 720));
      lo[bin] = Math.min(lo[bin], e);
      hi[bin] = Math.max(hi[bin], e);
    }
    const res = await reviewer.get(`/api/compare?ids=${ids.defective},${ids.clean}`).expect(200);
    const env = res.body.sessions[0].errorEnvelope as { degrees: number[]; lo: (number | null)[]; hi: (number | null)[] };
    expect(env.degrees.slice(0, 2)).toEqual([0.25, 0.75]);
    const close = (got: number | null, want: number) => (Number.isFinite(want) ? got !== null && Math.abs(got - want) < 1e-3 : got === null);
    expect(env.lo.filter((v, b) => !close(v, lo[b]))).toEqual([]);
    expect(env.hi.filter((v, b) => !close(v, hi[b]))).toEqual([]);
  });

  it('are not compared with sessions of a rotation core: a clear 400', async () => {
    const codes = Int32Array.from({ length: 64 }, (_, i) => i * 1024);
    const cos = new Int32Array(64);
    const sin = new Int32Array(64);
    createCordicModel(modelConfigSchema.parse({})).evaluateInto(codes, cos, sin);
    const rot = await upload(engineer, packSamples(codes, cos, sin, new Uint8Array(64).fill(1)), { coreId: ids.rotationCore, plan: { kind: 'sweep' } }).expect(201);
    const res = await reviewer.get(`/api/compare?ids=${ids.clean},${rot.body.id}`).expect(400);
    expect(res.body.error).toMatchObject({ code: 'mixed_modes', message: expect.stringMatching(/^ids: session \d+ is of a vectoring core and session \d+ of a rotation core/) });
  });

  it('are explained by the vectoring search: the damaged answers leave no single hypothesis, and the rest is called structured', async () => {
    const res = await engineer.post(`/api/sessions/${ids.defective}/explanation`).send({}).expect(201);
    const e = res.body.explanation;
    const edited = answers(true).edited.length;
    expect(e).toMatchObject({ mode: 'vectoring', declared: config, answered: 4096, outcome: 'partly-explained', rest: 'structured' });
    // The declared model reproduces every answer this test left alone, and nothing does better.
    expect(e.hypotheses[0]).toMatchObject({ label: 'the declared model', fault: null, exact: 4096 - edited });
    expect(res.body.applicableConfig).toBeNull();
    expect((await reviewer.get(`/api/sessions/${ids.defective}/explanation`).expect(200)).body.explanation).toEqual(e);
  });
});

describe('golden vectors of a vectoring core', () => {
  const url = () => `/api/cores/${coreId}/golden-vectors`;
  const post = (text: string) => engineer.post(url()).field('name', 'rtl sim').attach('file', Buffer.from(text), 'golden.csv');

  it('are a CSV of x_code,y_code,angle_code,magnitude_code, summarised against the vectoring model', async () => {
    const a = answers(true);
    const rows = Array.from({ length: 200 }, (_, i) => `${a.xs[i]},${a.ys[i]},${a.angles[i]},${a.magnitudes[i]}`);
    const res = await post([VECTOR_CSV_HEADER, ...rows, rows[0]].join('\n')).expect(201);
    const differing = a.edited.filter((i) => i < 200);
    expect(res.body.set).toMatchObject({ count: 201, distinctCodes: 200, coverageShare: 200 / 2 ** 20, modelMismatches: differing.length, firstMismatches: [] });
    expect(res.body.set.firstVectorMismatches[0]).toEqual({ line: differing[0] + 2, x: a.xs[differing[0]], y: a.ys[differing[0]], angle: a.angles[differing[0]], magnitude: a.magnitudes[differing[0]], modelAngle: answers().angles[differing[0]], modelMagnitude: answers().magnitudes[differing[0]] });
    expect((await reviewer.get(url()).expect(200)).body.sets).toHaveLength(1);
  });

  it('refuse rows outside the core’s formats or in the rotation format, naming the line', async () => {
    expect((await post(`${VECTOR_CSV_HEADER}\n0,0,0,0\n-513,0,0,0\n`).expect(400)).body.error.message).toBe("file: line 3: x_code -513 is outside the core's 10-bit input format");
    expect((await post(`${VECTOR_CSV_HEADER}\n0,0,4096,0\n`).expect(400)).body.error.message).toBe("file: line 2: angle_code 4096 is outside the core's 12-bit angle format");
    expect((await post('angle_code,cos_code,sin_code\n1,2,3\n').expect(400)).body.error.message).toBe(`file: line 1: the header must be "${VECTOR_CSV_HEADER}"`);
  });
});
