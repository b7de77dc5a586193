// The production server as a child process on a given database, the way `npm start` runs it, so
// a test can kill it with SIGKILL and start it again on the same database (or run two at once).
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { projectRoot } from '../../../server/paths';
import { freePort } from '../../e2e/harness';
import type { TempDatabase } from '../../support/temp-db';

export interface ServerProcess {
  url: string;
  child: ChildProcess;
  output: () => string;
  /** SIGKILL to the whole process group (tsx runs the server in a child of its own). */
  kill(): Promise<void>;
  /** SIGTERM, then SIGKILL after 5 s. */
  stop(): Promise<void>;
}

/** Bitstreams go in the test database's folder, so each test's servers share their own. */
export const uploadDirOf = (database: Pick<TempDatabase, 'dir'>) => path.join(database.dir, 'uploads');

export async function startServerProcess(database: Pick<TempDatabase, 'url' | 'dir'>): Promise<ServerProcess> {
  const port = await freePort();
  const child = spawn(process.execPath, [path.join(projectRoot, 'node_modules/tsx/dist/cli.mjs'), 'server/index.ts'], {
    cwd: projectRoot,
    env: { ...process.env, NODE_ENV: 'production', PORT: String(port), DATABASE_URL: database.url, UPLOAD_DIR: uploadDirOf(database), SESSION_SECRET: 'robustness-secret-0123456789' },
    stdio: ['ignore', 'pipe', 'pipe'],
    detached: true,
  });
  let log = '';
  child.stdout!.on('data', (d) => (log += d));
  child.stderr!.on('data', (d) => (log += d));
  const exited = new Promise<void>((r) => child.once('exit', () => r()));
  const alive = () => child.exitCode === null && child.signalCode === null;
  const signal = async (sig: NodeJS.Signals) => {
    if (!alive()) return;
    process.kill(-child.pid!, sig);
    await exited;
  };
  const url = `http://127.0.0.1:${port}`;
  const proc: ServerProcess = {
    url,
    child,
    output: () => log,
    kill: () => signal('SIGKILL'),
    stop: async () => {
      const timer = setTimeout(() => alive() && process.kill(-child.pid!, 'SIGKILL'), 5000);
      await signal('SIGTERM');
      clearTimeout(timer);
    },
  };
  const deadline = Date.now() + 40_000;
  for (;;) {
    if (!alive()) throw new Error(`server exited early:\n${log}`);
    try {
      if ((await fetch(`${url}/api/health`)).ok) return proc;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) {
      await proc.kill();
      throw new Error(`server did not come up in 40 s:\n${log}`);
    }
    await new Promise((r) => setTimeout(r, 200));
  }
}
