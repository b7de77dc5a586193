// Start server-process.ts in a child process and ask it one question at a time.
import { fork, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { BenchDialect } from './bare-driver';
import type { ServerReply, ServerRequest } from './server-process-protocol';

type Reply<K extends ServerReply['kind']> = Extract<ServerReply, { kind: K }>;

export interface ServerChild {
  child: ChildProcess;
  ready: Reply<'ready'>;
  ask(kind: 'mark'): Promise<Reply<'mark'>>;
  ask(kind: 'peak'): Promise<Reply<'peak'>>;
  ask(kind: 'bare', bytes: number): Promise<Reply<'bare'>>;
  /** Close the server and wait for the child to exit. */
  stop(): Promise<void>;
}

/** BENCH_SERVER_PROFILE=DIR: the server process also writes a CPU profile of its life into DIR. */
export async function startServerChild(dialect: BenchDialect): Promise<ServerChild> {
  const here = path.dirname(fileURLToPath(import.meta.url));
  const profile = process.env.BENCH_SERVER_PROFILE ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_SERVER_PROFILE}`] : [];
  const child = fork(path.join(here, 'server-process.ts'), [dialect], { execArgv: ['--import', 'tsx', '--expose-gc', ...profile], stdio: ['ignore', 'inherit', 'inherit', 'ipc'] });
  const next = () =>
    new Promise<ServerReply>((resolve, reject) => {
      const onExit = (code: number | null) => reject(new Error(`the benchmark's server process exited (${code})`));
      child.once('exit', onExit);
      child.once('message', (m) => {
        child.off('exit', onExit);
        resolve(m as ServerReply);
      });
    });
  const ready = (await next()) as Reply<'ready'>;
  const ask = (kind: ServerRequest['kind'], bytes = 0) => {
    const reply = next();
    child.send(kind === 'bare' ? { kind, bytes } : { kind });
    return reply;
  };
  return {
    child,
    ready,
    ask: ask as ServerChild['ask'],
    stop: async () => {
      if (child.exitCode !== null) return;
      const exited = new Promise((r) => child.once('exit', r));
      child.send({ kind: 'stop' } satisfies ServerRequest);
      await exited;
    },
  };
}
