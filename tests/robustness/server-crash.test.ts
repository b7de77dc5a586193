// The server killed with SIGKILL in the middle of uploads, then started again on the same
// database (SQLite file or PostgreSQL): the database opens, passes its integrity check (SQLite), and holds exactly the sessions whose
// upload was answered (nothing from the upload cut off half-way), and a bitstream cut off
// half-way leaves no temporary file once the server is back.
import fs from 'node:fs';
import { request } from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase } from '../../server/db/connection';
import { tempDatabase } from '../support/temp-db';
import { modelSamples, sessionForm, sessionPart, signInOverHttp, type HttpSession } from './support/http-session';
import { startServerProcess, uploadDirOf, type ServerProcess } from './support/server-process';

const tmp = await tempDatabase();
let server: ServerProcess | null = null;

afterAll(async () => {
  await server?.stop();
  await tmp.cleanup();
});

/** What the database holds, read with the server down: SQLite's integrity check and the session rows. */
async function inspectDatabase() {
  const db = openDatabase(tmp.url);
  try {
    const [check] = tmp.dialect === 'sqlite' ? ((await db.query('PRAGMA integrity_check')) as [Array<{ integrity_check: string }>, unknown]) : await postgresIndexCheck(db);
    const [rows] = (await db.query('SELECT id, notes, "sampleCount", length(samples) AS bytes FROM sessions ORDER BY id')) as [
      Array<{ id: number; notes: string; sampleCount: number; bytes: number }>,
      unknown,
    ];
    return { integrity: check.map((r) => r.integrity_check), rows };
  } finally {
    await db.close();
  }
}

/**
 * PostgreSQL's nearest to SQLite's integrity check: amcheck verifies every index of `sessions`
 * against its table (a missing or stray entry raises an error).
 */
async function postgresIndexCheck(db: ReturnType<typeof openDatabase>): Promise<[Array<{ integrity_check: string }>, unknown]> {
  await db.query('CREATE EXTENSION IF NOT EXISTS amcheck');
  const [checked] = (await db.query(
    `SELECT bt_index_check(i.indexrelid, true) FROM pg_index i JOIN pg_class c ON c.oid = i.indexrelid JOIN pg_am a ON a.oid = c.relam
     WHERE i.indrelid = 'sessions'::regclass AND a.amname = 'btree'`,
  )) as [unknown[], unknown];
  if (checked.length === 0) throw new Error('no index of sessions was checked');
  return [[{ integrity_check: 'ok' }], null];
}

const sessionCount = async (s: HttpSession) => ((await (await s.fetch('/api/sessions?pageSize=1')).json()) as { total: number }).total;

const BOUNDARY = 'robustness-boundary-7f3a';
const formField = (name: string, value: string) => `--${BOUNDARY}\r\nContent-Disposition: form-data; name="${name}"\r\n\r\n${value}\r\n`;
const fileFieldHead = (name: string, fileName: string) =>
  `--${BOUNDARY}\r\nContent-Disposition: form-data; name="${name}"; filename="${fileName}"\r\nContent-Type: application/octet-stream\r\n\r\n`;

/**
 * Starts a multipart upload by raw HTTP that announces a file of `fileMiB` MiB after `head`, and
 * sends `sentMiB` of it; the body is never finished. Resolves once those bytes are written, with
 * `ended`: how the request ended ("answered N", or "error: …" when the connection died).
 */
async function partialUpload(s: HttpSession, path: string, head: string, fileMiB: number, sentMiB: number, fill: number): Promise<{ ended: Promise<string> }> {
  const start = Buffer.from(head);
  const tail = Buffer.from(`\r\n--${BOUNDARY}--\r\n`);
  const req = request(`${server!.url}${path}`, {
    method: 'POST',
    headers: {
      cookie: s.cookie,
      'x-csrf-token': s.csrf,
      'content-type': `multipart/form-data; boundary=${BOUNDARY}`,
      'content-length': start.length + fileMiB * 1024 * 1024 + tail.length,
    },
  });
  const ended = new Promise<string>((resolve) => {
    req.on('error', (e) => resolve(`error: ${e.message}`));
    req.on('response', (res) => resolve(`answered ${res.statusCode}`));
  });
  req.write(start);
  const chunk = Buffer.alloc(1024 * 1024, fill);
  for (let sent = 0; sent < sentMiB; sent++) if (!req.write(chunk)) await new Promise((r) => req.once('drain', r));
  return { ended };
}

let ids: { coreId: number; buildId: number | null; boardId: number | null };

beforeAll(async () => {
  server = await startServerProcess(tmp);
});

