// Helpers for the runner's tests: the real command in a child process, an in-process CLI io,
// and a @serialport/binding-mock port wired to a simulated board session.
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { SerialPortMock } from 'serialport';
import type { CliIo } from '../../../cli/io';
import { defaultBoardSettings, openBoardSession, type BoardSettings } from '../../../mock-device/board-session';

export const root = fileURLToPath(new URL('../../..', import.meta.url));

export interface CliResult {
  status: number | null;
  stdout: string;
  stderr: string;
}

/** `cli/index.ts …` in a child process; asynchronous, so an in-process board keeps answering. */
export function cli(args: string[], timeoutMs = 30_000): Promise<CliResult> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [join(root, 'node_modules/tsx/dist/cli.mjs'), 'cli/index.ts', ...args], { cwd: root, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (d: string) => (stdout += d));
    child.stderr.setEncoding('utf8').on('data', (d: string) => (stderr += d));
    const timer = setTimeout(() => child.kill('SIGKILL'), timeoutMs);
    child.on('error', reject);
    child.on('close', (status) => {
      clearTimeout(timer);
      resolve({ status, stdout, stderr });
    });
  });
}

/** Error lines only: progress lines go to stderr too. */
export const errorLines = (stderr: string) => stderr.split('\n').filter((l) => l.startsWith('error:'));

/** A CliIo that keeps what was written. */
export function captureIo(files: Record<string, string> = {}): CliIo & { out: string; err: string } {
  const io = {
    out: '',
    err: '',
    stdout: (t: string) => void (io.out += t),
    stderr: (t: string) => void (io.err += t),
    readFile: (p: string) => {
      if (!(p in files)) throw Object.assign(new Error('no such file'), { code: 'ENOENT' });
      return files[p];
    },
  };
  return io;
}

// @serialport/binding-mock's MockBinding, reached through serialport's own re-export (the mock
// package's types do not resolve under this project's module settings).
const MockBinding = SerialPortMock.binding;
type MockPortBinding = Awaited<ReturnType<typeof MockBinding.open>>;

let nextPort = 0;

/**
 * A serialport binding whose ports are mock ports with a simulated board behind them: what the
 * host writes reaches the board, what the board sends arrives as port data.
 */
export function mockSerialBoard(overrides: Partial<BoardSettings> = {}) {
  const path = `/dev/ttyANGLE${nextPort++}`;
  MockBinding.createPort(path, { echo: false, record: false });
  const settings = { ...defaultBoardSettings(), ...overrides };
  const binding = {
    ...MockBinding,
    async open(options: Parameters<typeof MockBinding.open>[0]): Promise<MockPortBinding> {
      const port = await MockBinding.open(options);
      const session = openBoardSession(settings, (bytes) => port.isOpen && port.emitData(Buffer.from(bytes)));
      const write = port.write.bind(port);
      port.write = async (buffer: Buffer) => {
        await write(buffer);
        session.receive(new Uint8Array(buffer));
      };
      const close = port.close.bind(port);
      port.close = async () => {
        session.close();
        await close();
      };
      return port;
    },
  };
  return { path, binding };
}
