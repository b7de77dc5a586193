import fs from 'node:fs';
import path from 'node:path';
import { build } from 'vite';
import { clientDistDir, projectRoot } from '../server/paths';

function newestMtimeMs(target: string): number {
  const stat = fs.statSync(target);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const entry of fs.readdirSync(target)) newest = Math.max(newest, newestMtimeMs(path.join(target, entry)));
  return newest;
}

/** True when dist/ is missing or older than anything the client is built from. */
export function clientIsStale(): boolean {
  const built = path.join(clientDistDir, 'index.html');
  if (!fs.existsSync(built)) return true;
  const sources = ['src', 'shared', 'public', 'index.html', 'vite.config.ts', 'package-lock.json']
    .map((p) => path.join(projectRoot, p))
    .filter((p) => fs.existsSync(p));
  return Math.max(...sources.map(newestMtimeMs)) > fs.statSync(built).mtimeMs;
}

const LOCK_DIR = path.join(projectRoot, 'node_modules', '.anglebench-client-build.lock');
const STALE_LOCK_MS = 5 * 60 * 1000;

/** Hold a directory lock while `fn` runs, so two test runs never build into dist/ at once. */
async function withBuildLock<T>(fn: () => Promise<T>): Promise<T> {
  for (;;) {
    try {
      fs.mkdirSync(LOCK_DIR);
      break;
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
      // A build that died leaves its lock behind; after a while it is taken over.
      const age = Date.now() - (fs.statSync(LOCK_DIR, { throwIfNoEntry: false })?.mtimeMs ?? Date.now());
      if (age > STALE_LOCK_MS) fs.rmSync(LOCK_DIR, { recursive: true, force: true });
      else await new Promise((r) => setTimeout(r, 250));
    }
  }
  try {
    return await fn();
  } finally {
    fs.rmSync(LOCK_DIR, { recursive: true, force: true });
  }
}

/** Build the client into dist/ unless it is up to date. */
export async function buildClientIfStale(log: (msg: string) => void = console.log): Promise<void> {
  if (!clientIsStale()) return;
  await withBuildLock(async () => {
    if (!clientIsStale()) return; // another run built it while this one waited
    log('Building the client…');
    // Always the production build: under vitest NODE_ENV is "test", and Vite would bundle React's
    // development build, which `npm start` would then serve.
    const nodeEnv = process.env.NODE_ENV;
    process.env.NODE_ENV = 'production';
    try {
      await build({ root: projectRoot, mode: 'production', logLevel: 'warn' });
    } finally {
      if (nodeEnv === undefined) delete process.env.NODE_ENV;
      else process.env.NODE_ENV = nodeEnv;
    }
  });
}
