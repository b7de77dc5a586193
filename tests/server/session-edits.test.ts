import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { packSamples } from '../../cli/run-server';
import { hashPassword } from '../../server/auth/passwords';
import { AuditEntry, BenchSession, Core, User } from '../../server/db/models';
import { modelConfigSchema } from '../../server/schemas/core';
import { angleCodeToDegrees, createCordicModel, exactSinCos } from '../../shared/numeric';
import { TEST_PASSWORD, testApp, type Agent, type TestApp } from '../support/test-app';

// Editing, deleting and exporting stored sessions. Sessions are uploaded as the runner sends them;
// the CSV's figures are checked against the shared model and exact reference computed here.
const config = modelConfigSchema.parse({});

/** `n` codes `step` apart, answered as the model does, `faults` aside. */
function run(n: number, step: number, faults: Array<[index: number, cosDelta: number]> = []) {
  const codes = new Int32Array(n).map((_, i) => (i * step) % 65_536);
  const cos = new Int32Array(n);
  const sin = new Int32Array(n);
  createCordicModel(config).evaluateInto(codes, cos, sin);
  for (const [i, d] of faults) cos[i] += d;
  return { codes, cos, sin, packed: packSamples(codes, cos, sin, new Uint8Array(n).fill(1)) };
}

let t: TestApp;
let engineer: Agent;
let otherEngineer: Agent;
let reviewer: Agent;
let admin: Agent;
let core: Core;

const upload = async (agent: Agent, samples: Uint8Array): Promise<number> => {
  const session = { coreId: core.id, startedAt: '2026-03-01T09:00:00.000Z', plan: { kind: 'sweep' }, transport: { kind: 'serial' }, link: { checkFailures: 0 } };
  const res = await agent.post('/api/sessions').field('session', JSON.stringify(session)).attach('samples', Buffer.from(samples), 'samples.bin').expect(201);
  return res.body.id as number;
};

beforeAll(async () => {
  t = await testApp();
  core = await Core.create({ name: 'Edits core', slug: 'edits-core', linkProfile: {}, modelConfig: config, limits: { maxAbsErrorLsb: 4, maxModelMismatches: 0 }, baselineSessionId: null });
  await User.create({ email: 'second@lab.test', name: 'Second engineer', role: 'engineer', passwordHash: await hashPassword(TEST_PASSWORD, 4) });
  engineer = await t.signInAs('engineer');
  otherEngineer = await t.signIn('second@lab.test');
  reviewer = await t.signInAs('reviewer');
  admin = await t.signInAs('admin');
});
afterAll(() => t.close());

describe('PATCH /api/sessions/:id', () => {
  it('lets an engineer change notes and tags, with an audit entry', async () => {
    const id = await upload(engineer, run(256, 256).packed);
    const res = await otherEngineer.patch(`/api/sessions/${id}`).send({ notes: 'Rerun after reflow', tags: ['reflow', 'bay-2'] }).expect(200);
    expect(res.body.session).toMatchObject({ id, notes: 'Rerun after reflow', tags: ['reflow', 'bay-2'] });
    expect(res.body.session.samples).toBeUndefined();
    const row = await BenchSession.findByPk(id);
    expect(row).toMatchObject({ notes: 'Rerun after reflow', tags: ['reflow', 'bay-2'] });
    expect(await AuditEntry.count({ where: { entity: 'session', entityId: id, action: 'update' } })).toBe(1);
  });

  it('refuses a reviewer with 403 and unknown fields with 400', async () => {
    const id = await upload(engineer, run(256, 256).packed);
    await reviewer.patch(`/api/sessions/${id}`).send({ notes: 'x' }).expect(403);
    await engineer.patch(`/api/sessions/${id}`).send({ colour: 'red' }).expect(400);
    await engineer.patch(`/api/sessions/${id}`).send({ baseline: false }).expect(400);
    await engineer.patch('/api/sessions/999999').send({ notes: 'x' }).expect(404);
  });

  it('makes a passing session its core’s baseline and refuses a failing one with 409', async () => {
    const good = await upload(engineer, run(256, 256).packed);
    const bad = await upload(engineer, run(256, 256, [[5, 40]]).packed);
    await engineer.patch(`/api/sessions/${good}`).send({ baseline: true }).expect(200);
    await core.reload();
    expect(core.baselineSessionId).toBe(good);
    expect(await AuditEntry.count({ where: { entity: 'session', entityId: good, action: 'update' } })).toBe(1);

    const refused = await engineer.patch(`/api/sessions/${bad}`).send({ baseline: true, notes: 'should not land' }).expect(409);
    expect(refused.body.error.message).toMatch(/passing/);
    await core.reload();
    expect(core.baselineSessionId).toBe(good);
    expect((await BenchSession.findByPk(bad))?.notes).toBe('');
    expect(await AuditEntry.count({ where: { entity: 'session', entityId: bad, action: 'update' } })).toBe(0);
  });
});

