import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { benchFixtures } from '../support/fixtures';
import { testApp, type Agent, type TestApp } from '../support/test-app';

let t: TestApp;
let coreId: number;
let reviewer: Agent;
let engineer: Agent;

beforeAll(async () => {
  t = await testApp();
  coreId = (await benchFixtures(t.users.engineer)).core.id;
  reviewer = await t.signInAs('reviewer');
  engineer = await t.signInAs('engineer');
});
afterAll(() => t.close());
// Each test starts from nobody watching, so none depends on another having run first.
beforeEach(async () => {
  await reviewer.delete(`/api/cores/${coreId}/watch`).expect(204);
  await engineer.delete(`/api/cores/${coreId}/watch`).expect(204);
});

describe('GET /api/cores/:id lists who watches the core', () => {
  it('starts with nobody watching', async () => {
    const res = await reviewer.get(`/api/cores/${coreId}`).expect(200);
    expect(res.body.core.id).toBe(coreId);
    expect(res.body.watchers).toEqual([]);
    expect(res.body.watching).toBe(false);
  });

  it('shows a watcher by id and name, and tells each caller whether they are one', async () => {
    await reviewer.put(`/api/cores/${coreId}/watch`).expect(204);
    const mine = await reviewer.get(`/api/cores/${coreId}`).expect(200);
    expect(mine.body.watchers).toEqual([{ id: t.users.reviewer.id, name: 'Test reviewer' }]);
    expect(mine.body.watching).toBe(true);

    const theirs = await engineer.get(`/api/cores/${coreId}`).expect(200);
    expect(theirs.body.watchers).toEqual([{ id: t.users.reviewer.id, name: 'Test reviewer' }]);
    expect(theirs.body.watching).toBe(false);
  });

  it('lists every watcher by name, and drops one who stops watching', async () => {
    await reviewer.put(`/api/cores/${coreId}/watch`).expect(204);
    await engineer.put(`/api/cores/${coreId}/watch`).expect(204);
    await engineer.put(`/api/cores/${coreId}/watch`).expect(204); // twice is still once
    const both = await engineer.get(`/api/cores/${coreId}`).expect(200);
    expect(both.body.watchers.map((w: { name: string }) => w.name)).toEqual(['Test engineer', 'Test reviewer']);
    expect(both.body.watching).toBe(true);

    await reviewer.delete(`/api/cores/${coreId}/watch`).expect(204);
    const after = await reviewer.get(`/api/cores/${coreId}`).expect(200);
    expect(after.body.watchers).toEqual([{ id: t.users.engineer.id, name: 'Test engineer' }]);
    expect(after.body.watching).toBe(false);
  });

  it('never shows a watcher’s e-mail or password hash', async () => {
    await reviewer.put(`/api/cores/${coreId}/watch`).expect(204);
    await engineer.put(`/api/cores/${coreId}/watch`).expect(204);
    const res = await reviewer.get(`/api/cores/${coreId}`).expect(200);
    expect(res.body.watchers).toHaveLength(2);
    for (const w of res.body.watchers) expect(Object.keys(w).sort()).toEqual(['id', 'name']);
  });
});
