// Security checks of the team server beyond the route × role table (tests/server/routes-by-role):
// session fixation, CSRF, the sign-in rate limit, hostile uploads, markup in text fields and
// path traversal in uploaded file names.
import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BenchSession, Comment } from '../../server/db/models';
import { benchFixtures } from '../support/fixtures';
import { testApp, TEST_PASSWORD, type Agent, type TestApp } from '../support/test-app';
import { modelSamples, sessionPart } from './support/http-session';

const UPLOAD_LIMIT = 64 * 1024;
let t: TestApp;
let engineer: Agent;
let ids: { coreId: number; buildId: number; boardId: number };
let sessionId: number;

beforeAll(async () => {
  t = await testApp({ uploadLimitBytes: UPLOAD_LIMIT });
  const f = await benchFixtures(t.users.engineer);
  ids = { coreId: f.core.id, buildId: f.build.id, boardId: f.board.id };
  sessionId = f.session.id;
  engineer = await t.signInAs('engineer');
});
afterAll(() => t?.close());

const sidOf = (res: request.Response) =>
  ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('anglebench.sid='))?.split(';')[0];

describe('sign-in', () => {
  it('gives a new session id at sign-in; the id held before it signs nobody in', async () => {
    const visitor = request.agent(t.app);
    const csrf = await visitor.get('/api/auth/csrf').expect(200);
    const planted = sidOf(csrf)!;
    expect(planted).toBeDefined();
    const login = await visitor.post('/api/auth/login').set('x-csrf-token', csrf.body.token).send({ email: t.users.engineer.email, password: TEST_PASSWORD }).expect(200);
    const issued = sidOf(login)!;
    expect(issued).toBeDefined();
    expect(issued).not.toBe(planted);
    await request(t.app).get('/api/auth/me').set('cookie', planted).expect(401);
    await request(t.app).get('/api/auth/me').set('cookie', issued).expect(200);
  });
});

describe('CSRF', () => {
  const comment = (agent: Agent, token?: string) => {
    const req = agent.post(`/api/sessions/${sessionId}/comments`);
    if (token !== undefined) req.set('x-csrf-token', token);
    return req.send({ body: 'looks fine' });
  };

  it('refuses a write without the token, with an empty one and with another session’s, and takes it with its own', async () => {
    const before = await Comment.count();
    // A signed-in cookie alone, as a forged cross-site form would send it.
    const bare = request.agent(t.app);
    const login = await (await t.visitor()).post('/api/auth/login').send({ email: t.users.reviewer.email, password: TEST_PASSWORD }).expect(200);
    bare.set('cookie', sidOf(login)!);
    expect((await comment(bare)).status).toBe(403);
    expect((await comment(bare, '')).status).toBe(403);
    const other = await t.signInAs('reviewer');
    const othersToken = (await other.get('/api/auth/csrf')).body.token as string;
    const refused = await comment(bare, othersToken);
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe('csrf');
    expect(await Comment.count()).toBe(before);
    expect((await comment(bare, login.body.csrfToken)).status).toBe(201);
    expect(await Comment.count()).toBe(before + 1);
  });
});

