import type { AddressInfo } from 'node:net';
import { createServer } from 'node:http';
import { createServer as createHttpsServer } from 'node:https';
import { createApp } from './app';
import type { Config } from './config';
import { openDatabase } from './db/connection';
import { withStartupLock } from './db/dialect';
import { migrate } from './db/migrator';
import { demoAccountsPresent, seedIfEmpty } from './db/seed';
import { startMailCatcher, type MailCatcher } from './mail/catcher';
import { createSmtpMailer } from './mail/mailer';
import { removeAbandonedUploads } from './uploads/bitstream-storage';

export interface RunningServer {
  url: string;
  /** Where mail goes when SMTP_URL is unset: the in-process catcher. */
  mailCatcherUrl?: string;
  /** The demo accounts present in the database, e.g. `admin@anglebench.test (admin)`. */
  demoAccounts: string[];
  close(): Promise<void>;
}

/**
 * Open the database, migrate it, seed the demo on first start, start the mail catcher unless
 * SMTP_URL is set, and listen. Used by `npm start`, `npm run dev` and the e2e tests.
 */
export async function startServer(config: Config): Promise<RunningServer> {
  const db = openDatabase(config.databaseUrl);
  await db.authenticate();
  await withStartupLock(db, async () => {
    await migrate(db);
    await seedIfEmpty(db, config.demoPassword);
  });
  let catcher: MailCatcher | undefined;
  if (!config.smtpUrl) catcher = await startMailCatcher(db);
  const mailer = createSmtpMailer(config.smtpUrl ?? catcher!.url);
  const abandoned = removeAbandonedUploads(config.uploadDir);
  if (abandoned > 0) console.log(`Removed ${abandoned} unfinished bitstream upload${abandoned === 1 ? '' : 's'} left by an earlier stop.`);
  const app = createApp({ config, db, mailer, uploadDir: config.uploadDir });
  // TLS_CERT_FILE/TLS_KEY_FILE: HTTPS on the same port, so Web Serial works from other PCs.
  const server = config.tls ? createHttpsServer({ cert: config.tls.cert, key: config.tls.key }, app) : createServer(app);
  app.sockets.attach(server);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(config.port, config.host, resolve);
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `${config.tls ? 'https' : 'http'}://${config.host === '0.0.0.0' ? '127.0.0.1' : config.host}:${port}`,
    mailCatcherUrl: catcher?.url,
    demoAccounts: await demoAccountsPresent(db),
    close: async () => {
      const closed = new Promise<void>((resolve) => server.close(() => resolve()));
      await app.sockets.close();
      await closed;
      server.closeAllConnections();
      mailer.close();
      await catcher?.close();
      await db.close();
    },
  };
}
