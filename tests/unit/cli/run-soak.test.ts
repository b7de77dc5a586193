// `run --soak` and `run --condition` against the simulated board over WebSocket, in this process.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runRunCommand } from '../../../cli/run';
import { defaultBoardSettings } from '../../../mock-device/board-session';
import { parseFlakyFault, type CoreFlip } from '../../../mock-device/flaky-core';
import { startMockServer, type MockServer } from '../../../mock-device/ws-server';
import { captureIo } from './run-support';

let flaky: MockServer;
const flips: CoreFlip[] = [];

beforeAll(async () => {
  flaky = await startMockServer(
    { ...defaultBoardSettings(), baud: 12_000_000, flaky: parseFlakyFault('flaky:0.003'), seed: 5, onCoreFlip: (f) => flips.push(f), conditions: { temperature_c: 85, other: { chamber: 'B' } } },
    0,
    '127.0.0.1',
    () => {},
  );
});
afterAll(async () => {
  await flaky.close();
});

const run = async (...args: string[]) => {
  const io = captureIo();
  const status = await runRunCommand(['--device', flaky.url, '--plan', 'sweep:0,16,2048', '--core', 'reference-16', ...args], io, { stderrIsTty: false });
  return { status, out: io.out, err: io.err };
};

describe('run --soak', { timeout: 30_000 }, () => {
  it('repeats the plan, lists the unstable codes and fails maxUnstableCodes on a flaky board', async () => {
    flips.length = 0;
    const r = await run('--soak', '6', '--condition', 'vccint_v=0.95', '--condition', 'temperature_c=90', '--limits', '{"maxUnstableCodes":0}', '--json');
    expect(r.status).toBe(1);
    const out = JSON.parse(r.out);
    expect(out.soak.summary).toMatchObject({ passes: 6, codesPerPass: 2048, linkErrors: 0 });
    expect(out.soak.timeline).toHaveLength(6);
    expect(out.soak.timeline.map((p: { pass: number }) => p.pass)).toEqual([1, 2, 3, 4, 5, 6]);
    // The board's own record: every flipped code is listed, nothing else.
    const flipped = [...new Set(flips.map((f) => f.code))].sort((a, b) => a - b);
    expect(out.soak.unstable.codes.map((u: { code: number }) => u.code)).toEqual(flipped);
    expect(out.soak.unstable.count).toBe(flipped.length);
    // --condition wins over the board's report name by name; the board's other pairs are kept.
    expect(out.conditions).toEqual({ temperature_c: 90, vccint_v: 0.95, other: { chamber: 'B' } });
    expect(out.verdict.checks).toEqual([{ key: 'maxUnstableCodes', limit: 0, value: flipped.length, outcome: 'fail' }]);
    expect(r.err).toMatch(/^soak pass 6\/6: 2,048 answered, \d+ mismatches, 0 link errors, \d+ unstable codes so far/m);
  });

  it('runs for a duration in whole passes and prints the soak in the human report', async () => {
    const r = await run('--soak', '1s');
    expect(r.status).toBe(0);
    expect(r.out).toMatch(/^conditions temperature_c=85, chamber=B \(the board reported/m);
    expect(r.out).toMatch(/^soak 1 s: \d+ passes of 2,048 codes/m);
    expect(r.out).toMatch(/^ {2}unstable codes: \d+/m);
  });

  it('leaves maxUnstableCodes unchecked without a soak', async () => {
    const r = await run('--limits', '{"maxUnstableCodes":0}', '--json');
    const out = JSON.parse(r.out);
    expect(out.soak).toBeNull();
    expect(out.verdict.checks).toEqual([{ key: 'maxUnstableCodes', limit: 0, value: null, outcome: 'skip', note: 'needs a soak (--soak)' }]);
  });

  it('refuses bad input with one clear line and exit status 2', async () => {
    const cases: Array<[string[], string]> = [
      [['--soak', '0'], 'error: --soak: a soak needs at least 1 pass, got 0'],
      [['--soak', 'forever'], 'error: --soak: a soak is a number of passes (50) or a duration (90s, 30m, 2h), got "forever"'],
      [['--condition', 'temperature_c'], 'error: --condition: a condition is name=value (e.g. temperature_c=85), got "temperature_c"'],
      [['--condition', 'temperature_c=400'], 'error: --condition: temperature_c must be -70..200 °C, got 400'],
      [['--condition', 'vccint_v=low'], 'error: --condition: vccint_v must be a number in V, got "low"'],
    ];
    for (const [args, line] of cases) {
      const r = await run(...args);
      expect(r.status, args.join(' ')).toBe(2);
      // The error line, then the usage line the runner adds to any bad command line.
      expect(r.err.split('\n')[0]).toBe(line);
      expect(r.err.split('\n')[1]).toMatch(/^usage: /);
      expect(r.out).toBe('');
    }
  });
});
