// A sign-in outlives a restart of the server: the cookie's session is kept in the database (the
// web_sessions table), not in the process. Runs on SQLite and, in `npm run test:pg`, PostgreSQL.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { tempDatabase } from '../support/temp-db';
import { modelSamples, sessionForm, sessionPart, signInOverHttp } from './support/http-session';
import { startServerProcess, type ServerProcess } from './support/server-process';

const tmp = await tempDatabase();
let server: ServerProcess | null = null;

beforeAll(async () => {
  server = await startServerProcess(tmp);
});
afterAll(async () => {
  await server?.stop();
  await tmp.cleanup();
});

describe(`a sign-in across a server restart (${tmp.dialect})`, () => {
  it('keeps working after a clean stop and after SIGKILL, for reads and writes', async () => {
    const engineer = await signInOverHttp(server!.url, 'engineer@anglebench.test', 'anglebench');
    const first = ((await (await engineer.fetch('/api/sessions?pageSize=1')).json()) as { items: Array<{ coreId: number; buildId: number | null; boardId: number | null }> }).items[0];
    const ids = { coreId: first.coreId, buildId: first.buildId, boardId: first.boardId };

    for (const restart of ['stop', 'kill'] as const) {
      await server![restart]();
      server = await startServerProcess(tmp);
      // The same cookie and CSRF token, sent to the new process (on a new port).
      const again = (path: string, init: RequestInit = {}) =>
        fetch(`${server!.url}${path}`, { ...init, headers: { ...(init.headers as Record<string, string>), cookie: engineer.cookie, 'x-csrf-token': engineer.csrf } });
      const me = await again('/api/auth/me');
      expect(me.status).toBe(200);
      expect(((await me.json()) as { user: { email: string } }).user.email).toBe('engineer@anglebench.test');
      const upload = await again('/api/sessions', { method: 'POST', body: sessionForm(sessionPart(ids, `after ${restart}`), modelSamples(1024)) });
      expect(upload.status).toBe(201);
    }
    // And a cookie the server never issued is still refused.
    const stranger = await fetch(`${server!.url}/api/auth/me`, { headers: { cookie: 'anglebench.sid=s%3Anot-a-session.abc' } });
    expect(stranger.status).toBe(401);
  });
});
