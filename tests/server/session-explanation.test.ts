import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEntry, BenchSession, Core, SessionExplanation } from '../../server/db/models';
import { explain } from '../../shared/explain';
import { packColumns } from '../../shared/link-engine/sample-pack';
import { createCordicModel, parseModelConfig, type ModelConfigInput } from '../../shared/numeric';
import { createSimVectorCore, parseVectorCoreFault } from '../../mock-device/vector-core';
import { explainVectors } from '../../shared/explain';
import { packVectorSamples } from '../../shared/link-engine/vector-sample-pack';
import { parseVectorConfig, planVectors } from '../../shared/vectoring';
import { testApp, type Agent, type TestApp } from '../support/test-app';

// The explanation endpoint: the server recomputes the search from the stored samples under the
// core's configuration (the expected answer is shared/explain's own, run here over the same
// answers), saves it, lets everyone read it and refuses what it should, storing nothing then.
const declared = parseModelConfig({});

/** Every 16th code of the 16-bit circle, as a core of `config` answers, `mangle` applied. */
function answers(config: ModelConfigInput = {}, mangle: (v: number) => number = (v) => v) {
  const n = 4096;
  const codes = new Float64Array(n).map((_, i) => i * 16);
  const cos = new Int32Array(n);
  const sin = new Int32Array(n);
  createCordicModel(config).evaluateInto(codes, cos, sin);
  for (let i = 0; i < n; i++) [cos[i], sin[i]] = [mangle(cos[i]), mangle(sin[i])];
  return { codes, cos, sin };
}
// Bit 0 of both outputs stuck at 1 (two's complement: OR-ing the bit in is what a stuck-at-1 line does).
const stuckBit0 = answers({}, (v) => v | 1);
// A core built with 12 iterations where 16 were declared.
const twelveIterations = answers({ iterations: 12 });

let t: TestApp;
let agents: Record<'reviewer' | 'engineer' | 'admin', Agent>;
let core: Core;

async function storedSession(samples: Buffer, on: Core = core) {
  return BenchSession.create({
    coreId: on.id, buildId: null, boardId: null, operatorId: null, startedAt: new Date(), endedAt: null, plan: { kind: 'sweep' }, transport: {}, deviceInfo: null,
    stats: {}, verdict: {}, passed: false, sampleCount: Math.floor(samples.length / 12), samples, archive: null,
  });
}
const packed = (s: ReturnType<typeof answers>) => Buffer.from(packColumns(s));
const url = (id: number | string) => `/api/sessions/${id}/explanation`;

beforeAll(async () => {
  t = await testApp();
  core = await Core.create({ name: 'Explained core', slug: 'explained-core', linkProfile: {}, modelConfig: declared, limits: { maxModelMismatches: 0 }, baselineSessionId: null });
  agents = { reviewer: await t.signInAs('reviewer'), engineer: await t.signInAs('engineer'), admin: await t.signInAs('admin') };
});
afterAll(() => t.close());

