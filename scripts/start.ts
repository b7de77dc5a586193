// `npm start`: build the client when its sources are newer than the build, migrate, and serve
// everything from one process on the embedded defaults.
import { ConfigError, loadConfig } from '../server/config';
import { startServer } from '../server/server';
import { buildClientIfStale } from './client-build';
import { defaultBoardSettings } from '../mock-device/board-session';
import { startMockServer } from '../mock-device/ws-server';

process.env.NODE_ENV ??= 'production';
try {
  const config = loadConfig();
  await buildClientIfStale();
  const server = await startServer(config);
  console.log(`\nAnglebench is running at ${server.url}${config.publicUrl ? ` (people use ${config.publicUrl})` : ''}\n`);
  if (server.demoAccounts.length) {
    const password = process.env.DEMO_PASSWORD ? 'the DEMO_PASSWORD you set' : config.demoPassword;
    console.log(`Demo sign-ins (password: ${password}):\n${server.demoAccounts.map((a) => `  ${a}`).join('\n')}\n`);
  }
  // The simulated board, so the Bench page has something to talk to out of the box.
  const board = await startMockServer(defaultBoardSettings(), config.mockWsPort).catch((err: Error) => {
    console.warn(`The simulated board could not start on port ${config.mockWsPort}: ${err.message}`);
    return null;
  });
  if (board) console.log(`Simulated board for the runner (reference-16 core, 3,000,000 baud) at ${board.url}; ${config.simBoardsMax > 0 ? `the Bench page gets boards of its own from this server (up to ${config.simBoardsMax} at once)` : 'boards hosted for the Bench page are off (SIM_BOARDS_MAX=0)'}.\n`);
  if (server.mailCatcherUrl) console.log(`E-mail is caught locally (admins read it on the outbox page).\n`);
  const stop = () => void Promise.all([server.close(), board?.close()]).then(() => process.exit(0));
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
} catch (err) {
  console.error(err instanceof ConfigError ? err.message : `Could not start: ${(err as Error).stack}`);
  process.exit(1);
}
