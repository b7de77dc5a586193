import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import WebSocket from 'ws';
import { NodeSocketLink } from '../../../cli/transport/ws-link';
import { LinkEngine } from '../../../shared/link-engine/link-engine';
import { createCordicModel } from '../../../shared/numeric';
import { defaultBoardSettings } from '../../../mock-device/board-session';
import { startMockServer, type MockServer } from '../../../mock-device/ws-server';
import { parseBoardArgs } from '../../../mock-device/options';
import { realEngineClock } from '../../support/in-process-board';

let server: MockServer;
const lines: string[] = [];
const lineWaiters: Array<{ match: (line: string) => boolean; resolve: (line: string) => void }> = [];

/** The next log line that `match`es, from now on: the board logs a connection once it is over. */
function nextLine(match: (line: string) => boolean): Promise<string> {
  return new Promise((resolve) => lineWaiters.push({ match, resolve }));
}
const connectionEnded = (line: string) => /^\[board\] connection \d+ from [^ ]+: /.test(line) && !line.includes('refused');

beforeAll(async () => {
  server = await startMockServer({ ...defaultBoardSettings(), baud: 3_000_000 }, 0, '127.0.0.1', (l) => {
    lines.push(l);
    for (const w of lineWaiters.filter((x) => x.match(l))) {
      lineWaiters.splice(lineWaiters.indexOf(w), 1);
      w.resolve(l);
    }
  });
});
afterAll(() => server.close());

describe('the simulated board over a real WebSocket', () => {
  it('runs an exhaustive 16-bit sweep bit-exact with the model, never faster than the line allows', async () => {
    const link = await NodeSocketLink.open(server.url);
    const engine = new LinkEngine({ link, clock: realEngineClock, baud: 3_000_000 });
    await engine.hello();
    const t0 = performance.now();
    const result = await engine.run({ kind: 'sweep', start: 0, step: 1, count: 65_536 }).done;
    const elapsedS = (performance.now() - t0) / 1000;
    expect(result.status).toBe('complete');
    expect(result.missing).toEqual([]);
    const cos = new Int32Array(65_536);
    const sin = new Int32Array(65_536);
    createCordicModel({}).evaluateInto(result.codes, cos, sin);
    expect(Buffer.from(result.cos.buffer).equals(Buffer.from(cos.buffer))).toBe(true);
    expect(Buffer.from(result.sin.buffer).equals(Buffer.from(sin.buffer))).toBe(true);
    // docs/protocol.md "7. Throughput": 65,536 results need at least 0.906 s on the wire at 3,000,000 baud.
    expect(elapsedS).toBeGreaterThan(0.9);
    expect(result.figures.lineShare).toBeLessThanOrEqual(1);
    await link.close();
  });

  it('turns a second client away with a clear reason while one is connected', async () => {
    const first = await NodeSocketLink.open(server.url);
    await expect(NodeSocketLink.open(server.url)).rejects.toThrow(/another client/);
    const freed = nextLine(connectionEnded);
    await first.close();
    await freed; // the board has let the first client go
    const again = await NodeSocketLink.open(server.url);
    await again.close();
  });

  it('survives garbage, text and oversized messages, and still answers HELLO', async () => {
    const raw = new WebSocket(server.url);
    await new Promise((r) => raw.once('open', r));
    raw.send(Buffer.from(Array.from({ length: 5000 }, (_, i) => (i * 131) & 0xff)));
    raw.send('not bytes at all');
    const closed = new Promise<number>((r) => raw.once('close', (code) => r(code)));
    raw.send(Buffer.alloc(200_000));
    const freed = nextLine(connectionEnded);
    expect(await closed).toBe(1009); // message too big
    await freed;
    const link = await NodeSocketLink.open(server.url);
    const engine = new LinkEngine({ link, clock: realEngineClock });
    expect((await engine.hello()).name).toBe('Anglebench simulated board');
    await link.close();
  });

  it('logs one line per connection, when it ends', async () => {
    const before = lines.length;
    for (let i = 0; i < 2; i++) {
      const ended = nextLine(connectionEnded);
      const link = await NodeSocketLink.open(server.url);
      await link.close();
      await ended;
    }
    expect(lines.slice(before)).toEqual([expect.stringMatching(/^\[board\] connection \d+ from 127\.0\.0\.1:\d+: /), expect.stringMatching(/^\[board\] connection \d+ from 127\.0\.0\.1:\d+: /)]);
    expect(lines.every((l) => l.startsWith('[board] connection'))).toBe(true);
  });
});

describe('the simulated board command line', () => {
  it('reads every option and names a bad one', () => {
    const { port, settings } = parseBoardArgs(['--ws-port', '6000', '--baud', '921600', '--queue-depth', '64', '--core-fault', 'sign:5', '--line-faults', 'ber=1e-5,seed=3', '--core', '{"outBits":18,"outFrac":16}']);
    expect(port).toBe(6000);
    expect(settings).toMatchObject({ baud: 921_600, queueDepth: 64, coreFault: { config: {}, fault: { kind: 'sign-slip', iteration: 5 } }, lineFaults: { ber: 1e-5, seed: 3 } });
    expect(settings.core).toMatchObject({ outBits: 18, outFrac: 16 });
    expect(() => parseBoardArgs(['--baud', 'fast'])).toThrow(/--baud/);
    expect(() => parseBoardArgs(['--core-fault', 'melt'])).toThrow(/--core-fault/);
    expect(() => parseBoardArgs(['--core', '{"iterations":99}'])).toThrow(/iterations/);
  });
});
