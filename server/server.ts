import type { AddressInfo } from 'node:net';
import { createServer } from 'node:http';
import { createApp } from './app';
import type { Config } from './config';
import { openDatabase } from './db/connection';
import { migrate } from './db/migrator';

export interface RunningServer {
  url: string;
  close(): Promise<void>;
}

/** Open the database, migrate it, and listen. Used by `npm start`, `npm run dev` and the e2e tests. */
export async function startServer(config: Config): Promise<RunningServer> {
  const db = openDatabase(config.databaseUrl);
  await db.authenticate();
  await migrate(db);
  const app = createApp({ config, db });
  const server = createServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(config.port, config.host, resolve);
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://${config.host === '0.0.0.0' ? '127.0.0.1' : config.host}:${port}`,
    close: async () => {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
      await db.close();
    },
  };
}