describe('uploads', () => {
  const upload = (samples: Buffer | string, part = sessionPart(ids), name = 'samples.bin') =>
    engineer.post('/api/sessions').field('session', part).attach('samples', Buffer.from(samples), name);

  it('refuses session samples over UPLOAD_LIMIT_BYTES with 413 and stores nothing', async () => {
    const before = await BenchSession.count();
    const res = await upload(Buffer.alloc(UPLOAD_LIMIT + 1));
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_large');
    expect(await BenchSession.count()).toBe(before);
  });

  it('refuses samples that are not the packed sample format, a session part that is not JSON, and a JSON body, each with 400', async () => {
    const before = await BenchSession.count();
    const wrongType = [
      await upload('angle,cos,sin\n1,2,3\n', sessionPart(ids), 'samples.csv'),
      await upload(Buffer.from([1, 2, 3, 4, 5, 6, 7])),
      await upload(Buffer.from(modelSamples(16)), '<session/>'),
      await engineer.post('/api/sessions').send({ session: sessionPart(ids) }),
    ];
    expect(wrongType.map((r) => [r.status, typeof r.body.error?.message])).toEqual(new Array(4).fill([400, 'string']));
    expect(await BenchSession.count()).toBe(before);
  });

  it('refuses a bitstream over the limit with 413 and one sent in the wrong field or as JSON with 400', async () => {
    const url = `/api/builds/${ids.buildId}/file`;
    expect((await engineer.post(url).attach('file', Buffer.alloc(UPLOAD_LIMIT + 1), 'big.bit')).status).toBe(413);
    expect((await engineer.post(url).attach('bitstream', Buffer.alloc(10), 'a.bit')).status).toBe(400);
    expect((await engineer.post(url).send({ file: 'AAAA' })).status).toBe(400);
    expect(fs.readdirSync(t.uploadDir).filter((f) => f.startsWith('.incoming-'))).toEqual([]);
  });

  it.each([
    ['../../etc/passwd', 'passwd'],
    ['..\\..\\windows\\win.ini', 'win.ini'],
    ['/abs/path/.htaccess', 'htaccess'],
    ['bit"stream\r\nX-Injected: 1.bit', 'bit_stream__X-Injected_ 1.bit'],
    ['....', 'bitstream.bin'],
  ])('stores a bitstream sent as %j under its own id, named %j, and sends that name back safely', async (sent, stored) => {
    const res = await engineer.post(`/api/builds/${ids.buildId}/file`).attach('file', Buffer.from('bits'), sent).expect(200);
    expect(res.body.build.fileName).toBe(stored);
    expect(fs.readdirSync(t.uploadDir)).toEqual([`build-${ids.buildId}.bit`]);
    expect(fs.existsSync(path.join(t.uploadDir, '..', 'etc'))).toBe(false);
    const download = await engineer.get(`/api/builds/${ids.buildId}/file`).expect(200);
    expect(download.headers['content-disposition']).toContain(stored);
    expect(download.headers['x-injected']).toBeUndefined();
  });
});

describe('markup in text fields', () => {
  const markup = `<script>alert("x")</script><img src=x onerror="alert(1)"> & <b>bold</b> ' "`;

  it('keeps session notes and comments verbatim as JSON text, under a script-src self policy', async () => {
    const up = await engineer.post('/api/sessions').field('session', sessionPart(ids, markup)).attach('samples', Buffer.from(modelSamples(64)), 'samples.bin').expect(201);
    const got = await engineer.get(`/api/sessions/${up.body.id}`).expect(200);
    expect(got.body.session.notes).toBe(markup);
    expect(got.headers['content-type']).toMatch(/^application\/json/);
    expect(got.headers['x-content-type-options']).toBe('nosniff');
    expect(got.headers['content-security-policy']).toContain("script-src 'self'");

    await engineer.post(`/api/sessions/${up.body.id}/comments`).send({ body: markup }).expect(201);
    const thread = await engineer.get(`/api/sessions/${up.body.id}/comments`).expect(200);
    const bodies = (Array.isArray(thread.body) ? thread.body : (thread.body.items ?? thread.body.comments)) as Array<{ body: string }>;
    expect(bodies.map((c) => c.body)).toContain(markup);
    expect((await Comment.findOne({ where: { sessionId: up.body.id } }))!.body).toBe(markup);
  });
});

// Last in the file: once it has run, this address may not sign in again for 15 minutes.
describe('the sign-in rate limit', () => {
  it('answers 429 after the 10 failed sign-ins createApp allows by default, then even to the right password; successes do not count', async () => {
    const attempt = async (password: string) => (await (await t.visitor()).post('/api/auth/login').send({ email: t.users.reviewer.email, password })).status;
    // The test app keeps createApp's default limit: 10 failures per address in 15 minutes.
    for (let i = 0; i < 12; i++) expect(await attempt(TEST_PASSWORD)).toBe(200);
    const statuses: number[] = [];
    for (let i = 0; i < 12; i++) statuses.push(await attempt('wrong-password'));
    expect(statuses).toEqual([...new Array<number>(10).fill(401), 429, 429]);
    const right = await (await t.visitor()).post('/api/auth/login').send({ email: t.users.reviewer.email, password: TEST_PASSWORD });
    expect(right.status).toBe(429);
    expect(right.body.error.code).toBe('too_many_attempts');
  });
});
