import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createInterrupt, INTERRUPTED_STATUS, withSigint, type SignalSource } from '../../../cli/interrupt';
import { runRunCommand } from '../../../cli/run';
import { scoreArchive } from '../../../cli/run-record';
import { defaultBoardSettings } from '../../../mock-device/board-session';
import { startMockServer, type MockServer } from '../../../mock-device/ws-server';
import { captureIo, root } from './run-support';

// Ctrl-C during a run: the run stops, what was captured is still written to --out, exit status 130.
// A board paced at 115,200 baud needs about 24 s for an exhaustive 16-bit sweep, so the stop
// always lands mid-run; each test waits for the first progress report, not for a time.

let slow: MockServer;
const dir = mkdtempSync(join(tmpdir(), 'anglebench-interrupt-'));
beforeAll(async () => {
  slow = await startMockServer({ ...defaultBoardSettings(), baud: 115_200 }, 0, '127.0.0.1', () => undefined);
});
afterAll(async () => {
  await slow.close();
});

const RUN = ['--plan', 'exhaustive', '--core', 'reference-16', '--limits', '{"maxModelMismatches":0}'];

describe('an interrupted run', { timeout: 60_000 }, () => {
  it('stops at the first request, writes what it captured, skips the verdict files and returns 130', async () => {
    const interrupt = createInterrupt();
    const written = new Map<string, Uint8Array>();
    const io = captureIo();
    const stderr = io.stderr;
    // Stop as soon as the run reports progress: results have arrived.
    io.stderr = (t: string) => {
      stderr(t);
      if (t.startsWith('progress:')) interrupt.request();
    };
    const status = await runRunCommand(['--device', slow.url, ...RUN, '--out', 'cut.abrc', '--junit', 'cut.xml', '--json'], io, {
      interrupt,
      writeFile: (path, bytes) => written.set(path, bytes),
    });
    expect(status).toBe(INTERRUPTED_STATUS);
    const summary = JSON.parse(io.out);
    expect(summary.status).toBe('aborted');
    expect(summary.results.answered).toBeGreaterThan(0);
    expect(summary.results.answered).toBeLessThan(65_536);
    expect(io.err).toMatch(new RegExp(`^interrupted: ${summary.results.answered} of 65536 codes answered, the capture written to cut.abrc; nothing uploaded$`, 'm'));
    // The archive holds exactly what the run scored.
    const again = scoreArchive(written.get('cut.abrc')!);
    expect(again.score.answered).toBe(summary.results.answered);
    expect([...written.keys()]).toEqual(['cut.abrc']);
  });

  it('asked to stop before the run starts, it aborts the run as it begins', async () => {
    const interrupt = createInterrupt();
    interrupt.request();
    const io = captureIo();
    const status = await runRunCommand(['--device', slow.url, ...RUN, '--json'], io, { interrupt });
    expect(status).toBe(130);
    const summary = JSON.parse(io.out);
    expect(summary.status).toBe('aborted');
    // Only what the board had already queued when the ABORT reached it (a few hundred codes at most).
    expect(summary.results.answered).toBeLessThan(65_536 / 8);
  });

  it('Ctrl-C on the real command: the archive is written, exit status 130', async () => {
    const out = join(dir, 'ctrl-c.abrc');
    const child = spawn(process.execPath, [join(root, 'bin/anglebench.js'), 'run', '--device', slow.url, ...RUN, '--out', out], { cwd: dir, stdio: ['ignore', 'pipe', 'pipe'] });
    let stderr = '';
    let stdout = '';
    child.stdout.setEncoding('utf8').on('data', (d: string) => (stdout += d));
    const closed = new Promise<number | null>((resolve) => child.on('close', resolve));
    await new Promise<void>((resolve, reject) => {
      child.stderr.setEncoding('utf8').on('data', (d: string) => {
        stderr += d;
        if (stderr.includes('progress:')) resolve();
      });
      child.on('close', () => reject(new Error(`the run ended before any progress: ${stderr}`)));
    });
    child.kill('SIGINT');
    expect(await closed).toBe(130);
    expect(stderr).toMatch(/^interrupted: stopping the run \(Ctrl-C again to quit at once\)$/m);
    expect(stderr).toMatch(/^interrupted: \d+ of 65536 codes answered, the capture written to .*ctrl-c\.abrc; nothing uploaded$/m);
    expect(stdout).toMatch(/aborted/i);
    expect(existsSync(out)).toBe(true);
    const again = scoreArchive(new Uint8Array(readFileSync(out)));
    expect(again.score.answered).toBeGreaterThan(0);
    expect(again.score.answered).toBeLessThan(65_536);
  });
});

describe('the SIGINT listener', () => {
  function fakeProcess() {
    const listeners = new Set<() => void>();
    const exits: number[] = [];
    const source: SignalSource = {
      on: (_s, l) => listeners.add(l),
      off: (_s, l) => listeners.delete(l),
      exit: ((code: number) => {
        exits.push(code);
        throw new Error(`exit ${code}`);
      }) as SignalSource['exit'],
    };
    return { source, exits, listeners, sigint: () => [...listeners].forEach((l) => l()) };
  }

  it('asks once, quits with 130 on the second Ctrl-C, and is removed when the work ends', async () => {
    const p = fakeProcess();
    const io = captureIo();
    let release = () => {};
    const done = withSigint(io, (interrupt) => new Promise<boolean>((resolve) => (release = () => resolve(interrupt.requested))), p.source);
    expect(p.listeners.size).toBe(1);
    p.sigint();
    expect(io.err).toContain('interrupted: stopping the run');
    expect(() => p.sigint()).toThrow('exit 130');
    expect(p.exits).toEqual([130]);
    release();
    expect(await done).toBe(true);
    expect(p.listeners.size).toBe(0);
  });
});
