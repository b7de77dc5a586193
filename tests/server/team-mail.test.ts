import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { benchFixtures } from '../support/fixtures';
import { testApp, type Agent, type TestApp } from '../support/test-app';

let t: TestApp;
let admin: Agent;
let buildId: number;

beforeAll(async () => {
  t = await testApp();
  buildId = (await benchFixtures(t.users.engineer)).build.id;
  admin = await t.signInAs('admin');
});
afterAll(() => t.close());

interface OutboxMessage { to: string; subject: string; text: string }
const outbox = async (): Promise<OutboxMessage[]> => (await admin.get('/api/outbox').expect(200)).body.messages;

describe('an invitation', () => {
  it('is mailed with a one-time link, accepted once, and the new account can sign in', async () => {
    const created = await admin.post('/api/invitations').send({ email: 'New.Colleague@lab.test', role: 'engineer' }).expect(201);
    expect(created.body.mailed).toBe(true);
    const mail = (await outbox()).find((m) => m.to.includes('new.colleague@lab.test'));
    expect(mail?.subject).toBe('You are invited to Anglebench');
    const token = /\/invite\/(\S+)/.exec(mail!.text)?.[1];
    expect(token).toBeDefined();

    const visitor = await t.visitor();
    const accepted = await visitor.post('/api/invitations/accept').send({ token, name: 'New Colleague', password: 'a-long-password' }).expect(201);
    expect(accepted.body.user).toMatchObject({ email: 'new.colleague@lab.test', role: 'engineer' });
    const again = await visitor.post('/api/invitations/accept').send({ token, name: 'Twice', password: 'a-long-password' }).expect(400);
    expect(again.body.error.code).toBe('bad_invitation');

    const me = await (await t.signIn('new.colleague@lab.test', 'a-long-password')).get('/api/auth/me').expect(200);
    expect(me.body.user.name).toBe('New Colleague');
  });

  it('is refused for an e-mail that already has an account', async () => {
    await admin.post('/api/invitations').send({ email: 'reviewer@lab.test', role: 'reviewer' }).expect(409);
  });
});

describe('reviews', () => {
  it('mail every reviewer when an engineer asks for one', async () => {
    const engineer = await t.signInAs('engineer');
    const res = await engineer.post(`/api/builds/${buildId}/request-review`).expect(202);
    expect(res.body).toEqual({ reviewers: 1, mailed: true });
    const mail = (await outbox()).find((m) => m.subject.startsWith('Review requested'));
    expect(mail?.to).toContain('reviewer@lab.test');
  });

  it("mail the build's author the decision, and the build's standing follows the newest review", async () => {
    const reviewer = await t.signInAs('reviewer');
    await reviewer.post(`/api/builds/${buildId}/reviews`).send({ decision: 'approve', note: 'Error within 1 LSB on every quadrant' }).expect(201);
    const mail = (await outbox()).find((m) => m.subject.endsWith('approved'));
    expect(mail?.to).toContain('engineer@lab.test');
    expect(mail?.text).toContain('Error within 1 LSB');
    const build = await reviewer.get(`/api/builds/${buildId}`).expect(200);
    expect(build.body.standing).toBe('approve');
  });
});

describe('the audit log', () => {
  it('records each change with who made it', async () => {
    // Its own invitation and review, so it reads the same in any order.
    await admin.post('/api/invitations').send({ email: 'audited.colleague@lab.test', role: 'engineer' }).expect(201);
    const token = /\/invite\/(\S+)/.exec((await outbox()).find((m) => m.to.includes('audited.colleague@lab.test'))!.text)![1];
    await (await t.visitor()).post('/api/invitations/accept').send({ token, name: 'Audited Colleague', password: 'a-long-password' }).expect(201);
    await (await t.signInAs('engineer')).post(`/api/builds/${buildId}/request-review`).expect(202);
    await (await t.signInAs('reviewer')).post(`/api/builds/${buildId}/reviews`).send({ decision: 'approve', note: 'Audited' }).expect(201);

    const res = await admin.get('/api/audit').expect(200);
    const entries = res.body.entries as Array<{ action: string; entity: string; userId: number }>;
    const by = (action: string, entity: string) => entries.find((e) => e.action === action && e.entity === entity)?.userId;
    expect(by('create', 'invitation')).toBe(t.users.admin.id);
    expect(by('accept', 'invitation')).toEqual(expect.any(Number));
    expect(by('request_review', 'build')).toBe(t.users.engineer.id);
    expect(by('approve', 'build')).toBe(t.users.reviewer.id);
  });
});
