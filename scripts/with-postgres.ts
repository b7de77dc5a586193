// `tsx scripts/with-postgres.ts -- COMMAND…`: run COMMAND with a throwaway PostgreSQL cluster,
// its admin URL in ANGLEBENCH_TEST_PG (the tests make a database per file from it), and remove
// the cluster afterwards, whatever the command did. `npm run test:pg` runs the server and
// robustness tests this way.
// Without a command (`npm run dev:pg`) it makes a database `anglebench`, prints its DATABASE_URL
// and keeps the cluster until Ctrl-C.
// If PostgreSQL cannot be installed or started, it fails with a one-line reason: never a skip.
import { spawn, type ChildProcess } from 'node:child_process';
import os from 'node:os';
import pg from 'pg';
import { PostgresUnavailable, startCluster, type Cluster } from './postgres-cluster';

const dash = process.argv.indexOf('--');
const command = dash === -1 ? process.argv.slice(2) : process.argv.slice(dash + 1);

let child: ChildProcess | undefined;
let finishing: Promise<void> | undefined;
let cluster: Cluster | undefined;

// A signal while the cluster starts is kept and acted on once it has (and can be stopped).
let interrupted: number | undefined;
const onSignal = (signal: NodeJS.Signals) => {
  const code = 128 + os.constants.signals[signal];
  if (cluster) void finish(code);
  else interrupted ??= code;
};
for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) process.on(signal, onSignal);

try {
  cluster = await startCluster();
} catch (err) {
  console.error(err instanceof PostgresUnavailable ? `with-postgres: ${err.message}` : `with-postgres: PostgreSQL could not start: ${(err as Error).message}`);
  process.exit(interrupted ?? 1);
}
if (interrupted !== undefined) await finish(interrupted);

/**
 * Stop the command (if any) first, so it does not fail on a vanished database, then the cluster;
 * exit with the first code given. Called again (the command exiting because we stopped it), it
 * waits for the first call's work.
 */
async function finish(code: number): Promise<never> {
  finishing ??= (async () => {
    if (child && child.exitCode === null && child.signalCode === null) {
      const exited = new Promise((r) => child!.once('exit', r));
      child.kill('SIGTERM');
      const timer = setTimeout(() => child!.kill('SIGKILL'), 10_000);
      await exited;
      clearTimeout(timer);
    }
    await cluster?.stop();
    process.exit(code);
  })();
  await finishing;
  return process.exit(code);
}
process.on('uncaughtException', (err) => {
  console.error(err);
  void finish(1);
});

if (command.length === 0) {
  const admin = new pg.Client({ connectionString: cluster.adminUrl });
  await admin.connect();
  await admin.query('CREATE DATABASE anglebench');
  await admin.end();
  console.log(`PostgreSQL is running (a throwaway cluster; Ctrl-C stops it and deletes its data).\n\nDATABASE_URL=${cluster.urlOf('anglebench')}\n`);
  // Held open by the cluster's process until a signal arrives.
} else {
  child = spawn(command[0], command.slice(1), { stdio: 'inherit', env: { ...process.env, ANGLEBENCH_TEST_PG: cluster.adminUrl } });
  child.once('error', (err) => {
    console.error(`${command[0]}: ${err.message}`);
    void finish(1);
  });
  child.once('exit', (code, signal) => void finish(code ?? (signal ? 128 + os.constants.signals[signal] : 1)));
}
