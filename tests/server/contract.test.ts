import express from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { packSamples } from '../../cli/run-server';
import { errorHandler } from '../../server/middleware/error-handler';
import { CHECK_REPLIES, reply } from '../../server/routes/reply';
import { modelConfigSchema } from '../../server/schemas/core';
import * as contract from '../../shared/contract';
import { createCordicModel } from '../../shared/numeric/cordic-model';
import { VECTOR_CSV_HEADER } from '../../shared/link-engine/vector-sample-csv';
import { packVectorSamples } from '../../shared/link-engine/vector-sample-pack';
import { createVectorModel, parseVectorConfig, planVectors } from '../../shared/vectoring';
import { testApp, type Agent, type TestApp } from '../support/test-app';

// Every reply of the API, read from the real server, parsed with its contract schema here (the
// server checks its own replies in test mode too; this reading is the test's own).
const config = modelConfigSchema.parse({});
const model = createCordicModel(config);

/** Parse `body` with `schema`; on failure the assertion names the fields at fault. */
function expectContract(schema: z.ZodType, body: unknown) {
  const r = schema.safeParse(body);
  expect(r.success ? [] : r.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`)).toEqual([]);
}

/** 256 codes answered as `by` (the reference model by default) does, packed as the runner sends them. */
function samples(by = model) {
  const codes = new Int32Array(256).map((_, i) => i * 256);
  const cos = new Int32Array(codes.length);
  const sin = new Int32Array(codes.length);
  by.evaluateInto(codes, cos, sin);
  return { codes, cos, sin, packed: Buffer.from(packSamples(codes, cos, sin, new Uint8Array(codes.length).fill(1))) };
}

let t: TestApp;
let engineer: Agent;
let reviewer: Agent;
let admin: Agent;
const ids = { core: 0, build: 0, board: 0, session: 0, other: 0 };

beforeAll(async () => {
  t = await testApp({ uploadLimitBytes: 256 * 1024 });
  engineer = await t.signInAs('engineer');
  reviewer = await t.signInAs('reviewer');
  admin = await t.signInAs('admin');
});
afterAll(() => t.close());

describe('every reply parses with its contract schema', () => {
  it('cores', async () => {
    const created = await engineer.post('/api/cores').send({ name: 'Contract core', slug: 'contract-core', limits: { maxAbsErrorLsb: 4 } }).expect(201);
    expectContract(contract.coreReply, created.body);
    ids.core = created.body.core.id;
    expectContract(contract.coreListReply, (await reviewer.get('/api/cores').expect(200)).body);
    await engineer.post(`/api/cores/${ids.core}/watch`).send({});
    expectContract(contract.coreDetailReply, (await reviewer.get(`/api/cores/${ids.core}`).expect(200)).body);
    expectContract(contract.coreReply, (await engineer.patch(`/api/cores/${ids.core}`).send({ name: 'Contract core 2' }).expect(200)).body);
  });

  it('builds and reviews', async () => {
    const created = await engineer.post('/api/builds').send({ coreId: ids.core, label: 'c1', sourceRevision: 'abc', toolVersion: 't', clockMHz: 100 }).expect(201);
    expectContract(contract.buildReply, created.body);
    ids.build = created.body.build.id;
    expectContract(contract.buildFileReply, (await engineer.post(`/api/builds/${ids.build}/file`).attach('file', Buffer.from('bitstream'), 'top.bit').expect(200)).body);
    expectContract(contract.buildReply, (await engineer.patch(`/api/builds/${ids.build}`).send({ notes: 'retimed' }).expect(200)).body);
    expectContract(contract.reviewReply, (await reviewer.post(`/api/builds/${ids.build}/reviews`).send({ decision: 'approve' }).expect(201)).body);
    expectContract(contract.reviewRequestReply, (await engineer.post(`/api/builds/${ids.build}/request-review`).send({}).expect(202)).body);
    expectContract(contract.reviewListReply, (await reviewer.get(`/api/builds/${ids.build}/reviews`).expect(200)).body);
    expectContract(contract.buildListReply, (await reviewer.get('/api/builds').expect(200)).body);
    expectContract(contract.buildDetailReply, (await reviewer.get(`/api/builds/${ids.build}`).expect(200)).body);
  });

  it('boards', async () => {
    const created = await engineer.post('/api/boards').send({ name: 'Rig C', serial: 'C-1', fpgaPart: 'part', adapter: 'usb-uart', location: 'bay 1' }).expect(201);
    expectContract(contract.boardReply, created.body);
    ids.board = created.body.board.id;
    expectContract(contract.boardListReply, (await reviewer.get('/api/boards').expect(200)).body);
    expectContract(contract.boardReply, (await reviewer.get(`/api/boards/${ids.board}`).expect(200)).body);
    expectContract(contract.boardReply, (await engineer.patch(`/api/boards/${ids.board}`).send({ location: 'bay 2' }).expect(200)).body);
  });

  it('sessions: upload, import, list, detail, edit, compare', async () => {
    const s = samples();
    const conditions = { temperature_c: 85, vccint_v: 0.95 };
    const session = { coreId: ids.core, buildId: ids.build, boardId: ids.board, startedAt: '2026-03-01T09:00:00.000Z', plan: { kind: 'sweep' }, transport: { kind: 'serial' }, conditions };
    const uploaded = await engineer.post('/api/sessions').field('session', JSON.stringify(session)).attach('samples', s.packed, 'samples.bin').attach('archive', Buffer.from([1]), 'c.abrc').expect(201);
    expectContract(contract.sessionStoredReply, uploaded.body);
    ids.session = uploaded.body.id;

    const csv = ['angle_code,cos_code,sin_code', ...Array.from(s.codes, (c, i) => `${c},${s.cos[i]},${s.sin[i]}`)].join('\n') + '\n';
    const imported = await engineer.post('/api/sessions/import').field('session', JSON.stringify({ coreId: ids.core })).attach('file', Buffer.from(csv), 'sim.csv').expect(201);
    expectContract(contract.sessionStoredReply, imported.body);
    ids.other = imported.body.id;

    const page = await reviewer.get('/api/sessions').expect(200);
    expectContract(contract.sessionPage, page.body);
    // Newest first: the import started now, the upload on 1 March.
    expect(page.body.items.map((i: { id: number }) => i.id)).toEqual([ids.other, ids.session]);
    expect(page.body.total).toBe(2);

    const detail = await reviewer.get(`/api/sessions/${ids.session}`).expect(200);
    expectContract(contract.sessionDetailReply, detail.body);
    expect(detail.body.session.hasArchive).toBe(true);
    expectContract(contract.sessionPatchReply, (await engineer.patch(`/api/sessions/${ids.session}`).send({ tags: ['contract'], baseline: true }).expect(200)).body);

    const compared = await reviewer.get(`/api/compare?ids=${ids.session},${ids.other}`).expect(200);
    expectContract(contract.compareReply, compared.body);
    expect(compared.body.pairs[0]).toMatchObject({ a: ids.session, b: ids.other, sameCore: true, differing: 0 });
  });

  it('comments and golden vectors', async () => {
    expectContract(contract.commentReply, (await reviewer.post(`/api/sessions/${ids.session}/comments`).send({ body: 'looks right' }).expect(201)).body);
    expectContract(contract.commentListReply, (await reviewer.get(`/api/sessions/${ids.session}/comments`).expect(200)).body);
    const rows = [0, 4096, 8192].map((c) => {
      const { cos, sin } = model.evaluate(c);
      return `${c},${cos},${sin}`;
    });
    const vectors = Buffer.from(['angle_code,cos_code,sin_code', ...rows].join('\n'));
    expectContract(contract.goldenVectorReply, (await engineer.post(`/api/cores/${ids.core}/golden-vectors`).field('name', 'sim').attach('file', vectors, 'v.csv').expect(201)).body);
    expectContract(contract.goldenVectorListReply, (await reviewer.get(`/api/cores/${ids.core}/golden-vectors`).expect(200)).body);
  });

  it('condition grid, explanations, stations', async () => {
    const grid = (await reviewer.get(`/api/condition-grid?buildId=${ids.build}&x=temperature_c&y=vccint_v`).expect(200)).body;
    expectContract(contract.conditionGridReply, grid);
    expect(grid.cells).toEqual([{ x: 85, y: 0.95, verdict: 'pass', counts: { pass: 1, fail: 0, unstable: 0 }, sessionIds: [ids.session] }]);

    const url = `/api/sessions/${ids.session}/explanation`;
    expectContract(contract.explanationReply, (await engineer.post(url).expect(201)).body);
    expectContract(contract.explanationReply, (await reviewer.get(url).expect(200)).body);
    // A core built with 12 iterations where 16 were declared: a configuration deviation an engineer may decide on.
    const twelve = samples(createCordicModel(modelConfigSchema.parse({ iterations: 12 })));
    const deviant = (await engineer.post('/api/sessions').field('session', JSON.stringify({ coreId: ids.core, startedAt: '2026-03-02T09:00:00.000Z', plan: { kind: 'sweep' }, transport: { kind: 'serial' } })).attach('samples', twelve.packed, 'samples.bin').expect(201)).body.id;
    const explained = (await engineer.post(`/api/sessions/${deviant}/explanation`).expect(201)).body;
    expectContract(contract.explanationReply, explained);
    expect(explained.applicableConfig).toMatchObject({ iterations: 12 });
    const decided = (await engineer.post(`/api/sessions/${deviant}/explanation/decision`).send({ decision: 'keep' }).expect(200)).body;
    expectContract(contract.explanationDecisionReply, decided);
    expect(decided.decision).toMatchObject({ choice: 'kept', by: { id: t.users.engineer.id } });

    // No station online here (tests/server/stations.test.ts checks a listed one against the contract).
    const stations = (await reviewer.get('/api/stations').expect(200)).body;
    expectContract(contract.stationListReply, stations);
    expect(stations.stations).toEqual([]);
  });

  it('a vectoring core: the core, an upload, an import, list, detail, compare, golden vectors', async () => {
    const vectorConfig = parseVectorConfig({ inBits: 8, iterations: 10, angleBits: 10 });
    const created = await engineer.post('/api/cores').send({ name: 'Contract vectoring', slug: 'contract-vec', mode: 'vectoring', vectorConfig, limits: { maxAngleErrorLsb: 8 } }).expect(201);
    expectContract(contract.coreReply, created.body);
    const coreId = created.body.core.id as number;
    expectContract(contract.coreDetailReply, (await reviewer.get(`/api/cores/${coreId}`).expect(200)).body);
    const { xs, ys } = planVectors({ kind: 'circle', radius: 100, points: 64 }, vectorConfig);
    const angles = new Int32Array(xs.length);
    const magnitudes = new Int32Array(xs.length);
    createVectorModel(vectorConfig).answerInto(xs, ys, angles, magnitudes);
    const session = { coreId, startedAt: '2026-03-02T09:00:00.000Z', plan: { kind: 'circle', radius: 100, points: 64 }, transport: { kind: 'serial' } };
    const packed = Buffer.from(packVectorSamples({ xs, ys, angles, magnitudes }));
    const uploaded = await engineer.post('/api/sessions').field('session', JSON.stringify(session)).attach('samples', packed, 'samples.bin').expect(201);
    expectContract(contract.sessionStoredReply, uploaded.body);
    const csv = (await reviewer.get(`/api/sessions/${uploaded.body.id}/export.csv`).expect(200)).text;
    const imported = await engineer.post('/api/sessions/import').field('session', JSON.stringify({ coreId })).attach('file', Buffer.from(csv), 'vec.csv').expect(201);
    expectContract(contract.sessionStoredReply, imported.body);
    expectContract(contract.sessionPage, (await reviewer.get(`/api/sessions?coreId=${coreId}`).expect(200)).body);
    expectContract(contract.sessionDetailReply, (await reviewer.get(`/api/sessions/${uploaded.body.id}`).expect(200)).body);
    const compared = await reviewer.get(`/api/compare?ids=${uploaded.body.id},${imported.body.id}`).expect(200);
    expectContract(contract.compareReply, compared.body);
    expect(compared.body.pairs[0]).toMatchObject({ sameCore: true, common: 64, differing: 0 });
    const vectors = Buffer.from([VECTOR_CSV_HEADER, ...Array.from(xs, (x, i) => `${x},${ys[i]},${angles[i]},${magnitudes[i]}`)].join('\n'));
    expectContract(contract.goldenVectorReply, (await engineer.post(`/api/cores/${coreId}/golden-vectors`).field('name', 'sim').attach('file', vectors, 'v.csv').expect(201)).body);
    expectContract(contract.goldenVectorListReply, (await reviewer.get(`/api/cores/${coreId}/golden-vectors`).expect(200)).body);

    // Its explanation: the same reply, `mode: 'vectoring'`; a core built with 8 iterations where 10
    // were declared gives a vectoring configuration to decide on.
    expectContract(contract.explanationReply, (await engineer.post(`/api/sessions/${uploaded.body.id}/explanation`).expect(201)).body);
    createVectorModel({ ...vectorConfig, iterations: 8 }).answerInto(xs, ys, angles, magnitudes);
    const eight = Buffer.from(packVectorSamples({ xs, ys, angles, magnitudes }));
    const deviant = (await engineer.post('/api/sessions').field('session', JSON.stringify(session)).attach('samples', eight, 'samples.bin').expect(201)).body.id;
    const explained = (await engineer.post(`/api/sessions/${deviant}/explanation`).expect(201)).body;
    expectContract(contract.explanationReply, explained);
    expect(explained.explanation.mode).toBe('vectoring');
    expect(explained.applicableConfig).toEqual({ ...vectorConfig, iterations: 8 });
    expectContract(contract.explanationReply, (await reviewer.get(`/api/sessions/${deviant}/explanation`).expect(200)).body);
    const decided = (await engineer.post(`/api/sessions/${deviant}/explanation/decision`).send({ decision: 'keep' }).expect(200)).body;
    expectContract(contract.explanationDecisionReply, decided);
  });

  it('people: sign-in, users, invitations, tokens; admin lists; health', async () => {
    const visitor = await t.visitor();
    expectContract(contract.csrfReply, (await visitor.get('/api/auth/csrf').expect(200)).body);
    const nobody = (await visitor.get('/api/auth/current').expect(200)).body;
    expectContract(contract.currentReply, nobody);
    expect(nobody.user).toBeNull();
    const signedIn = (await visitor.post('/api/auth/login').send({ email: t.users.reviewer.email, password: 'test-password-1' }).expect(200)).body;
    expectContract(contract.loginReply, signedIn);
    visitor.set('x-csrf-token', signedIn.csrfToken);
    const current = (await visitor.get('/api/auth/current').expect(200)).body;
    expectContract(contract.currentReply, current);
    expect(current.user.id).toBe(t.users.reviewer.id);
    // Sign-out answers 204 with no body at all (the client reads nothing from it).
    expect((await visitor.post('/api/auth/logout').expect(204)).text).toBe('');
    expectContract(contract.meReply, (await reviewer.get('/api/auth/me').expect(200)).body);
    expectContract(contract.userListReply, (await admin.get('/api/users').expect(200)).body);
    expectContract(contract.userReply, (await admin.patch(`/api/users/${t.users.reviewer.id}`).send({ name: 'Test reviewer 2' }).expect(200)).body);
    expectContract(contract.invitationReply, (await admin.post('/api/invitations').send({ email: 'new@lab.test', role: 'reviewer' }).expect(201)).body);
    expectContract(contract.invitationListReply, (await admin.get('/api/invitations').expect(200)).body);
    const mail = (await admin.get('/api/outbox').expect(200)).body.messages.find((m: { to: string }) => m.to.includes('new@lab.test'));
    const token = /\/invite\/(\S+)/.exec(mail.text)?.[1];
    expectContract(contract.userReply, (await (await t.visitor()).post('/api/invitations/accept').send({ token, name: 'New colleague', password: 'a-long-password' }).expect(201)).body);
    expectContract(contract.tokenCreatedReply, (await engineer.post('/api/tokens').send({ name: 'ci' }).expect(201)).body);
    expectContract(contract.tokenListReply, (await engineer.get('/api/tokens').expect(200)).body);
    expectContract(contract.auditListReply, (await admin.get('/api/audit').expect(200)).body);
    expectContract(contract.outboxListReply, (await admin.get('/api/outbox').expect(200)).body);
    expectContract(contract.healthReply, (await request(t.app).get('/api/health').expect(200)).body);
  });
});

describe('every error reply parses with the contract’s errorReply', () => {
  it('not found, invalid input, signed out, refused', async () => {
    const visitor = await t.visitor();
    const failures = [
      await reviewer.get('/api/sessions/999999').expect(404),
      await reviewer.get('/api/no-such-route').expect(404),
      await reviewer.get('/api/condition-grid?buildId=1&x=temperature_c&y=temperature_c').expect(400),
      await visitor.get('/api/cores').expect(401),
      await reviewer.post('/api/cores').send({ name: 'x', slug: 'x' }).expect(403),
    ];
    for (const res of failures) expectContract(contract.errorReply, res.body);
    // A bad request names the field at fault.
    expect(failures[2].body.error).toMatchObject({ code: 'invalid', message: expect.stringMatching(/^query\.y: x and y must be two different conditions/) });
  });
});

describe('reply(): the server checks its replies outside production', () => {
  const schema = z.object({ session: z.object({ id: z.number(), startedAt: contract.isoDate }) });
  /** A one-route app replying with `value` through `schema`, with the check on or off. */
  const appReplying = (value: unknown, check: boolean) => {
    const app = express();
    app.set(CHECK_REPLIES, check);
    app.get('/thing', (_req, res) => reply(res, schema, value as z.input<typeof schema>));
    app.use(errorHandler(() => {}));
    return app;
  };

  it('sends a reply that matches, Date objects included', async () => {
    const res = await request(appReplying({ session: { id: 3, startedAt: new Date('2026-03-01T09:00:00Z') } }, true)).get('/thing').expect(200);
    expect(res.body).toEqual({ session: { id: 3, startedAt: '2026-03-01T09:00:00.000Z' } });
  });

  it('fails a reply missing a field with a 500 naming it', async () => {
    const res = await request(appReplying({ session: { id: 3, started: '2026-03-01T09:00:00Z' } }, true)).get('/thing').expect(500);
    expect(res.body.error.code).toBe('reply_contract');
    expect(res.body.error.message).toMatch(/^The reply to GET \/thing does not match its contract: session\.startedAt: /);
  });

  it('sends it unchecked in production', async () => {
    const res = await request(appReplying({ session: { id: 3, started: 'x' } }, false)).get('/thing').expect(200);
    expect(res.body).toEqual({ session: { id: 3, started: 'x' } });
  });
});
