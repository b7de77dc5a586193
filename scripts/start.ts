// `npm start`: build the client when its sources are newer than the build, migrate, and serve
// everything from one process on the embedded defaults.
import { ConfigError, loadConfig } from '../server/config';
import { startServer } from '../server/server';
import { buildClientIfStale } from './client-build';

process.env.NODE_ENV ??= 'production';
try {
  const config = loadConfig();
  await buildClientIfStale();
  const server = await startServer(config);
  console.log(`\nAnglebench is running at ${server.url}\n`);
  const stop = () => void server.close().then(() => process.exit(0));
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
} catch (err) {
  console.error(err instanceof ConfigError ? err.message : `Could not start: ${(err as Error).stack}`);
  process.exit(1);
}