describe('DELETE /api/sessions/:id', () => {
  it('lets the operator delete a fresh session of their own, with an audit entry', async () => {
    const id = await upload(engineer, run(256, 256).packed);
    await engineer.delete(`/api/sessions/${id}`).expect(204);
    expect(await BenchSession.findByPk(id)).toBeNull();
    expect(await AuditEntry.count({ where: { entity: 'session', entityId: id, action: 'delete' } })).toBe(1);
  });

  it('refuses another engineer, a reviewer and the operator after 24 hours with 403; an admin may', async () => {
    const id = await upload(engineer, run(256, 256).packed);
    await otherEngineer.delete(`/api/sessions/${id}`).expect(403);
    await reviewer.delete(`/api/sessions/${id}`).expect(403);
    await BenchSession.update({ createdAt: new Date(Date.now() - 25 * 60 * 60 * 1000) }, { where: { id }, silent: true });
    await engineer.delete(`/api/sessions/${id}`).expect(403);
    expect(await BenchSession.findByPk(id)).not.toBeNull();
    await admin.delete(`/api/sessions/${id}`).expect(204);
    expect(await BenchSession.findByPk(id)).toBeNull();
    await admin.delete(`/api/sessions/${id}`).expect(404);
  });

  it('leaves the core without a baseline when its baseline is deleted', async () => {
    const id = await upload(engineer, run(256, 256).packed);
    await engineer.patch(`/api/sessions/${id}`).send({ baseline: true }).expect(200);
    await engineer.delete(`/api/sessions/${id}`).expect(204);
    await core.reload();
    expect(core.baselineSessionId).toBeNull();
  });
});

describe('GET /api/sessions/:id/export.csv', () => {
  it('gives a reviewer one row per sample of a 65,536-sample session, as an attachment', async () => {
    // Every code of the 16-bit circle, in a scrambled order, with one wrong answer.
    const n = 65_536;
    const r = run(n, 40_503, [[12_345, 3]]);
    const id = await upload(engineer, r.packed);
    // Its time is the `csv-export` figure of `npm run bench -- hot-paths`.
    const res = await reviewer.get(`/api/sessions/${id}/export.csv`).expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toBe(`attachment; filename="session-${id}.csv"`);
    const lines = (res.text as string).trimEnd().split('\n');
    expect(lines[0]).toBe('index,angle_code,angle_deg,cos_code,sin_code,exact_cos,exact_sin,model_cos,model_sin,cos_err_lsb,sin_err_lsb');
    expect(lines).toHaveLength(n + 1);

    const i = 12_345;
    const code = r.codes[i];
    const exact = exactSinCos(config, code);
    const model = createCordicModel(config).evaluate(code);
    const scale = 2 ** config.outFrac;
    const cells = lines[i + 1].split(',').map(Number);
    expect(cells).toHaveLength(11);
    const [index, angleCode, deg, cosCode, sinCode, exactCos, exactSin, modelCos, modelSin, cosErr, sinErr] = cells;
    expect([index, angleCode, cosCode, sinCode, modelCos, modelSin]).toEqual([i, code, r.cos[i], r.sin[i], model.cos, model.sin]);
    expect(cosCode).toBe(model.cos + 3);
    expect(deg).toBeCloseTo(angleCodeToDegrees(config, code), 12);
    expect(exactCos).toBeCloseTo(exact.cos, 15);
    expect(exactSin).toBeCloseTo(exact.sin, 15);
    expect(cosErr).toBeCloseTo(r.cos[i] - exact.cos * scale, 9);
    expect(sinErr).toBeCloseTo(r.sin[i] - exact.sin * scale, 9);
  });

  it('refuses a signed-out caller with 401 and answers 404 for an unknown session', async () => {
    await (await t.visitor()).get('/api/sessions/1/export.csv').expect(401);
    await reviewer.get('/api/sessions/999999/export.csv').expect(404);
  });
});
