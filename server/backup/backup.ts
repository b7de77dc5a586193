// `npm run backup` and `npm run restore`: one tar file holding a consistent copy of the database
// and the uploaded bitstreams. Layout (see docs/database.md):
//   anglebench-backup.json   what this is: format, dialect, when, which files
//   database.sqlite          SQLite: a copy made by VACUUM INTO (one read transaction: consistent
//                            while the server keeps writing)
//   database.pgdump          PostgreSQL: pg_dump's custom format (one snapshot: consistent too)
//   uploads/build-N.bit      the bitstreams, copied after the database, so every build the copy
//                            knows has its file (a build uploaded meanwhile may add a spare file)
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sqlite3 from 'sqlite3';
import { pgQuery } from '../db/pg-query';
import { findPgTool, runTool } from './pg-tools';
import { extractEntry, listTar, readEntry, TarWriter } from './tar';

export const MANIFEST = 'anglebench-backup.json';
const FORMAT = 'anglebench-backup';
const FORMAT_VERSION = 1;
const INCOMING = '.incoming-'; // unfinished uploads: never backed up

export interface Manifest {
  format: typeof FORMAT;
  version: number;
  dialect: 'sqlite' | 'postgres';
  createdAt: string;
  database: string;
  uploads: string[];
}

/** What the user got wrong (a refusal, a bad file): the CLI prints the message and exits 1. */
export class BackupError extends Error {
  override name = 'BackupError';
}

type Target = { dialect: 'sqlite'; file: string } | { dialect: 'postgres'; url: string };

function targetOf(databaseUrl: string): Target {
  if (/^postgres(ql)?:\/\//.test(databaseUrl)) return { dialect: 'postgres', url: databaseUrl };
  if (databaseUrl === 'sqlite::memory:') throw new BackupError('DATABASE_URL is an in-memory database: there is nothing on disk to back up or restore into');
  return { dialect: 'sqlite', file: path.resolve(databaseUrl.slice('sqlite:'.length)) };
}

function openSqlite(file: string, mode: number): Promise<sqlite3.Database> {
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(file, mode, (err) => (err ? reject(err) : resolve(db)));
  });
}
const sqliteAll = <T>(db: sqlite3.Database, sql: string, params: unknown[] = []) =>
  new Promise<T[]>((resolve, reject) => db.all(sql, params, (err, rows) => (err ? reject(err) : resolve(rows as T[]))));
const sqliteClose = (db: sqlite3.Database) => new Promise<void>((resolve, reject) => db.close((err) => (err ? reject(err) : resolve())));

/** Copies the live database into `dest` (a new file) without stopping the server. */
async function snapshotDatabase(target: Target, dest: string): Promise<void> {
  if (target.dialect === 'postgres') {
    await runTool(findPgTool('pg_dump'), ['--format=custom', '--no-owner', '--no-privileges', '--file', dest, '--dbname', target.url]);
    return;
  }
  if (!fs.existsSync(target.file)) throw new BackupError(`there is no database at ${target.file}`);
  const db = await openSqlite(target.file, sqlite3.OPEN_READWRITE);
  try {
    db.configure('busyTimeout', 10_000);
    await sqliteAll(db, 'VACUUM INTO ?', [dest]);
  } finally {
    await sqliteClose(db);
  }
}

const uploadNames = (dir: string) => (fs.existsSync(dir) ? fs.readdirSync(dir).filter((n) => !n.startsWith(INCOMING) && fs.statSync(path.join(dir, n)).isFile()).sort() : []);

/**
 * Writes the backup of `databaseUrl` and `uploadDir` to `out` (which must not exist). The file
 * appears under its name only once complete. Resolves to what it holds.
 */
export async function makeBackup(opts: { databaseUrl: string; uploadDir: string; out: string }): Promise<Manifest> {
  const target = targetOf(opts.databaseUrl);
  const out = path.resolve(opts.out);
  if (fs.existsSync(out)) throw new BackupError(`${out} exists already: choose a new file name`);
  const work = fs.mkdtempSync(path.join(os.tmpdir(), 'anglebench-backup-'));
  const partial = `${out}.partial-${randomBytes(4).toString('hex')}`;
  try {
    const dbFile = target.dialect === 'sqlite' ? 'database.sqlite' : 'database.pgdump';
    const snapshot = path.join(work, dbFile);
    // pg_dump runs as whoever we are; the folder must be writable for it.
    await snapshotDatabase(target, snapshot);
    const uploads = uploadNames(opts.uploadDir);
    const manifest: Manifest = { format: FORMAT, version: FORMAT_VERSION, dialect: target.dialect, createdAt: new Date().toISOString(), database: dbFile, uploads };
    const fh = await fs.promises.open(partial, 'wx');
    try {
      const tar = new TarWriter(fh);
      await tar.addBuffer(MANIFEST, Buffer.from(`${JSON.stringify(manifest, null, 2)}\n`));
      await tar.addFile(dbFile, snapshot);
      for (const name of uploads) await tar.addFile(`uploads/${name}`, path.join(opts.uploadDir, name));
      await tar.finish();
      await fh.sync();
    } finally {
      await fh.close();
    }
    fs.renameSync(partial, out);
    return manifest;
  } finally {
    fs.rmSync(partial, { force: true });
    fs.rmSync(work, { recursive: true, force: true });
  }
}

