// A throwaway PostgreSQL cluster: initdb in a temporary folder, the server on a free port on
// 127.0.0.1 (its socket in the same folder), trust authentication, everything removed by `stop`.
// Used by `npm run test:pg` (scripts/with-postgres.ts) and `npm run dev:pg`. Debian's
// `postgresql` package is installed with apt-get when no PostgreSQL is found and we are root;
// otherwise `startCluster` throws a PostgresUnavailable with a one-line reason.
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';

export class PostgresUnavailable extends Error {
  override name = 'PostgresUnavailable';
}

export interface Cluster {
  /** The superuser's URL on the `postgres` database: tests create their own databases with it. */
  adminUrl: string;
  /** URL of a database `name` on this cluster. */
  urlOf(name: string): string;
  /** Fast shutdown, then the folder is removed. Safe to call twice. */
  stop(): Promise<void>;
}

const isRoot = () => process.getuid?.() === 0;

/** The folder holding initdb and postgres: PG_BIN, else Debian's newest, else whatever is on PATH. */
function findBinDir(): string | null {
  if (process.env.PG_BIN) return fs.existsSync(path.join(process.env.PG_BIN, 'initdb')) ? process.env.PG_BIN : null;
  const debian = '/usr/lib/postgresql';
  if (fs.existsSync(debian)) {
    const versions = fs.readdirSync(debian).filter((v) => fs.existsSync(path.join(debian, v, 'bin/initdb'))).sort((a, b) => Number(b) - Number(a));
    if (versions.length) return path.join(debian, versions[0], 'bin');
  }
  for (const dir of (process.env.PATH ?? '').split(path.delimiter)) if (dir && fs.existsSync(path.join(dir, 'initdb'))) return dir;
  return null;
}

/** apt-get install postgresql, without the package's own always-running main cluster. */
function installWithApt(): void {
  if (!isRoot()) throw new PostgresUnavailable("PostgreSQL is not installed and we are not root: run 'sudo apt-get install postgresql' (or set PG_BIN to the folder holding initdb)");
  try {
    execFileSync('sh', ['-c', 'command -v apt-get'], { stdio: 'ignore' });
  } catch {
    throw new PostgresUnavailable('PostgreSQL is not installed and apt-get is not available to install it: install PostgreSQL 13 or later, or set PG_BIN');
  }
  // Debian's postgresql-common creates and starts a cluster on install unless told not to; we
  // only need the programs.
  const conf = '/etc/postgresql-common/createcluster.conf';
  if (!fs.existsSync(conf)) {
    fs.mkdirSync(path.dirname(conf), { recursive: true });
    fs.writeFileSync(conf, 'create_main_cluster = false\n');
  }
  console.error("Installing Debian's postgresql for the database tests…");
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  try {
    execFileSync('apt-get', ['update', '-qq'], { stdio: ['ignore', 'ignore', 'inherit'], env });
    // confold: keep the createcluster.conf written above instead of asking about it.
    execFileSync('apt-get', ['install', '-y', '-qq', '-o', 'Dpkg::Options::=--force-confdef', '-o', 'Dpkg::Options::=--force-confold', 'postgresql'], { stdio: ['ignore', 'ignore', 'inherit'], env });
  } catch (err) {
    throw new PostgresUnavailable(`apt-get install postgresql failed: ${(err as Error).message.split('\n')[0]}`);
  }
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
  });
}

/** uid and gid of the `postgres` system user (PostgreSQL refuses to run as root). */
function postgresUser(): { uid: number; gid: number } {
  try {
    const uid = Number(execFileSync('id', ['-u', 'postgres'], { encoding: 'utf8' }).trim());
    const gid = Number(execFileSync('id', ['-g', 'postgres'], { encoding: 'utf8' }).trim());
    return { uid, gid };
  } catch {
    throw new PostgresUnavailable("running as root and there is no 'postgres' system user to run PostgreSQL as (Debian's postgresql package creates it)");
  }
}

