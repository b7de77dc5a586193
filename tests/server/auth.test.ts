import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sha256Hex } from '../../server/auth/tokens';
import { ApiToken, User } from '../../server/db/models';
import { testApp, TEST_PASSWORD, type TestApp } from '../support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await testApp();
});
afterAll(() => t.close());

const sessionCookie = (res: request.Response) =>
  ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('anglebench.sid='))?.split(';')[0];

describe('signing in', () => {
  it('answers who I am once signed in, and 401 before', async () => {
    const visitor = await t.visitor();
    await visitor.get('/api/auth/me').expect(401);
    const agent = await t.signInAs('engineer');
    const res = await agent.get('/api/auth/me').expect(200);
    expect(res.body.user).toMatchObject({ email: 'engineer@lab.test', role: 'engineer' });
    expect(res.body.user.passwordHash).toBeUndefined();
  });

  it('gives a new session id at sign-in, so a planted id is worthless', async () => {
    const agent = request.agent(t.app);
    const before = await agent.get('/api/auth/csrf').expect(200);
    const login = await agent.post('/api/auth/login').set('x-csrf-token', before.body.token).send({ email: 'reviewer@lab.test', password: TEST_PASSWORD }).expect(200);
    expect(sessionCookie(before)).toBeDefined();
    expect(sessionCookie(login)).toBeDefined();
    expect(sessionCookie(login)).not.toBe(sessionCookie(before));
  });

  it('sets an httpOnly, SameSite=Lax cookie that is not marked secure on plain http', async () => {
    const res = await request(t.app).get('/api/auth/csrf').expect(200);
    const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).join(';');
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i);
  });

  it('refuses a wrong password with 401 and a disabled account with 403', async () => {
    const visitor = await t.visitor();
    await visitor.post('/api/auth/login').send({ email: 'admin@lab.test', password: 'wrong-password' }).expect(401);
    const disabled = await User.create({ email: 'gone@lab.test', name: 'Gone', role: 'engineer', passwordHash: t.users.engineer.passwordHash, disabled: true });
    const res = await visitor.post('/api/auth/login').send({ email: disabled.email, password: TEST_PASSWORD }).expect(403);
    expect(res.body.error.code).toBe('disabled');
  });

  it('signs a user out of a session at once when an admin disables the account', async () => {
    const victim = await User.create({ email: 'soon-off@lab.test', name: 'Soon off', role: 'reviewer', passwordHash: t.users.reviewer.passwordHash });
    const agent = await t.signIn(victim.email);
    await agent.get('/api/auth/me').expect(200);
    const admin = await t.signInAs('admin');
    await admin.patch(`/api/users/${victim.id}`).send({ disabled: true }).expect(200);
    await agent.get('/api/auth/me').expect(401);
  });

  it('ends the session at sign-out', async () => {
    const agent = await t.signInAs('reviewer');
    await agent.post('/api/auth/logout').expect(204);
    await agent.get('/api/auth/me').expect(401);
  });
});

describe('the CSRF guard', () => {
  it('refuses a state-changing request without the token and accepts it with the token', async () => {
    const agent = await t.signInAs('engineer');
    const token = (await agent.get('/api/auth/csrf').expect(200)).body.token as string;
    // The same cookie without the header is what a forged cross-site form post looks like.
    const refused = await agent.post('/api/boards').set('x-csrf-token', '').send({ name: 'B', serial: 's', fpgaPart: 'p', adapter: 'a', location: 'l' }).expect(403);
    expect(refused.body.error.code).toBe('csrf');
    await agent.post('/api/boards').set('x-csrf-token', 'not-the-token').send({ name: 'B', serial: 's', fpgaPart: 'p', adapter: 'a', location: 'l' }).expect(403);
    await agent.post('/api/boards').set('x-csrf-token', token).send({ name: 'B', serial: 's', fpgaPart: 'p', adapter: 'a', location: 'l' }).expect(201);
    // Signing in is guarded too, so a forged form cannot sign a victim into another account.
    await request(t.app).post('/api/auth/login').send({ email: 'engineer@lab.test', password: TEST_PASSWORD }).expect(403);
  });
});

describe('API tokens', () => {
  it('are shown once, stored as their SHA-256, work as Bearer without CSRF and stamp lastUsedAt', async () => {
    const agent = await t.signInAs('engineer');
    const created = await agent.post('/api/tokens').send({ name: 'ci runner' }).expect(201);
    const secret = created.body.token as string;
    const row = await ApiToken.findByPk(created.body.id);
    expect(row!.tokenHash).toBe(sha256Hex(secret));
    expect(row!.lastUsedAt).toBeNull();
    const listed = await agent.get('/api/tokens').expect(200);
    expect(JSON.stringify(listed.body)).not.toContain(secret);

    const bearer = { authorization: `Bearer ${secret}` };
    const me = await request(t.app).get('/api/auth/me').set(bearer).expect(200);
    expect(me.body).toMatchObject({ user: { email: 'engineer@lab.test' }, via: 'token' });
    await request(t.app).post('/api/boards').set(bearer).send({ name: 'Token board', serial: 's', fpgaPart: 'p', adapter: 'a', location: 'l' }).expect(201);
    expect((await ApiToken.findByPk(created.body.id))!.lastUsedAt).not.toBeNull();

    await agent.delete(`/api/tokens/${created.body.id}`).expect(204);
    await request(t.app).get('/api/auth/me').set(bearer).expect(401);
  });

  it('refuses an unknown token with 401', async () => {
    await request(t.app).get('/api/cores').set('authorization', 'Bearer ab_nonsense').expect(401);
  });
});
