import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testApp, type Agent, type TestApp } from '../support/test-app';

let t: TestApp;
let admin: Agent;

beforeAll(async () => {
  t = await testApp();
  admin = await t.signInAs('admin');
});
afterAll(() => t.close());

describe('an invitation may say who it is for', () => {
  it('keeps the name the admin gave and lists it with the pending invitations', async () => {
    const res = await admin.post('/api/invitations').send({ email: 'ada@lab.test', name: '  Ada Quill ', role: 'reviewer' }).expect(201);
    expect(res.body.invitation).toMatchObject({ email: 'ada@lab.test', name: 'Ada Quill', role: 'reviewer' });
    const list = await admin.get('/api/invitations').expect(200);
    expect(list.body.invitations.find((i: { email: string }) => i.email === 'ada@lab.test')?.name).toBe('Ada Quill');
    const audit = await admin.get('/api/audit').expect(200);
    expect(audit.body.entries[0]).toMatchObject({ action: 'create', entity: 'invitation', detail: { email: 'ada@lab.test', name: 'Ada Quill', role: 'reviewer' } });
  });

  it('leaves the name empty when none is given, or only spaces', async () => {
    const none = await admin.post('/api/invitations').send({ email: 'bo@lab.test', role: 'engineer' }).expect(201);
    expect(none.body.invitation.name).toBeNull();
    const blank = await admin.post('/api/invitations').send({ email: 'cy@lab.test', name: '   ', role: 'engineer' }).expect(201);
    expect(blank.body.invitation.name).toBeNull();
  });

  it('refuses a name over 120 characters, naming the field', async () => {
    const res = await admin.post('/api/invitations').send({ email: 'dee@lab.test', name: 'x'.repeat(121), role: 'engineer' }).expect(400);
    expect(res.body.error.message).toMatch(/^body\.name: /);
  });
});
