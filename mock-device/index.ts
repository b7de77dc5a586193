// `npm run mock -- …`: the simulated board as its own process.
import { parseBoardArgs, USAGE } from './options';
import { startMockServer } from './ws-server';

try {
  const { port, settings } = parseBoardArgs(process.argv.slice(2));
  const server = await startMockServer(settings, port);
  const fault = [settings.coreFault, settings.flaky, settings.vector?.fault].filter(Boolean).map((f) => `, core fault ${JSON.stringify(f)}`).join('');
  console.log(`Simulated ${settings.vector ? 'vectoring ' : ''}board listening on ${server.url} at ${settings.baud} baud${fault}`);
  const stop = () => void server.close().then(() => process.exit(0));
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
} catch (err) {
  console.error(`mock: ${(err as Error).message}\n${USAGE}`);
  process.exit(2);
}
