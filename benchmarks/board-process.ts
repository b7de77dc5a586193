// The simulated board in a child process of its own (`npm run mock`), so the host under test and
// the board never share one event loop. Resolves once the board says it is listening.
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { freePort } from '../tests/e2e/harness';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

export interface BoardProcess {
  url: string;
  /** What the board printed (its per-connection byte counts among it). */
  output(): string;
  stop(): Promise<void>;
}

/** `extraArgs`: more `npm run mock` options (`--mode vectoring`). */
export async function startBoardProcess(baud: number, extraArgs: string[] = []): Promise<BoardProcess> {
  const port = await freePort();
  const child: ChildProcess = spawn(process.execPath, [path.join(root, 'node_modules/tsx/dist/cli.mjs'), 'mock-device/index.ts', '--ws-port', String(port), '--baud', String(baud), ...extraArgs], {
    cwd: root,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let log = '';
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const stop = async () => {
    if (child.exitCode === null && child.signalCode === null) {
      child.kill('SIGTERM');
      const timer = setTimeout(() => child.kill('SIGKILL'), 3000);
      await exited;
      clearTimeout(timer);
    }
  };
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`the simulated board did not start in 20 s:\n${log}`)), 20_000);
    child.stdout!.on('data', (d) => {
      log += d;
      if (!log.includes('listening on')) return;
      clearTimeout(timer);
      resolve();
    });
    child.stderr!.on('data', (d) => (log += d));
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`the simulated board exited with ${code}:\n${log}`));
    });
  });
  return { url: `ws://127.0.0.1:${port}/`, output: () => log, stop };
}
