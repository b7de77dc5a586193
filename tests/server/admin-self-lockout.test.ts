import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { User } from '../../server/db/models';
import { testApp, type Agent, type TestApp } from '../support/test-app';

let t: TestApp;
let admin: Agent;

beforeAll(async () => {
  t = await testApp();
  admin = await t.signInAs('admin');
});
afterAll(() => t.close());
// Every test starts from the team as created: one admin, one engineer, one enabled reviewer.
beforeEach(async () => {
  for (const role of ['admin', 'engineer', 'reviewer'] as const) await User.update({ role, disabled: false }, { where: { id: t.users[role].id } });
});

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
    await admin.patch(`/api/users/${t.users.engineer.id}`).send({ role: 'admin' }).expect(200);
    const second = await t.signIn(t.users.engineer.email);
    const res = await second.patch(`/api/users/${t.users.admin.id}`).send({ role: 'engineer' }).expect(200);
    expect(res.body.user.role).toBe('engineer');
  });
});
