import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testApp, type Agent, type TestApp } from '../support/test-app';

let t: TestApp;
let admin: Agent;

beforeAll(async () => {
  t = await testApp();
  admin = await t.signInAs('admin');
});
afterAll(() => t.close());

describe('an admin cannot lock themselves out', () => {
  it('refuses to disable their own account, even with another admin on the team', async () => {
    const other = await admin.patch(`/api/users/${t.users.engineer.id}`).send({ role: 'admin' }).expect(200);
    expect(other.body.user.role).toBe('admin');

    const res = await admin.patch(`/api/users/${t.users.admin.id}`).send({ disabled: true }).expect(409);
    expect(res.body.error.code).toBe('self_lockout');
    const me = await admin.get('/api/auth/me').expect(200);
    expect(me.body.user.disabled).toBe(false);
  });

  it('refuses to take away their own admin role', async () => {
    const res = await admin.patch(`/api/users/${t.users.admin.id}`).send({ role: 'engineer' }).expect(409);
    expect(res.body.error.code).toBe('self_lockout');
    expect((await admin.get('/api/auth/me').expect(200)).body.user.role).toBe('admin');
  });

  it('still lets them rename themselves, and change or disable someone else', async () => {
    const renamed = await admin.patch(`/api/users/${t.users.admin.id}`).send({ name: 'Lab admin', role: 'admin', disabled: false }).expect(200);
    expect(renamed.body.user.name).toBe('Lab admin');
    const disabled = await admin.patch(`/api/users/${t.users.reviewer.id}`).send({ disabled: true }).expect(200);
    expect(disabled.body.user.disabled).toBe(true);
  });

  it('lets another admin demote them', async () => {
    const second = await t.signIn(t.users.engineer.email); // made admin in the first test
    const res = await second.patch(`/api/users/${t.users.admin.id}`).send({ role: 'engineer' }).expect(200);
    expect(res.body.user.role).toBe('engineer');
  });
});