async function readManifest(file: string) {
  const entries = await listTar(file);
  const manifestEntry = entries.find((e) => e.name === MANIFEST);
  if (!manifestEntry) throw new BackupError(`${file} is a tar file but not an Anglebench backup (no ${MANIFEST})`);
  const manifest = JSON.parse((await readEntry(file, manifestEntry)).toString('utf8')) as Manifest;
  if (manifest.format !== FORMAT) throw new BackupError(`${file} is not an Anglebench backup`);
  if (manifest.version > FORMAT_VERSION) throw new BackupError(`${file} is backup format ${manifest.version}; this version reads up to ${FORMAT_VERSION}: restore with a newer Anglebench`);
  return { entries, manifest };
}


/** Why the database is not empty, or null when it is (no tables at all). */
async function whyNotEmpty(target: Target): Promise<string | null> {
  if (target.dialect === 'postgres') {
    const rows = await pgQuery<{ n: string }>(target.url, "SELECT count(*) AS n FROM information_schema.tables WHERE table_schema NOT IN ('pg_catalog', 'information_schema')");
    return Number(rows[0].n) > 0 ? `the database holds ${rows[0].n} table(s)` : null;
  }
  if (!fs.existsSync(target.file)) return null;
  const db = await openSqlite(target.file, sqlite3.OPEN_READONLY);
  try {
    const rows = await sqliteAll<{ n: number }>(db, "SELECT count(*) AS n FROM sqlite_master WHERE type = 'table'");
    return rows[0].n > 0 ? `${target.file} holds ${rows[0].n} table(s)` : null;
  } finally {
    await sqliteClose(db);
  }
}

/**
 * Restores the backup `file` into the empty database `databaseUrl` and the empty (or absent)
 * `uploadDir`. Refuses, changing nothing, when either holds anything or the dialects differ.
 */
export async function restoreBackup(opts: { databaseUrl: string; uploadDir: string; file: string }): Promise<Manifest> {
  const file = path.resolve(opts.file);
  if (!fs.existsSync(file)) throw new BackupError(`there is no backup file at ${file}`);
  const target = targetOf(opts.databaseUrl);
  const { entries, manifest } = await readManifest(file);
  if (manifest.dialect !== target.dialect) {
    throw new BackupError(`this backup is of a ${manifest.dialect} database and DATABASE_URL names a ${target.dialect} one: restore into a ${manifest.dialect} database`);
  }
  const notEmpty = await whyNotEmpty(target);
  if (notEmpty) throw new BackupError(`refusing to restore into a database that is not empty (${notEmpty}): point DATABASE_URL at a new, empty database`);
  const present = fs.existsSync(opts.uploadDir) ? fs.readdirSync(opts.uploadDir) : [];
  if (present.length) throw new BackupError(`refusing to restore into an upload folder that is not empty (${opts.uploadDir} holds ${present.length} entries): point UPLOAD_DIR at a new, empty folder`);
  const dbEntry = entries.find((e) => e.name === manifest.database);
  if (!dbEntry) throw new BackupError(`${file} lacks its database (${manifest.database}): the backup is damaged`);
  const unsafe = manifest.uploads.find((n) => path.basename(n) !== n || n.startsWith('.'));
  if (unsafe !== undefined) throw new BackupError(`${file} names a bitstream outside the upload folder (${unsafe}): the backup is damaged`);
  const missing = manifest.uploads.filter((n) => !entries.some((e) => e.name === `uploads/${n}`));
  if (missing.length) throw new BackupError(`${file} lacks ${missing.length} bitstream(s) its manifest lists (${missing.slice(0, 3).join(', ')}): the backup is damaged`);

  if (target.dialect === 'postgres') {
    const work = fs.mkdtempSync(path.join(os.tmpdir(), 'anglebench-restore-'));
    try {
      const dump = path.join(work, manifest.database);
      await extractEntry(file, dbEntry, dump);
      // One transaction: a failure leaves the database as empty as it was.
      await runTool(findPgTool('pg_restore'), ['--no-owner', '--no-privileges', '--single-transaction', '--exit-on-error', '--dbname', target.url, dump]);
      // A dump carries no planner statistics: without them the sessions list's count scans the
      // whole table until autovacuum comes round (about a minute). pg_restore's manual advises this.
      await pgQuery(target.url, 'VACUUM ANALYZE');
    } finally {
      fs.rmSync(work, { recursive: true, force: true });
    }
  } else {
    fs.mkdirSync(path.dirname(target.file), { recursive: true });
    const partial = `${target.file}.restoring-${randomBytes(4).toString('hex')}`;
    try {
      await extractEntry(file, dbEntry, partial);
      // An empty file (and its journal) left by an earlier open makes way for the copy.
      for (const suffix of ['', '-wal', '-shm']) fs.rmSync(target.file + suffix, { force: true });
      fs.renameSync(partial, target.file);
    } finally {
      fs.rmSync(partial, { force: true });
    }
  }

  fs.mkdirSync(opts.uploadDir, { recursive: true });
  for (const name of manifest.uploads) {
    const entry = entries.find((e) => e.name === `uploads/${name}`)!;
    await extractEntry(file, entry, path.join(opts.uploadDir, name));
  }
  return manifest;
}
