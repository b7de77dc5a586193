import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { User } from '../../server/db/models';
import { testApp, type TestApp } from '../support/test-app';

// GET /api/auth/current: the browser's "who is signed in?" at every page load. Nobody is an
// answer (200, null), not an error; GET /api/auth/me keeps its 401 (auth.test.ts).
let t: TestApp;
beforeAll(async () => {
  t = await testApp();
});
afterAll(() => t.close());

describe('who is signed in', () => {
  it('is null, with status 200, for a visitor with no session, and for a made-up session cookie', async () => {
    const visitor = await t.visitor();
    expect((await visitor.get('/api/auth/current').expect(200)).body).toEqual({ user: null });
    const planted = await request(t.app).get('/api/auth/current').set('cookie', 'anglebench.sid=s%3Anot-a-session.bad').expect(200);
    expect(planted.body).toEqual({ user: null });
  });

  it('is the signed-in user, without the password hash, then null again after sign-out', async () => {
    const agent = await t.signInAs('engineer');
    const res = await agent.get('/api/auth/current').expect(200);
    expect(res.body.user).toMatchObject({ email: 'engineer@lab.test', role: 'engineer', disabled: false });
    expect(res.body.user.passwordHash).toBeUndefined();
    await agent.post('/api/auth/logout').expect(204);
    expect((await agent.get('/api/auth/current').expect(200)).body).toEqual({ user: null });
  });

  it('is null at once when an admin disables the account', async () => {
    const victim = await User.create({ email: 'switched-off@lab.test', name: 'Switched off', role: 'reviewer', passwordHash: t.users.reviewer.passwordHash });
    const agent = await t.signIn(victim.email);
    expect((await agent.get('/api/auth/current').expect(200)).body.user.email).toBe('switched-off@lab.test');
    const admin = await t.signInAs('admin');
    await admin.patch(`/api/users/${victim.id}`).send({ disabled: true }).expect(200);
    expect((await agent.get('/api/auth/current').expect(200)).body).toEqual({ user: null });
  });
});