describe('the server killed during uploads', () => {
  it('loses nothing but the upload it was receiving, and restarts on an intact database', async () => {
    const engineer = await signInOverHttp(server!.url, 'engineer@anglebench.test', 'anglebench');
    const first = ((await (await engineer.fetch('/api/sessions?pageSize=1')).json()) as { items: Array<{ coreId: number; buildId: number | null; boardId: number | null }> }).items[0];
    ids = { coreId: first.coreId, buildId: first.buildId, boardId: first.boardId };
    // One whole upload first, so the route is known to work in this process.
    const ok = await engineer.fetch('/api/sessions', { method: 'POST', body: sessionForm(sessionPart(ids, 'before the crash'), modelSamples(4096)) });
    expect(ok.status).toBe(201);
    const before = await sessionCount(engineer);

    // A 40 MB upload, of which 8 MB is sent before the server is killed.
    const { ended } = await partialUpload(engineer, '/api/sessions', `${formField('session', sessionPart(ids, 'half an upload'))}${fileFieldHead('samples', 'samples.bin')}`, 40, 8, 0x5a);
    // partialUpload resolved once its 8 MB were written under back-pressure: the server has read
    // all but what the socket buffers hold, so it is mid-upload now; no need to wait for a time.
    await server!.kill();
    expect(await ended).toMatch(/^error: /); // the connection died with the server: no answer

    const afterKill = await inspectDatabase();
    expect(afterKill.integrity).toEqual(['ok']);
    expect(afterKill.rows).toHaveLength(before);
    expect(afterKill.rows.some((r) => r.notes === 'half an upload')).toBe(false);

    server = await startServerProcess(tmp);
    const again = await signInOverHttp(server.url, 'engineer@anglebench.test', 'anglebench');
    expect(await sessionCount(again)).toBe(before);
    const next = await again.fetch('/api/sessions', { method: 'POST', body: sessionForm(sessionPart(ids, 'after the restart'), modelSamples(4096)) });
    expect(next.status).toBe(201);
    expect(await sessionCount(again)).toBe(before + 1);
  });

  it('killed during a burst of 12 whole uploads: after restart every answered upload is there, whole, and nothing else is half there', async () => {
    const engineer = await signInOverHttp(server!.url, 'engineer@anglebench.test', 'anglebench');
    const before = await sessionCount(engineer);
    const samples = modelSamples(16_384);
    let answered = 0;
    const uploads = Array.from({ length: 12 }, (_, i) =>
      engineer.fetch('/api/sessions', { method: 'POST', body: sessionForm(sessionPart(ids, `burst ${i}`), samples) }).then(
        (r) => {
          if (r.status === 201) answered++;
          return r.status;
        },
        () => 'cut off',
      ),
    );
    // Kill once the first answers are back, while the rest are still in flight.
    const deadline = Date.now() + 30_000;
    while (answered < 3 && Date.now() < deadline) await new Promise((r) => setTimeout(r, 5));
    await server!.kill();
    const outcomes = await Promise.all(uploads);
    const acknowledged = answered;
    expect(acknowledged).toBeGreaterThanOrEqual(3);

    const db = await inspectDatabase();
    expect(db.integrity).toEqual(['ok']);
    const burst = db.rows.filter((r) => r.notes.startsWith('burst '));
    // Every answered upload survived; an unanswered one may have committed just before the kill.
    expect(burst.length).toBeGreaterThanOrEqual(acknowledged);
    expect(db.rows.length).toBe(before + burst.length);
    // Whole rows only: every stored burst session has all its samples.
    expect(burst.every((r) => r.sampleCount === 16_384 && r.bytes === samples.length)).toBe(true);
    console.info(`[crash] burst of 12: ${acknowledged} answered 201 before the kill, ${burst.length} stored, outcomes ${JSON.stringify(outcomes)}`);

    server = await startServerProcess(tmp);
    const again = await signInOverHttp(server.url, 'engineer@anglebench.test', 'anglebench');
    expect(await sessionCount(again)).toBe(before + burst.length);
  });

  it('killed during a bitstream upload: the restarted server removes the half file and keeps the build as it was', async () => {
    const engineer = await signInOverHttp(server!.url, 'engineer@anglebench.test', 'anglebench');
    const build = ((await (await engineer.fetch('/api/builds')).json()) as { builds: Array<{ id: number; sha256: string | null }> }).builds[0];
    const { ended } = await partialUpload(engineer, `/api/builds/${build.id}/file`, fileFieldHead('file', 'top.bit'), 32, 4, 0xa5);
    const dir = uploadDirOf(tmp);
    const incoming = () => (fs.existsSync(dir) ? fs.readdirSync(dir).filter((n) => n.startsWith('.incoming-')) : []);
    const deadline = Date.now() + 10_000;
    while (incoming().length === 0 && Date.now() < deadline) await new Promise((r) => setTimeout(r, 20));
    await server!.kill();
    expect(await ended).toMatch(/^error: /);
    expect(incoming()).toHaveLength(1); // what the kill left behind

    server = await startServerProcess(tmp);
    expect(incoming()).toEqual([]);
    expect(server.output()).toMatch(/Removed 1 unfinished bitstream upload/);
    const again = await signInOverHttp(server.url, 'engineer@anglebench.test', 'anglebench');
    const after = ((await (await again.fetch(`/api/builds/${build.id}`)).json()) as { build: { sha256: string | null } }).build;
    expect(after.sha256).toBe(build.sha256);
  });
});