describe('POST /api/sessions/:id/explanation', () => {
  it('recomputes the explanation from the stored samples, saves it, and every role reads the same', async () => {
    const session = await storedSession(packed(stuckBit0));
    await agents.reviewer.get(url(session.id)).expect(404);
    // A result sent by the client is ignored: the server searches for itself.
    const res = await agents.engineer.post(url(session.id)).send({ explanation: { outcome: 'explained', hypotheses: [] } }).expect(201);
    const expected = JSON.parse(JSON.stringify(explain(declared, { angle: stuckBit0.codes, cos: stuckBit0.cos, sin: stuckBit0.sin }))) as unknown;
    expect(res.body.explanation).toEqual(expected);
    expect(res.body.explanation.answered).toBe(4096);
    const best = res.body.explanation.hypotheses[0];
    expect(best.exact).toBe(4096);
    expect([best.fault, ...best.equivalent.map((e: { fault: unknown }) => e.fault)]).toContainEqual(expect.objectContaining({ kind: 'stuck-bit', bit: 0, value: 1 }));
    expect(res.body.savedBy).toEqual({ id: t.users.engineer.id, name: t.users.engineer.name });
    expect(res.body.applicableConfig).toBeNull();
    for (const role of ['reviewer', 'engineer', 'admin'] as const) {
      const read = await agents[role].get(url(session.id)).expect(200);
      expect(read.body.explanation).toEqual(expected);
    }
    const audit = await AuditEntry.findOne({ where: { action: 'explain', entity: 'session', entityId: session.id } });
    expect(audit?.detail).toMatchObject({ outcome: res.body.explanation.outcome, exact: 4096, answered: 4096 });
  });

  it('an admin may run it; running it again replaces the saved one', async () => {
    const session = await storedSession(packed(stuckBit0));
    await agents.engineer.post(url(session.id)).expect(201);
    const again = await agents.admin.post(url(session.id)).expect(201);
    expect(again.body.savedBy.id).toBe(t.users.admin.id);
    expect(await SessionExplanation.count({ where: { sessionId: session.id } })).toBe(1);
  });

  it('goes with its session when the session is deleted', async () => {
    const session = await storedSession(packed(stuckBit0));
    await agents.engineer.post(url(session.id)).expect(201);
    await agents.admin.delete(`/api/sessions/${session.id}`).expect(204);
    expect(await SessionExplanation.count({ where: { sessionId: session.id } })).toBe(0);
  });

  it('says a healthy session matches its model', async () => {
    const session = await storedSession(packed(answers()));
    const res = await agents.engineer.post(url(session.id)).expect(201);
    expect(res.body.explanation.outcome).toBe('matches-model');
    expect(res.body.explanation.hypotheses[0]).toMatchObject({ fault: null, config: declared, exact: 4096, maxDiffLsb: 0 });
  });

  it('refuses a reviewer, a bad id, an unknown session, no samples and broken samples, and stores nothing', async () => {
    const session = await storedSession(packed(stuckBit0));
    const empty = await storedSession(Buffer.alloc(0));
    const broken = await storedSession(Buffer.alloc(13));
    // Angle code 70,000 does not fit the core's 16-bit angles.
    const outOfRange = await storedSession(Buffer.from(packColumns({ codes: Float64Array.of(70_000), cos: Int32Array.of(0), sin: Int32Array.of(0) })));
    const refused = await agents.reviewer.post(url(session.id)).expect(403);
    expect(refused.body.error.code).toBe('forbidden');
    expect((await agents.engineer.post(url('abc')).expect(400)).body.error.message).toMatch(/^params\.sessionId: /);
    expect((await agents.engineer.post(url(999_999)).expect(404)).body.error.message).toBe('Session not found');
    expect((await agents.engineer.post(url(empty.id)).expect(400)).body.error).toEqual({ code: 'no_samples', message: `Session ${empty.id} holds no answers to explain` });
    expect((await agents.engineer.post(url(broken.id)).expect(400)).body.error.code).toBe('bad_samples');
    expect((await agents.engineer.post(url(outOfRange.id)).expect(400)).body.error.message).toMatch(/^samples: sample 0: angle code 70000 /);
    for (const s of [session, empty, broken, outOfRange]) expect(await SessionExplanation.count({ where: { sessionId: s.id } })).toBe(0);
    expect((await agents.reviewer.get(url(empty.id)).expect(404)).body.error.message).toBe('Explanation of this session not found');
    expect(await AuditEntry.count({ where: { action: 'explain', entityId: [session.id, empty.id, broken.id, outOfRange.id] } })).toBe(0);
  });
});

describe('POST /api/sessions/:id/explanation/decision', () => {
  async function explainedDeviation() {
    const own = await Core.create({ name: 'Deviating core', slug: `deviating-${Date.now()}-${Math.round(Math.random() * 1e6)}`, linkProfile: {}, modelConfig: declared, limits: {}, baselineSessionId: null });
    const session = await storedSession(packed(twelveIterations), own);
    const res = await agents.engineer.post(url(session.id)).expect(201);
    return { own, session, res };
  }

  it('finds the configuration deviation and applies it to the core in one audited step', async () => {
    const { own, session, res } = await explainedDeviation();
    const best = res.body.explanation.hypotheses[0];
    expect(best).toMatchObject({ fault: null, exact: 4096 });
    expect(best.config.iterations).toBe(12);
    expect(res.body.applicableConfig).toEqual(best.config);
    await agents.reviewer.post(`${url(session.id)}/decision`).send({ decision: 'apply' }).expect(403);
    const applied = await agents.engineer.post(`${url(session.id)}/decision`).send({ decision: 'apply' }).expect(200);
    expect(applied.body.decision).toMatchObject({ choice: 'applied', by: { id: t.users.engineer.id } });
    expect(applied.body.applicableConfig).toBeNull();
    await own.reload();
    expect(own.modelConfig).toEqual(best.config);
    const audit = await AuditEntry.findOne({ where: { action: 'update', entity: 'core', entityId: own.id } });
    expect(audit?.detail).toMatchObject({ modelConfig: best.config, fromExplanationOfSession: session.id });
    // Decided once: a second decision is a conflict.
    await agents.engineer.post(`${url(session.id)}/decision`).send({ decision: 'keep' }).expect(409);
  });

  it('keeps the core as declared when asked, and refuses to apply over a core changed since', async () => {
    const kept = await explainedDeviation();
    await agents.engineer.post(`${url(kept.session.id)}/decision`).send({ decision: 'keep' }).expect(200);
    await kept.own.reload();
    expect(kept.own.modelConfig).toEqual(declared);
    expect((await agents.reviewer.get(url(kept.session.id)).expect(200)).body.decision.choice).toBe('kept');

    const changed = await explainedDeviation();
    await changed.own.update({ modelConfig: parseModelConfig({ guardBits: 3 }) });
    const res = await agents.engineer.post(`${url(changed.session.id)}/decision`).send({ decision: 'apply' }).expect(409);
    expect(res.body.error.message).toMatch(/changed since/);
    await changed.own.reload();
    expect(changed.own.modelConfig).toEqual(parseModelConfig({ guardBits: 3 }));
  });

  it('refuses a decision on a defect, a bad body and a session never explained', async () => {
    const session = await storedSession(packed(stuckBit0));
    await agents.engineer.post(url(session.id)).expect(201);
    await agents.engineer.post(`${url(session.id)}/decision`).send({ decision: 'apply' }).expect(409);
    expect((await agents.engineer.post(`${url(session.id)}/decision`).send({ decision: 'maybe' }).expect(400)).body.error.message).toMatch(/^body\.decision: /);
    const never = await storedSession(packed(stuckBit0));
    await agents.engineer.post(`${url(never.id)}/decision`).send({ decision: 'keep' }).expect(404);
    await core.reload();
    expect(core.modelConfig).toEqual(declared);
  });
});