/** Install if needed, initdb, start, and wait until the server takes connections. */
export async function startCluster(options: { log?: (line: string) => void; durable?: boolean } = {}): Promise<Cluster> {
  let bin = findBinDir();
  if (!bin) {
    installWithApt();
    bin = findBinDir();
    if (!bin) throw new PostgresUnavailable('postgresql was installed but initdb is still not found: set PG_BIN to the folder holding it');
  }
  const owner = isRoot() ? postgresUser() : undefined;
  const root = fs.mkdtempSync(path.join(os.tmpdir(), 'anglebench-pg-'));
  const dataDir = path.join(root, 'data');
  let server: ChildProcess | undefined;
  let watchdog: ChildProcess | undefined;
  let stopped = false;
  const stop = async () => {
    if (stopped) return;
    stopped = true;
    watchdog?.kill('SIGKILL');
    if (server && server.exitCode === null && server.signalCode === null) {
      const exited = new Promise<void>((r) => server!.once('exit', () => r()));
      server.kill('SIGINT'); // fast shutdown: disconnects clients, no checkpoint wait for us
      const timer = setTimeout(() => server!.kill('SIGKILL'), 10_000);
      await exited;
      clearTimeout(timer);
    }
    fs.rmSync(root, { recursive: true, force: true });
  };
  try {
    if (owner) fs.chownSync(root, owner.uid, owner.gid);
    const asOwner = owner ? { uid: owner.uid, gid: owner.gid } : {};
    try {
      execFileSync(path.join(bin, 'initdb'), ['-D', dataDir, '-U', 'postgres', '-A', 'trust', '-E', 'UTF8', '--locale=C', '--no-sync'], {
        ...asOwner,
        stdio: ['ignore', 'pipe', 'pipe'],
        cwd: root,
      });
    } catch (err) {
      const stderr = String((err as { stderr?: Buffer }).stderr ?? '').trim().split('\n').pop();
      throw new PostgresUnavailable(`initdb failed: ${stderr || (err as Error).message}`);
    }
    const port = await freePort();
    let log = '';
    // Durability is not wanted from a test cluster, speed is; benchmarks ask for a durable one
    // (PostgreSQL's defaults), to compare with SQLite syncing its own writes.
    const fast = options.durable ? [] : ['-c', 'fsync=off', '-c', 'synchronous_commit=off', '-c', 'full_page_writes=off'];
    server = spawn(
      path.join(bin, 'postgres'),
      ['-D', dataDir, '-p', String(port), '-k', root, '-c', 'listen_addresses=127.0.0.1', '-c', 'max_connections=200', ...fast],
      { ...asOwner, cwd: root, stdio: ['ignore', 'pipe', 'pipe'] },
    );
    watchdog = startWatchdog(server.pid!, root);
    server.stdout!.on('data', (d) => (log += d));
    server.stderr!.on('data', (d) => {
      log += d;
      options.log?.(String(d));
    });
    const adminUrl = `postgres://postgres@127.0.0.1:${port}/postgres`;
    const deadline = Date.now() + 30_000;
    for (;;) {
      if (server.exitCode !== null || server.signalCode !== null) throw new PostgresUnavailable(`postgres exited at start: ${log.trim().split('\n').pop()}`);
      const client = new pg.Client({ connectionString: adminUrl });
      try {
        await client.connect();
        await client.end();
        break;
      } catch {
        await client.end().catch(() => undefined);
      }
      if (Date.now() > deadline) throw new PostgresUnavailable(`postgres did not take connections within 30 s: ${log.trim().split('\n').pop()}`);
      await new Promise((r) => setTimeout(r, 100));
    }
    return { adminUrl, urlOf: (name) => `postgres://postgres@127.0.0.1:${port}/${name}`, stop };
  } catch (err) {
    await stop();
    throw err;
  }
}

/**
 * A shell outside this process that stops the cluster and removes its folder if this process
 * dies without doing so itself (SIGKILL, or a runner such as tsx killing it on a signal): checked
 * once a second. `stop` kills the watchdog first when it does the work itself.
 */
function startWatchdog(postgresPid: number, root: string): ChildProcess {
  const script = [
    'while kill -0 "$1" 2>/dev/null; do sleep 1; done',
    'kill -INT "$2" 2>/dev/null',
    'i=0; while kill -0 "$2" 2>/dev/null && [ $i -lt 20 ]; do sleep 0.5; i=$((i+1)); done',
    'kill -KILL "$2" 2>/dev/null',
    'rm -rf "$3"',
  ].join('; ');
  const child = spawn('sh', ['-c', script, 'anglebench-pg-watchdog', String(process.pid), String(postgresPid), root], { detached: true, stdio: 'ignore' });
  child.unref();
  return child;
}
