import { afterEach, describe, expect, it } from 'vitest';
import WebSocket from 'ws';
import { SerialPortMock } from 'serialport';
import { startBridge, type Bridge } from '../../../cli/bridge';
import { NodeSocketLink } from '../../../cli/transport/ws-link';
import { LinkEngine } from '../../../shared/link-engine/link-engine';
import { realEngineClock } from '../../support/in-process-board';
import { mockSerialBoard } from './run-support';

const MockBinding = SerialPortMock.binding;
type MockPort = Awaited<ReturnType<typeof MockBinding.open>>;
const TOKEN = 'bench-bay-3-secret';

/** A mock serial port that records what the host writes; the test plays the board. */
function recordingPort(path: string) {
  MockBinding.createPort(path, { echo: false, record: true });
  const opened: { port?: MockPort } = {};
  const binding = {
    ...MockBinding,
    async open(options: Parameters<typeof MockBinding.open>[0]) {
      opened.port = await MockBinding.open(options);
      return opened.port;
    },
  };
  return { binding, opened };
}

/** How a connection attempt ended: opened and stayed, or closed with a code and reason. */
function connect(url: string, headers: Record<string, string> = {}) {
  const ws = new WebSocket(url, { headers });
  const closed = new Promise<{ code: number; reason: string }>((r) => ws.on('close', (code, reason) => r({ code, reason: reason.toString() })));
  const opened = new Promise<void>((r, j) => {
    ws.on('open', () => r());
    ws.on('error', j);
  });
  return { ws, closed, opened };
}

const until = async (check: () => boolean, ms = 2000) => {
  const end = Date.now() + ms;
  while (!check()) {
    if (Date.now() > end) throw new Error('timed out waiting');
    await new Promise((r) => setTimeout(r, 5));
  }
};

let bridge: Bridge | null = null;
const lines: string[] = [];
afterEach(async () => {
  await bridge?.close();
  bridge = null;
});

describe('the bridge', { timeout: 20_000 }, () => {
  it('refuses a client without the token, and one with a wrong token, with a close reason that says so', async () => {
    const { binding } = recordingPort('/dev/ttyBRIDGE0');
    bridge = await startBridge({ device: '/dev/ttyBRIDGE0', baud: 3_000_000, port: 0, host: '127.0.0.1', token: TOKEN, idleTimeoutS: 60 }, { serialBinding: binding, log: (l) => lines.push(l) });
    const none = connect(bridge.url);
    expect(await none.closed).toEqual({ code: 1008, reason: 'refused: no token (send ?token= or Authorization: Bearer)' });
    const wrong = connect(`${bridge.url}?token=not-the-token`);
    expect(await wrong.closed).toEqual({ code: 1008, reason: 'refused: wrong token' });
    expect(lines.filter((l) => l.includes('refused'))).toHaveLength(2);
  });

  it('passes every byte value both ways unchanged, with the token as a query or a bearer header', async () => {
    const { binding, opened } = recordingPort('/dev/ttyBRIDGE1');
    bridge = await startBridge({ device: '/dev/ttyBRIDGE1', baud: 3_000_000, port: 0, host: '127.0.0.1', token: TOKEN, idleTimeoutS: 60 }, { serialBinding: binding, log: (l) => lines.push(l) });
    const all = Uint8Array.from({ length: 512 }, (_, i) => i & 0xff); // 0x00..0xFF twice, SYNC bytes included
    const client = connect(bridge.url, { authorization: `Bearer ${TOKEN}` });
    await client.opened;
    const received: Buffer[] = [];
    client.ws.on('message', (d: Buffer) => received.push(d));
    client.ws.send(all.subarray(0, 100));
    client.ws.send(all.subarray(100));
    await until(() => (opened.port?.recording.length ?? 0) >= all.length);
    expect(new Uint8Array(opened.port!.recording)).toEqual(all);
    opened.port!.emitData(Buffer.from(all));
    await until(() => Buffer.concat(received).length >= all.length);
    expect(new Uint8Array(Buffer.concat(received))).toEqual(all);

    // One client at a time.
    const second = connect(`${bridge.url}?token=${TOKEN}`);
    expect((await second.closed).code).toBe(1013);
    client.ws.close();
    await until(() => lines.some((l) => /connection \d+ from .*512 B to the board, 512 B to the client/.test(l)));
  });

  it('lets a silent client go after the idle timeout', async () => {
    const { binding } = recordingPort('/dev/ttyBRIDGE2');
    bridge = await startBridge({ device: '/dev/ttyBRIDGE2', baud: 3_000_000, port: 0, host: '127.0.0.1', token: TOKEN, idleTimeoutS: 1 }, { serialBinding: binding, log: (l) => lines.push(l) });
    const client = connect(`${bridge.url}?token=${TOKEN}`);
    await client.opened;
    expect(await client.closed).toEqual({ code: 4000, reason: 'idle for 1 s' });
  });

  it('carries a whole run between the link engine and a simulated board on the serial port', async () => {
    const board = mockSerialBoard({ baud: 12_000_000 });
    bridge = await startBridge({ device: board.path, baud: 12_000_000, port: 0, host: '127.0.0.1', token: TOKEN, idleTimeoutS: 60 }, { serialBinding: board.binding, log: (l) => lines.push(l) });
    const link = await NodeSocketLink.open(`${bridge.url}?token=${TOKEN}`);
    const engine = new LinkEngine({ link, clock: realEngineClock, baud: 12_000_000 });
    await engine.hello();
    const result = await engine.run({ kind: 'sweep', start: 0, step: 1, count: 8192 }).done;
    expect(result.status).toBe('complete');
    expect(result.missing).toEqual([]);
    await link.close();
  });
});