describe('explanations of a vectoring core', () => {
  const vectorDeclared = parseVectorConfig({ inBits: 12, iterations: 14, gainCompensation: 'multiply' });

  /** The simulated vectoring board's answers to 3,000 random vectors, with `spec` injected. */
  function vectorAnswers(spec: string) {
    const { xs, ys } = planVectors({ kind: 'random', seed: 5, count: 3000 }, vectorDeclared);
    const sim = createSimVectorCore(vectorDeclared, parseVectorCoreFault(spec));
    const angles = new Int32Array(xs.length);
    const magnitudes = new Int32Array(xs.length);
    for (let i = 0; i < xs.length; i++) ({ angle: angles[i], magnitude: magnitudes[i] } = sim.answer(xs[i], ys[i]));
    return { xs, ys, angles, magnitudes };
  }
  async function vectorSession(spec: string) {
    const own = await Core.create({ name: 'Phase core', slug: `phase-${Date.now()}-${Math.round(Math.random() * 1e6)}`, mode: 'vectoring', linkProfile: {}, modelConfig: null, vectorConfig: vectorDeclared, limits: {}, baselineSessionId: null });
    const a = vectorAnswers(spec);
    const session = await storedSession(Buffer.from(packVectorSamples(a)), own);
    return { own, session, a };
  }

  it('finds a defect of the simulated board, the same result as the shared search, and offers nothing to apply', async () => {
    const { session, a } = await vectorSession('atan-entry:3:-1');
    const res = await agents.engineer.post(url(session.id)).expect(201);
    const expected = JSON.parse(JSON.stringify(explainVectors(vectorDeclared, { x: a.xs, y: a.ys, angle: a.angles, magnitude: a.magnitudes }))) as unknown;
    expect(res.body.explanation).toEqual(expected);
    expect(res.body.explanation).toMatchObject({ mode: 'vectoring', declared: vectorDeclared, answered: 3000, outcome: 'explained' });
    expect(res.body.explanation.hypotheses[0]).toMatchObject({ label: 'arctangent entry 3 is 1 LSB low', fault: { kind: 'atan-entry', iteration: 3, delta: -1 }, exact: 3000 });
    expect(res.body.applicableConfig).toBeNull();
    await agents.engineer.post(`${url(session.id)}/decision`).send({ decision: 'apply' }).expect(409);
  });

  it('applies a configuration deviation to the core\'s vectoring configuration in one audited step', async () => {
    const { own, session } = await vectorSession('iterations=13');
    const res = await agents.engineer.post(url(session.id)).expect(201);
    const best = res.body.explanation.hypotheses[0];
    expect(best).toMatchObject({ label: '13 iterations instead of 14', fault: null, exact: 3000, config: { ...vectorDeclared, iterations: 13 } });
    expect(res.body.applicableConfig).toEqual(best.config);
    const applied = await agents.engineer.post(`${url(session.id)}/decision`).send({ decision: 'apply' }).expect(200);
    expect(applied.body.core).toMatchObject({ mode: 'vectoring', modelConfig: null, vectorConfig: best.config });
    await own.reload();
    expect(own.vectorConfig).toEqual(best.config);
    expect(own.modelConfig).toBeNull();
    const audit = await AuditEntry.findOne({ where: { action: 'update', entity: 'core', entityId: own.id } });
    expect(audit?.detail).toMatchObject({ vectorConfig: best.config, fromExplanationOfSession: session.id });
  });

  it('refuses to apply over a vectoring configuration changed since, and broken vectoring samples', async () => {
    const { own, session } = await vectorSession('gainCompensation=none');
    const res = await agents.engineer.post(url(session.id)).expect(201);
    expect(res.body.applicableConfig).toEqual({ ...vectorDeclared, gainCompensation: 'none' });
    await own.update({ vectorConfig: parseVectorConfig({ ...vectorDeclared, guardBits: 3 }) });
    const refused = await agents.engineer.post(`${url(session.id)}/decision`).send({ decision: 'apply' }).expect(409);
    expect(refused.body.error.message).toMatch(/vectoring configuration has changed since/);
    const broken = await storedSession(Buffer.alloc(20), own);
    expect((await agents.engineer.post(url(broken.id)).expect(400)).body.error.code).toBe('bad_samples');
    const empty = await storedSession(Buffer.alloc(0), own);
    expect((await agents.engineer.post(url(empty.id)).expect(400)).body.error.code).toBe('no_samples');
  });
});
