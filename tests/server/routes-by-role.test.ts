import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { benchFixtures } from '../support/fixtures';
import { testApp, type Agent, type TestApp } from '../support/test-app';

// Every route, asked by someone signed out and by each role. Where the guard lets a caller
// through, the request is made to fail just after it (an empty body → 400, a missing id → 404)
// so the table can be run in any order without changing what it reads.
type Row = [method: 'get' | 'post' | 'patch' | 'put' | 'delete', path: string, body: object | undefined, out: number, reviewer: number, engineer: number, admin: number];

const NONE = 999_999;
const table: Row[] = [
  ['get', '/api/health', undefined, 200, 200, 200, 200],
  ['get', '/api/auth/csrf', undefined, 200, 200, 200, 200],
  ['post', '/api/auth/login', {}, 400, 400, 400, 400],
  ['get', '/api/auth/me', undefined, 401, 200, 200, 200],
  ['get', '/api/auth/current', undefined, 200, 200, 200, 200],
  ['get', '/api/tokens', undefined, 401, 403, 200, 200],
  ['post', '/api/tokens', {}, 401, 403, 400, 400],
  ['delete', `/api/tokens/${NONE}`, undefined, 401, 403, 404, 404],
  ['get', '/api/users', undefined, 401, 403, 403, 200],
  ['get', '/api/users/:reviewer', undefined, 401, 200, 403, 200],
  ['patch', '/api/users/:reviewer', {}, 401, 403, 403, 400],
  ['get', '/api/invitations', undefined, 401, 403, 403, 200],
  ['post', '/api/invitations', {}, 401, 403, 403, 400],
  ['post', '/api/invitations/accept', {}, 400, 400, 400, 400],
  ['get', '/api/cores', undefined, 401, 200, 200, 200],
  ['post', '/api/cores', {}, 401, 403, 400, 400],
  ['get', '/api/cores/:core', undefined, 401, 200, 200, 200],
  ['patch', '/api/cores/:core', { colour: 'red' }, 401, 403, 400, 400],
  ['delete', `/api/cores/${NONE}`, undefined, 401, 403, 403, 404],
  ['get', '/api/cores/:core/golden-vectors', undefined, 401, 200, 200, 200],
  ['post', '/api/cores/:core/golden-vectors', {}, 401, 403, 400, 400],
  ['delete', `/api/cores/:core/golden-vectors/${NONE}`, undefined, 401, 403, 404, 404],
  ['put', '/api/cores/:core/watch', undefined, 401, 204, 204, 204],
  ['delete', '/api/cores/:core/watch', undefined, 401, 204, 204, 204],
  ['get', '/api/builds', undefined, 401, 200, 200, 200],
  ['post', '/api/builds', {}, 401, 403, 400, 400],
  ['get', '/api/builds/:build', undefined, 401, 200, 200, 200],
  ['patch', '/api/builds/:build', { colour: 'red' }, 401, 403, 400, 400],
  ['delete', `/api/builds/${NONE}`, undefined, 401, 403, 403, 404],
  ['post', '/api/builds/:build/file', undefined, 401, 403, 400, 400],
  ['get', '/api/builds/:build/file', undefined, 401, 404, 404, 404],
  ['get', '/api/builds/:build/reviews', undefined, 401, 200, 200, 200],
  ['post', '/api/builds/:build/reviews', {}, 401, 400, 400, 400],
  ['post', '/api/builds/:build/request-review', undefined, 401, 403, 202, 202],
  ['get', '/api/boards', undefined, 401, 200, 200, 200],
  ['post', '/api/boards', {}, 401, 403, 400, 400],
  ['get', '/api/boards/:board', undefined, 401, 200, 200, 200],
  ['patch', '/api/boards/:board', { colour: 'red' }, 401, 403, 400, 400],
  ['delete', `/api/boards/${NONE}`, undefined, 401, 403, 403, 404],
  ['get', '/api/sessions', undefined, 401, 200, 200, 200],
  ['post', '/api/sessions', {}, 401, 403, 400, 400],
  ['post', '/api/sessions/import', {}, 401, 403, 400, 400],
  ['get', '/api/sessions/:session', undefined, 401, 200, 200, 200],
  ['get', `/api/sessions/${NONE}`, undefined, 401, 404, 404, 404],
  ['patch', '/api/sessions/:session', { colour: 'red' }, 401, 403, 400, 400],
  ['delete', `/api/sessions/${NONE}`, undefined, 401, 403, 404, 404],
  ['get', '/api/sessions/:session/samples', undefined, 401, 200, 200, 200],
  ['get', '/api/sessions/:session/archive', undefined, 401, 404, 404, 404],
  ['get', '/api/sessions/:session/export.csv', undefined, 401, 200, 200, 200],
  ['get', '/api/sessions/:session/comments', undefined, 401, 200, 200, 200],
  ['post', '/api/sessions/:session/comments', {}, 401, 400, 400, 400],
  ['get', '/api/sessions/:session/explanation', undefined, 401, 404, 404, 404],
  // The fixture session holds no samples: the search refuses it.
  ['post', '/api/sessions/:session/explanation', undefined, 401, 403, 400, 400],
  ['post', '/api/sessions/:session/explanation/decision', {}, 401, 403, 400, 400],
  ['delete', `/api/comments/${NONE}`, undefined, 401, 404, 404, 404],
  ['get', '/api/compare', undefined, 401, 400, 400, 400],
  ['get', `/api/compare?ids=:session,${NONE}`, undefined, 401, 404, 404, 404],
  ['get', '/api/audit', undefined, 401, 403, 403, 200],
  ['get', '/api/outbox', undefined, 401, 403, 403, 200],
];

let t: TestApp;
let agents: Record<'out' | 'reviewer' | 'engineer' | 'admin', Agent>;
let ids: Record<string, number>;

beforeAll(async () => {
  t = await testApp();
  const f = await benchFixtures(t.users.engineer);
  ids = { core: f.core.id, build: f.build.id, board: f.board.id, session: f.session.id, reviewer: t.users.reviewer.id };
  agents = { out: await t.visitor(), reviewer: await t.signInAs('reviewer'), engineer: await t.signInAs('engineer'), admin: await t.signInAs('admin') };
});
afterAll(() => t.close());

describe('every route answers each role with the status in the table', () => {
  it.each(table)('%s %s', async (method, template, body, ...expected) => {
    const path = template.replace(/:(\w+)/g, (_, name: string) => String(ids[name]));
    const who = ['out', 'reviewer', 'engineer', 'admin'] as const;
    const got: number[] = [];
    for (const role of who) {
      const req = agents[role][method](path);
      got.push((await (body === undefined ? req : req.send(body))).status);
    }
    expect(got).toEqual(expected);
  });
});
