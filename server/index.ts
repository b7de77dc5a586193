// Listen with the configuration from the environment (`npm run dev` runs this directly).
import { ConfigError, loadConfig } from './config';
import { startServer } from './server';

try {
  const config = loadConfig();
  const server = await startServer(config);
  console.log(`Anglebench server listening on ${server.url}`);
  const stop = () => void server.close().then(() => process.exit(0));
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
} catch (err) {
  console.error(err instanceof ConfigError ? err.message : `Could not start: ${(err as Error).message}`);
  process.exit(1);
}
