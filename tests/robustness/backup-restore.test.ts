// `npm run backup` taken while 20 uploads are under way, restored with `npm run restore` into a
// fresh database and upload folder: every session the backup holds reads back with byte-identical
// samples, archive and statistics, and the bitstreams come back too. A restore into a database or
// upload folder that holds anything is refused and changes nothing. Runs on SQLite and, in
// `npm run test:pg`, on PostgreSQL.
import { spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { projectRoot } from '../../server/paths';
import { listTar } from '../../server/backup/tar';
import { pgQuery } from '../../server/db/pg-query';
import { tempDatabase, type TempDatabase } from '../support/temp-db';
import { modelSamples, sessionForm, sessionPart, signInOverHttp, type HttpSession } from './support/http-session';
import { startServerProcess, uploadDirOf, type ServerProcess } from './support/server-process';

const source = await tempDatabase();
const restored = await tempDatabase();
let server: ServerProcess | null = null;
let copy: ServerProcess | null = null;
const backupFile = path.join(source.dir, 'backup.tar');

beforeAll(async () => {
  server = await startServerProcess(source);
});
afterAll(async () => {
  await Promise.all([server?.stop(), copy?.stop()]);
  await Promise.all([source.cleanup(), restored.cleanup()]);
});

/**
 * Starts a backup CLI (backup or restore) on `db`. `started` resolves when it prints its first
 * line (the backup's "Backing up to …", just before it copies); `done` to its exit code and output.
 */
function runCli(script: 'backup-cli' | 'restore-cli', db: TempDatabase, args: string[]) {
  const child = spawn(process.execPath, [path.join(projectRoot, 'node_modules/tsx/dist/cli.mjs'), `server/backup/${script}.ts`, ...args], {
    cwd: projectRoot,
    env: { ...process.env, DATABASE_URL: db.url, UPLOAD_DIR: uploadDirOf(db), SESSION_SECRET: 'robustness-secret-0123456789' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  const started = new Promise<void>((resolve) => {
    child.stdout.on('data', (d) => {
      output += d;
      resolve();
    });
    child.once('exit', () => resolve());
  });
  child.stderr.on('data', (d) => (output += d));
  const done = new Promise<{ code: number | null; output: string }>((resolve) => child.once('exit', (code) => resolve({ code, output })));
  return Object.assign(done, { started });
}

type Listed = { id: number; notes: string; coreId: number; buildId: number | null; boardId: number | null; hasArchive: boolean };
const listAll = async (s: HttpSession) => ((await (await s.fetch('/api/sessions?pageSize=100')).json()) as { items: Listed[]; total: number });
const bytes = async (res: Response) => (res.status === 200 ? Buffer.from(await res.arrayBuffer()) : `status ${res.status}`);
const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

describe(`backup and restore (${source.dialect})`, () => {
  it('copies the database and bitstreams during 20 concurrent uploads, and the copy reads back byte-identical', async () => {
    const engineer = await signInOverHttp(server!.url, 'engineer@anglebench.test', 'anglebench');
    const first = (await listAll(engineer)).items[0];
    const ids = { coreId: first.coreId, buildId: first.buildId, boardId: first.boardId };
    // A bitstream in the upload folder, for the backup to carry.
    const bitstream = Buffer.from(Array.from({ length: 70_000 }, (_, i) => (i * 7919) % 251));
    const form = new FormData();
    form.set('file', new Blob([bitstream]), 'top.bit');
    expect((await engineer.fetch(`/api/builds/${ids.buildId}/file`, { method: 'POST', body: form })).status).toBe(200);

    const upload = (i: number) =>
      engineer.fetch('/api/sessions', { method: 'POST', body: sessionForm(sessionPart(ids, `during backup ${i}`), modelSamples(16_384 + 128 * i)) }).then((r) => r.status);
    // Ten uploads under way as the backup program starts, ten more as it begins to copy.
    const uploads = Array.from({ length: 10 }, (_, i) => upload(i));
    const running = runCli('backup-cli', source, ['--out', backupFile]);
    await running.started;
    uploads.push(...Array.from({ length: 10 }, (_, i) => upload(10 + i)));
    const backup = await running;
    expect(await Promise.all(uploads)).toEqual(Array(20).fill(201));
    expect(backup.output).toMatch(/Backed up the \w+ database and 1 bitstream/);
    expect(backup.code).toBe(0);
    // An ordinary tar: the manifest, the database, the bitstream.
    expect((await listTar(backupFile)).map((e) => e.name)).toEqual(['anglebench-backup.json', source.dialect === 'sqlite' ? 'database.sqlite' : 'database.pgdump', `uploads/build-${ids.buildId}.bit`]);

    const restore = await runCli('restore-cli', restored, [backupFile]);
    expect(restore.output).toMatch(/Restored the \w+ database/);
    expect(restore.code).toBe(0);
    if (restored.dialect === 'postgres') {
      // A dump carries no planner statistics; the restore gathers them, as pg_restore's manual advises.
      const [stats] = await pgQuery<{ last_vacuum: Date | null; last_analyze: Date | null }>(restored.url, "SELECT last_vacuum, last_analyze FROM pg_stat_user_tables WHERE relname = 'sessions'");
      expect(stats.last_vacuum).not.toBeNull();
      expect(stats.last_analyze).not.toBeNull();
    }
    copy = await startServerProcess(restored);
    const onCopy = await signInOverHttp(copy.url, 'engineer@anglebench.test', 'anglebench');

    const original = await listAll(engineer);
    const copied = await listAll(onCopy);
    // The copy holds a prefix of what was uploaded: whatever had committed when the backup began.
    expect(copied.total).toBeGreaterThan(0);
    expect(copied.total).toBeLessThanOrEqual(original.total);
    const originalById = new Map(original.items.map((s) => [s.id, s]));
    for (const s of copied.items) {
      expect(originalById.get(s.id)?.notes).toBe(s.notes);
      const [a, b] = await Promise.all([engineer.fetch(`/api/sessions/${s.id}`), onCopy.fetch(`/api/sessions/${s.id}`)]);
      const [was, now] = (await Promise.all([a.json(), b.json()])) as Array<{ session: { stats: unknown; verdict: unknown; sampleCount: number } }>;
      expect(now.session.stats).toEqual(was.session.stats);
      expect(now.session.verdict).toEqual(was.session.verdict);
      const [samplesWas, samplesNow] = await Promise.all([bytes(await engineer.fetch(`/api/sessions/${s.id}/samples`)), bytes(await onCopy.fetch(`/api/sessions/${s.id}/samples`))]);
      expect(Buffer.isBuffer(samplesNow) && Buffer.isBuffer(samplesWas) && samplesNow.equals(samplesWas)).toBe(true);
      const [archiveWas, archiveNow] = await Promise.all([bytes(await engineer.fetch(`/api/sessions/${s.id}/archive`)), bytes(await onCopy.fetch(`/api/sessions/${s.id}/archive`))]);
      expect(typeof archiveNow === 'string' ? archiveNow : sha256(archiveNow)).toBe(typeof archiveWas === 'string' ? archiveWas : sha256(archiveWas));
    }
    const during = copied.items.filter((s) => s.notes.startsWith('during backup'));
    console.info(`[backup] ${during.length} of the 20 concurrent uploads were in the backup; ${copied.total} sessions restored`);

    const file = await onCopy.fetch(`/api/builds/${ids.buildId}/file`);
    expect(file.status).toBe(200);
    expect(Buffer.from(await file.arrayBuffer()).equals(bitstream)).toBe(true);
  });

  it('refuses to restore into a database that holds anything, or an upload folder that does, and changes neither', async () => {
    const before = fs.readdirSync(uploadDirOf(restored)).sort();
    const again = await runCli('restore-cli', restored, [backupFile]);
    expect(again.code).toBe(1);
    expect(again.output).toMatch(/refusing to restore into a database that is not empty/);
    expect(fs.readdirSync(uploadDirOf(restored)).sort()).toEqual(before);

    // An empty database but a used upload folder: refused too.
    const fresh = await tempDatabase();
    try {
      fs.mkdirSync(uploadDirOf(fresh), { recursive: true });
      fs.writeFileSync(path.join(uploadDirOf(fresh), 'build-1.bit'), 'kept');
      const intoUsedFolder = await runCli('restore-cli', fresh, [backupFile]);
      expect(intoUsedFolder.code).toBe(1);
      expect(intoUsedFolder.output).toMatch(/refusing to restore into an upload folder that is not empty/);
      expect(fs.readFileSync(path.join(uploadDirOf(fresh), 'build-1.bit'), 'utf8')).toBe('kept');
    } finally {
      await fresh.cleanup();
    }
  });

  it('refuses a file that is not a backup, and a backup file name that exists already', async () => {
    const notTar = path.join(source.dir, 'not-a-backup.tar');
    fs.writeFileSync(notTar, 'hello');
    const fresh = await tempDatabase();
    try {
      const bad = await runCli('restore-cli', fresh, [notTar]);
      expect(bad.code).toBe(1);
      expect(bad.output).toMatch(/Restore failed: the archive ends without its end marker/);
    } finally {
      await fresh.cleanup();
    }
    const twice = await runCli('backup-cli', source, ['--out', backupFile]);
    expect(twice.code).toBe(1);
    expect(twice.output).toMatch(/exists already/);
  });
});
