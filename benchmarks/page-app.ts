// The app for the page benchmark: a production build of the client (NODE_ENV=production, as
// `npm start` builds it) into benchmarks/results/client, served by createApp in production mode over
// a temporary seeded database. dist/ is not used: a test run (NODE_ENV=test) may have left a
// development React build there, which would measure React's development checks instead.
import fs from 'node:fs';
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'vite';
import { createApp } from '../server/app';
import { loadConfig } from '../server/config';
import { openDatabase } from '../server/db/connection';
import { migrate } from '../server/db/migrator';
import { seedIfEmpty } from '../server/db/seed';
import { startMailCatcher } from '../server/mail/catcher';
import { createSmtpMailer } from '../server/mail/mailer';
import { tempDatabase } from '../tests/support/temp-db';

const here = path.dirname(fileURLToPath(import.meta.url));
const root = path.resolve(here, '..');
export const BENCH_CLIENT_DIR = path.join(here, 'results', 'client');

export interface PageApp {
  url: string;
  stop(): Promise<void>;
}

/**
 * Builds the production client beside the last good one and swaps it in. Others edit the checkout
 * while the suite runs: when the build fails, the last good build is used, and the log says so.
 */
async function buildClient(): Promise<void> {
  const next = `${BENCH_CLIENT_DIR}-next`;
  const previous = process.env.NODE_ENV;
  process.env.NODE_ENV = 'production'; // read by Vite and the React plugin while building
  try {
    await build({ root, logLevel: 'error', build: { outDir: next, emptyOutDir: true } });
    fs.rmSync(BENCH_CLIENT_DIR, { recursive: true, force: true });
    fs.renameSync(next, BENCH_CLIENT_DIR);
  } catch (e) {
    const built = fs.statSync(path.join(BENCH_CLIENT_DIR, 'index.html'), { throwIfNoEntry: false });
    if (!built) throw e;
    console.log(`  the client does not build now (${(e as Error).message.split('\n')[0]}); using the build of ${built.mtime.toISOString()}`);
  } finally {
    if (previous === undefined) delete process.env.NODE_ENV;
    else process.env.NODE_ENV = previous;
  }
}

/** Builds the production client and serves it with the API; sign in with the demo accounts. */
export async function startPageApp(): Promise<PageApp> {
  // BENCH_PAGE_CLIENT=DIR serves a client already built there (another commit's, for a
  // before/after comparison on the same machine) instead of building this checkout's.
  const clientDir = process.env.BENCH_PAGE_CLIENT ? path.resolve(process.env.BENCH_PAGE_CLIENT) : BENCH_CLIENT_DIR;
  if (!process.env.BENCH_PAGE_CLIENT) await buildClient();
  const tmp = await tempDatabase();
  // The page reaches the simulated board on its own port: the CSP must allow it, as a lab's
  // BRIDGE_ORIGINS allows its bridges.
  const config = loadConfig(
    { NODE_ENV: 'production', DATABASE_URL: tmp.url, SESSION_SECRET: 'bench-secret-0123456789abcdef', BRIDGE_ORIGINS: 'ws://127.0.0.1:*' },
    path.join(tmp.dir, 'session-secret'),
  );
  const db = openDatabase(config.databaseUrl);
  await migrate(db);
  await seedIfEmpty(db, config.demoPassword);
  const catcher = await startMailCatcher(db);
  const mailer = createSmtpMailer(catcher.url);
  const http = createServer(createApp({ config, db, mailer, clientDir }));
  await new Promise<void>((resolve) => http.listen(0, '127.0.0.1', resolve));
  return {
    url: `http://127.0.0.1:${(http.address() as AddressInfo).port}`,
    stop: async () => {
      await new Promise((r) => http.close(r));
      http.closeAllConnections();
      mailer.close();
      await catcher.close();
      await db.close();
      await tmp.cleanup();
    },
  };
}
