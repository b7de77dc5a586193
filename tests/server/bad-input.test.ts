import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testApp, type TestApp } from '../support/test-app';

// What a mistyped address or query gets: 400 "invalid" naming the field, never a 500 and never a
// row it did not ask for. Ids are positive decimal integers; pages and page sizes have bounds;
// roles are reviewer, engineer or admin.
let t: TestApp;
beforeAll(async () => {
  t = await testApp();
});
afterAll(() => t.close());

const BAD_IDS = ['abc', '1.5', '-1', '0', '0x10', '1e1', '%20', 'Infinity', '99999999999999999999'];

describe('non-numeric and impossible ids in paths', () => {
  it.each([
    ['get', '/api/sessions/ID'],
    ['get', '/api/sessions/ID/samples'],
    ['get', '/api/sessions/ID/archive'],
    ['get', '/api/sessions/ID/export.csv'],
    ['get', '/api/sessions/ID/comments'],
    ['get', '/api/builds/ID'],
    ['get', '/api/cores/ID'],
    ['get', '/api/cores/ID/golden-vectors'],
    ['get', '/api/boards/ID'],
    ['get', '/api/users/ID'],
    ['delete', '/api/tokens/ID'],
    ['delete', '/api/comments/ID'],
  ] as const)('%s %s', async (method, path) => {
    const admin = await t.signInAs('admin');
    for (const bad of BAD_IDS) {
      const res = await admin[method](path.replace('ID', bad));
      expect({ bad, status: res.status, code: res.body.error?.code }).toEqual({ bad, status: 400, code: 'invalid' });
      expect(res.body.error.message).toMatch(/^params\.(id|sessionId): /);
    }
  });
});

describe('bad paging', () => {
  it.each([
    ['page=0', 'query.page'],
    ['page=-1', 'query.page'],
    ['page=abc', 'query.page'],
    ['page=1.5', 'query.page'],
    ['pageSize=0', 'query.pageSize'],
    ['pageSize=101', 'query.pageSize'],
    ['pageSize=ten', 'query.pageSize'],
    ['sort=size', 'query.sort'],
    ['passed=yes', 'query.passed'],
    ['from=yesterday', 'query.from'],
    ['colour=red', 'query'],
  ])('the sessions list refuses %s', async (query, field) => {
    const reviewer = await t.signInAs('reviewer');
    const res = await reviewer.get(`/api/sessions?${query}`).expect(400);
    expect(res.body.error.code).toBe('invalid');
    expect(res.body.error.message.startsWith(`${field}`)).toBe(true);
  });

  it.each(['/api/audit', '/api/outbox'])('%s refuses a limit or offset out of range or not a number', async (path) => {
    const admin = await t.signInAs('admin');
    for (const [query, field] of [
      ['limit=0', 'query.limit'],
      ['limit=501', 'query.limit'],
      ['limit=many', 'query.limit'],
      ['offset=-1', 'query.offset'],
      ['offset=1.5', 'query.offset'],
      ['page=2', 'query'],
    ]) {
      const res = await admin.get(`${path}?${query}`);
      expect({ query, status: res.status, code: res.body.error?.code }).toEqual({ query, status: 400, code: 'invalid' });
      expect(res.body.error.message.startsWith(field)).toBe(true);
    }
  });

  it('the ends of the ranges are accepted', async () => {
    const admin = await t.signInAs('admin');
    await admin.get('/api/sessions?page=1&pageSize=100').expect(200);
    await admin.get('/api/sessions?page=1000&pageSize=1').expect(200);
    await admin.get('/api/audit?limit=500&offset=0').expect(200);
    await admin.get('/api/audit?limit=1&offset=100000').expect(200);
  });
});

describe('a bad role', () => {
  it.each(['boss', 'Admin', '', 'engineer ', 'root'])('%j is refused when changing a user and when inviting one', async (role) => {
    const admin = await t.signInAs('admin');
    const patch = await admin.patch(`/api/users/${t.users.reviewer.id}`).send({ role }).expect(400);
    expect(patch.body.error.message).toMatch(/^body\.role: /);
    const invite = await admin.post('/api/invitations').send({ email: 'new.person@lab.test', role }).expect(400);
    expect(invite.body.error.message).toMatch(/^body\.role: /);
  });

  it('a role that is not a string, or missing from an invitation, is refused too', async () => {
    const admin = await t.signInAs('admin');
    await admin.patch(`/api/users/${t.users.reviewer.id}`).send({ role: 2 }).expect(400);
    await admin.patch(`/api/users/${t.users.reviewer.id}`).send({ role: ['admin'] }).expect(400);
    const invite = await admin.post('/api/invitations').send({ email: 'new.person@lab.test' }).expect(400);
    expect(invite.body.error.message).toMatch(/^body\.role: /);
    // Nothing changed: the reviewer is still a reviewer.
    expect((await admin.get(`/api/users/${t.users.reviewer.id}`).expect(200)).body.user.role).toBe('reviewer');
  });
});
