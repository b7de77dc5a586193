// Two server processes on one PostgreSQL database behave as one server: a sign-in made on one
// works on the other, uploads through both at once lose nothing, the failed sign-in limit is
// shared, and SIGKILL of one in the middle of an upload stores nothing half-way while the other
// goes on. Two servers on one SQLite file is not a supported set-up, so this runs in the
// PostgreSQL pass (`npm run test:pg`) only.
import { request } from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { tempDatabase } from '../support/temp-db';
import { modelSamples, sessionForm, sessionPart, signInOverHttp, type HttpSession } from './support/http-session';
import { startServerProcess, type ServerProcess } from './support/server-process';

const tmp = await tempDatabase();
const onPostgres = tmp.dialect === 'postgres';
let a: ServerProcess | null = null;
let b: ServerProcess | null = null;
let ids: { coreId: number; buildId: number | null; boardId: number | null };

beforeAll(async () => {
  if (!onPostgres) return;
  // Started together on an empty database: only one may migrate and seed it.
  [a, b] = await Promise.all([startServerProcess(tmp), startServerProcess(tmp)]);
});
afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()]);
  await tmp.cleanup();
});

const ENGINEER = 'engineer@anglebench.test';
const DEMO_PASSWORD = 'anglebench';

/** The same cookie and CSRF token, sent to another server. */
const sameSessionOn = (s: HttpSession, baseUrl: string): HttpSession => ({
  ...s,
  fetch: (path, init = {}) => fetch(`${baseUrl}${path}`, { ...init, headers: { ...(init.headers as Record<string, string>), cookie: s.cookie, 'x-csrf-token': s.csrf } }),
});

const total = async (s: HttpSession) => ((await (await s.fetch('/api/sessions?pageSize=1')).json()) as { total: number }).total;

describe.runIf(onPostgres)('two server instances on one PostgreSQL database', () => {
  it('started at once, seed the demo once', async () => {
    const admin = await signInOverHttp(a!.url, 'admin@anglebench.test', DEMO_PASSWORD);
    const { users } = (await (await admin.fetch('/api/users')).json()) as { users: Array<{ email: string }> };
    expect(users.map((u) => u.email).sort()).toEqual(['admin@anglebench.test', 'engineer@anglebench.test', 'reviewer@anglebench.test']);
    const list = (await (await admin.fetch('/api/sessions?pageSize=1')).json()) as { items: Array<{ coreId: number; buildId: number | null; boardId: number | null }> };
    ids = { coreId: list.items[0].coreId, buildId: list.items[0].buildId, boardId: list.items[0].boardId };
  });

  it('take a sign-in made on A on B, for reads and writes, and a sign-out on B ends it on A', async () => {
    const onA = await signInOverHttp(a!.url, ENGINEER, DEMO_PASSWORD);
    const onB = sameSessionOn(onA, b!.url);
    const me = await onB.fetch('/api/auth/me');
    expect(me.status).toBe(200);
    expect(((await me.json()) as { user: { email: string } }).user.email).toBe(ENGINEER);
    const written = await onB.fetch('/api/sessions', { method: 'POST', body: sessionForm(sessionPart(ids, 'written on B with A’s cookie'), modelSamples(1024)) });
    expect(written.status).toBe(201);
    const { id } = (await written.json()) as { id: number };
    expect((await onA.fetch(`/api/sessions/${id}`)).status).toBe(200);

    expect((await onB.fetch('/api/auth/logout', { method: 'POST' })).status).toBe(204);
    expect((await onA.fetch('/api/auth/me')).status).toBe(401);
  });

  it('take 20 concurrent uploads split across both while 200 list reads run: no error, each session stored once, samples byte-identical', async () => {
    const onA = await signInOverHttp(a!.url, ENGINEER, DEMO_PASSWORD);
    const onB = sameSessionOn(onA, b!.url);
    const before = await total(onA);
    // A different sample count per upload, so a mix-up between sessions cannot go unseen.
    const uploads = Array.from({ length: 20 }, (_, i) => ({ notes: `two-instance upload ${i}`, samples: modelSamples(2048 + 64 * i), via: i % 2 ? onB : onA }));
    const [answers, reads] = await Promise.all([
      Promise.all(
        uploads.map(async (u) => {
          const res = await u.via.fetch('/api/sessions', { method: 'POST', body: sessionForm(sessionPart(ids, u.notes), u.samples) });
          return { status: res.status, id: res.status === 201 ? ((await res.json()) as { id: number }).id : undefined };
        }),
      ),
      Promise.all(Array.from({ length: 200 }, (_, i) => (i % 2 ? onB : onA).fetch('/api/sessions?pageSize=25').then((r) => r.status))),
    ]);
    expect(answers.map((r) => r.status)).toEqual(Array(20).fill(201));
    expect(reads.filter((s) => s !== 200)).toEqual([]);
    expect(await total(onB)).toBe(before + 20);

    const list = (await (await onA.fetch('/api/sessions?pageSize=100')).json()) as { items: Array<{ id: number; notes: string }> };
    for (const [i, u] of uploads.entries()) {
      expect(list.items.filter((s) => s.notes === u.notes).map((s) => s.id)).toEqual([answers[i].id]);
      const stored = Buffer.from(await (await (i % 2 ? onA : onB).fetch(`/api/sessions/${answers[i].id}/samples`)).arrayBuffer());
      expect(stored.equals(Buffer.from(u.samples))).toBe(true);
    }
  });

  it('when A is killed in the middle of an upload, store nothing of it, and B goes on', async () => {
    const onA = await signInOverHttp(a!.url, ENGINEER, DEMO_PASSWORD);
    const onB = sameSessionOn(onA, b!.url);
    const before = await total(onB);
    const ended = partialUpload(a!.url, onA, sessionPart(ids, 'cut off on A'), 32, 6);
    // A has taken some of the body (the request is under way) when it dies.
    await ended.written;
    await a!.kill();
    expect(await ended.outcome).toMatch(/^error: /);

    expect(await total(onB)).toBe(before);
    const list = (await (await onB.fetch('/api/sessions?pageSize=100')).json()) as { items: Array<{ notes: string }> };
    expect(list.items.some((s) => s.notes === 'cut off on A')).toBe(false);
    const next = await onB.fetch('/api/sessions', { method: 'POST', body: sessionForm(sessionPart(ids, 'after A died'), modelSamples(1024)) });
    expect(next.status).toBe(201);
    expect(await total(onB)).toBe(before + 1);

    a = await startServerProcess(tmp);
    expect(await total(sameSessionOn(onA, a.url))).toBe(before + 1);
  });

  it('share the failed sign-in limit: eleven failures spread over both hit it on both', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 11; i++) statuses.push(await failedSignIn(i % 2 ? b!.url : a!.url));
    // createApp's default: 10 failed sign-ins per address in 15 minutes.
    expect(statuses.slice(0, 10)).toEqual(Array(10).fill(401));
    expect(statuses[10]).toBe(429);
    expect(await failedSignIn(a!.url)).toBe(429);
    expect(await failedSignIn(b!.url)).toBe(429);
  });
});

