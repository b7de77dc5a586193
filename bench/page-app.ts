// The app for the page benchmark: a production build of the client (NODE_ENV=production, as
// `npm start` builds it) into bench/results/client, served by createApp in production mode over
// a temporary seeded database. dist/ is not used: a test run (NODE_ENV=test) may have left a
// development React build there, which would measure React's development checks instead.
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

/** Builds the production client and serves it with the API; sign in with the demo accounts. */
export async function startPageApp(): Promise<PageApp> {
  const previous = process.env.NODE_ENV;
  process.env.NODE_ENV = 'production'; // read by Vite and the React plugin while building
  try {
    await build({ root, logLevel: 'error', build: { outDir: BENCH_CLIENT_DIR, emptyOutDir: true } });
  } finally {
    if (previous === undefined) delete process.env.NODE_ENV;
    else process.env.NODE_ENV = previous;
  }
  const tmp = tempDatabase();
  const config = loadConfig({ NODE_ENV: 'production', DATABASE_URL: tmp.url, SESSION_SECRET: 'bench-secret-0123456789abcdef' }, path.join(tmp.dir, 'session-secret'));
  const db = openDatabase(config.databaseUrl);
  await migrate(db);
  await seedIfEmpty(db, config.demoPassword);
  const catcher = await startMailCatcher(db);
  const mailer = createSmtpMailer(catcher.url);
  const http = createServer(createApp({ config, db, mailer, clientDir: BENCH_CLIENT_DIR }));
  await new Promise<void>((resolve) => http.listen(0, '127.0.0.1', resolve));
  return {
    url: `http://127.0.0.1:${(http.address() as AddressInfo).port}`,
    stop: async () => {
      await new Promise((r) => http.close(r));
      http.closeAllConnections();
      mailer.close();
      await catcher.close();
      await db.close();
      tmp.cleanup();
    },
  };
}