async function failedSignIn(baseUrl: string): Promise<number> {
  const first = await fetch(`${baseUrl}/api/auth/csrf`);
  const cookie = first.headers.getSetCookie().find((c) => c.startsWith('anglebench.sid='))?.split(';')[0] ?? '';
  const { token } = (await first.json()) as { token: string };
  const res = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-csrf-token': token, cookie },
    body: JSON.stringify({ email: ENGINEER, password: 'not-the-password' }),
  });
  await res.arrayBuffer();
  return res.status;
}

const BOUNDARY = 'two-instances-boundary-41c2';

/** A session upload that announces `fileMiB` MiB of samples and sends `sentMiB`, never finishing. */
function partialUpload(baseUrl: string, s: HttpSession, part: string, fileMiB: number, sentMiB: number) {
  const head = Buffer.from(
    `--${BOUNDARY}\r\nContent-Disposition: form-data; name="session"\r\n\r\n${part}\r\n` +
      `--${BOUNDARY}\r\nContent-Disposition: form-data; name="samples"; filename="samples.bin"\r\nContent-Type: application/octet-stream\r\n\r\n`,
  );
  const tail = Buffer.from(`\r\n--${BOUNDARY}--\r\n`);
  const req = request(`${baseUrl}/api/sessions`, {
    method: 'POST',
    headers: { cookie: s.cookie, 'x-csrf-token': s.csrf, 'content-type': `multipart/form-data; boundary=${BOUNDARY}`, 'content-length': head.length + fileMiB * 1024 * 1024 + tail.length },
  });
  const outcome = new Promise<string>((resolve) => {
    req.on('error', (e) => resolve(`error: ${e.message}`));
    req.on('response', (res) => resolve(`answered ${res.statusCode}`));
  });
  const written = (async () => {
    req.write(head);
    const chunk = Buffer.alloc(1024 * 1024, 0x3c);
    for (let sent = 0; sent < sentMiB; sent++) if (!req.write(chunk)) await new Promise((r) => req.once('drain', r));
  })();
  return { outcome, written };
}
