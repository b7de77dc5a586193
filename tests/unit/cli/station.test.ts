// `bridge --server`: the station's command line, and the station against a stand-in server (a
// WebSocket server in the test) with its device a mock serial port (serialport's own SerialPortMock).
import type { IncomingMessage } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterEach, describe, expect, it } from 'vitest';
import { SerialPortMock } from 'serialport';
import { WebSocketServer, type WebSocket } from 'ws';
import { parseStationArgs, startStation, type Station } from '../../../cli/station';
import { parseRunArgs } from '../../../cli/run-options';
import { openDevice, stationDriveUrl } from '../../../cli/device';
import { Backoff } from '../../../shared/stations/backoff';
import { STATION_MAX_MESSAGE_BYTES } from '../../../shared/stations/wire';
import { cli } from './run-support';

const MockBinding = SerialPortMock.binding;
type MockPort = Awaited<ReturnType<typeof MockBinding.open>>;

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

/** A stand-in for the team server's /api/stations/connect: accepts, says "registered", keeps what it hears. */
async function standIn({ autoPong = true } = {}) {
  const wss = new WebSocketServer({ port: 0, host: '127.0.0.1', autoPong });
  const connections: Array<{ ws: WebSocket; req: IncomingMessage; received: Buffer[] }> = [];
  wss.on('connection', (ws, req) => {
    const c = { ws, req, received: [] as Buffer[] };
    connections.push(c);
    ws.on('message', (d: Buffer, isBinary) => isBinary && c.received.push(d));
    ws.send(JSON.stringify({ type: 'registered', name: 'x' }));
  });
  await new Promise<void>((r) => wss.once('listening', () => r()));
  const port = (wss.address() as AddressInfo).port;
  return { url: `http://127.0.0.1:${port}`, connections, close: () => new Promise<void>((r) => wss.close(() => r())) };
}

const until = async (check: () => boolean, ms = 5000) => {
  const end = Date.now() + ms;
  while (!check()) {
    if (Date.now() > end) throw new Error('timed out waiting');
    await new Promise((r) => setTimeout(r, 5));
  }
};

const base = ['--server', 'https://lab.example:3000', '--token', 'ab_secret', '--device', '/dev/ttyUSB0', '--name', 'Bay 3 / bench A'];

describe('bridge --server: the command line', () => {
  it('reads the station options, with the default baud', () => {
    expect(parseStationArgs(base)).toEqual({ server: 'https://lab.example:3000', token: 'ab_secret', device: '/dev/ttyUSB0', name: 'Bay 3 / bench A', baud: 3_000_000, ca: null, insecure: false });
    expect(parseStationArgs([...base, '--baud', '921600', '--ca', 'lab.pem'])).toMatchObject({ baud: 921_600, ca: 'lab.pem' });
  });

  it('names the option at fault', () => {
    expect(() => parseStationArgs(base.filter((a, i) => i !== 2 && i !== 3))).toThrow(/--token is required/);
    expect(() => parseStationArgs(['--server', 'lab.example', ...base.slice(2)])).toThrow(/--server must be the server's http:\/\/ or https:\/\/ address/);
    expect(() => parseStationArgs([...base, '--baud', '12'])).toThrow(/^--baud must be an integer 9600..12000000, got "12"$/);
    expect(() => parseStationArgs(base.slice(0, 6))).toThrow(/^--name must be 1 to 80 printable characters$/);
    expect(() => parseStationArgs([...base, '--ca', 'a.pem', '--insecure'])).toThrow(/--ca and --insecure contradict/);
  });

  it('is what `bridge` runs when --server is given; without it the listening bridge answers', { timeout: 30_000 }, async () => {
    const station = await cli(['bridge', '--server', 'http://127.0.0.1:9', '--help']);
    expect(station.status).toBe(0);
    expect(station.stdout).toMatch(/^usage: anglebench bridge --server URL --token T --device D --name NAME/);
    const listening = await cli(['bridge', '--help']);
    expect(listening.stdout).toMatch(/--ws-port N/);
    expect(listening.stdout).toMatch(/With --server URL the bridge dials the team server as a station/);
  });
});

describe('run --device station:NAME', () => {
  it('needs --server and --token, and drives the station at its URL-encoded drive address (wss under https)', async () => {
    expect(() => parseRunArgs(['--device', 'station:Bay 3', '--plan', 'edges', '--core', 'c'])).toThrow(/^--device station:Bay 3 needs --server and --token/);
    expect(parseRunArgs(['--device', 'station:Bay 3', '--plan', 'edges', '--core', 'c', '--server', 'https://lab.example', '--token', 't']).device).toBe('station:Bay 3');
    expect(stationDriveUrl('https://lab.example:3000', 'Bay 3 / bench A')).toBe('wss://lab.example:3000/api/stations/Bay%203%20%2F%20bench%20A/drive');
    expect(stationDriveUrl('http://10.0.0.5:3000', 'b')).toBe('ws://10.0.0.5:3000/api/stations/b/drive');
    await expect(openDevice('station:Bay 3', 3_000_000, {})).rejects.toThrow(/needs --server and --token/);
  });
});

describe('bridge --server: the station', { timeout: 20_000 }, () => {
  let station: Station | null = null;
  let server: Awaited<ReturnType<typeof standIn>> | null = null;
  afterEach(async () => {
    await station?.close();
    await server?.close();
    station = null;
    server = null;
  });

  it('dials with its registration and the token, and passes every byte value both ways unchanged', async () => {
    server = await standIn();
    const { binding, opened } = recordingPort('/dev/ttySTATION0');
    station = await startStation({ server: server.url, token: 'ab_secret', device: '/dev/ttySTATION0', name: 'Bay 3 / bench A', baud: 921_600, ca: null, insecure: false }, { serialBinding: binding, log: () => undefined });
    await until(() => station!.online);
    const c = server.connections[0];
    const url = new URL(c.req.url!, 'ws://x');
    expect(url.pathname).toBe('/api/stations/connect');
    expect(Object.fromEntries(url.searchParams)).toEqual({ name: 'Bay 3 / bench A', device: '/dev/ttySTATION0', baud: '921600' });
    expect(c.req.headers.authorization).toBe('Bearer ab_secret');

    const all = Uint8Array.from({ length: 512 }, (_, i) => i & 0xff);
    c.ws.send(all);
    c.ws.send(JSON.stringify({ type: 'driven', by: 'Someone', since: 'now' })); // a note: never reaches the board
    await until(() => (opened.port?.recording.length ?? 0) >= all.length);
    expect(new Uint8Array(opened.port!.recording)).toEqual(all);
    opened.port!.emitData(Buffer.from(all));
    await until(() => Buffer.concat(c.received).length >= all.length);
    expect(new Uint8Array(Buffer.concat(c.received))).toEqual(all);
    expect(opened.port!.recording.length).toBe(all.length);
  });

  it('never sends a message over the relay\'s size limit, however much the device hands it at once', async () => {
    server = await standIn();
    // The device: a stand-in board on a WebSocket that answers with one large message.
    const board = new WebSocketServer({ port: 0, host: '127.0.0.1' });
    await new Promise<void>((r) => board.once('listening', () => r()));
    const boardSockets: WebSocket[] = [];
    board.on('connection', (ws) => boardSockets.push(ws));
    station = await startStation({ server: server.url, token: 'ab_secret', device: `ws://127.0.0.1:${(board.address() as AddressInfo).port}/`, name: 'Bay 6', baud: 12_000_000, ca: null, insecure: false }, { log: () => undefined });
    await until(() => station!.online && boardSockets.length === 1);
    const big = Uint8Array.from({ length: 3 * STATION_MAX_MESSAGE_BYTES + 117 }, (_, i) => (i * 31) & 0xff);
    boardSockets[0].send(big);
    const c = server.connections[0];
    await until(() => Buffer.concat(c.received).length >= big.length);
    expect(new Uint8Array(Buffer.concat(c.received))).toEqual(big);
    expect(c.received.map((m) => m.length)).toEqual([STATION_MAX_MESSAGE_BYTES, STATION_MAX_MESSAGE_BYTES, STATION_MAX_MESSAGE_BYTES, 117]);
    await station.close();
    await new Promise<void>((r) => board.close(() => r()));
  });

  it('dials again with backoff when the server drops it, and when the server stops answering pings', async () => {
    server = await standIn({ autoPong: false });
    const { binding } = recordingPort('/dev/ttySTATION1');
    const lines: string[] = [];
    station = await startStation(
      { server: server.url, token: 'ab_secret', device: '/dev/ttySTATION1', name: 'Bay 4', baud: 3_000_000, ca: null, insecure: false },
      { serialBinding: binding, log: (l) => lines.push(l), heartbeatMs: 50, backoff: new Backoff({ baseMs: 20, capMs: 40, random: () => 0.5 }) },
    );
    await until(() => server!.connections.length >= 2);
    expect(lines.some((l) => l.includes('no answer from the server'))).toBe(true);
    server.connections.at(-1)!.ws.terminate();
    await until(() => server!.connections.length >= 3);
    expect(lines.some((l) => /offline: code 1006; dialling again in 0\.\d s/.test(l))).toBe(true);
  });

  it('ends with the reason, and closes its server connection with 1011, when its device goes away', async () => {
    server = await standIn();
    // The device: a stand-in simulated board on a WebSocket, dropped under the station.
    const board = new WebSocketServer({ port: 0, host: '127.0.0.1' });
    await new Promise<void>((r) => board.once('listening', () => r()));
    const boardSockets: WebSocket[] = [];
    board.on('connection', (ws) => boardSockets.push(ws));
    const device = `ws://127.0.0.1:${(board.address() as AddressInfo).port}/`;
    station = await startStation({ server: server.url, token: 'ab_secret', device, name: 'Bay 5', baud: 3_000_000, ca: null, insecure: false }, { log: () => undefined });
    await until(() => station!.online && boardSockets.length === 1);
    const closed = new Promise<{ code: number; reason: string }>((r) => server!.connections[0].ws.on('close', (code, reason) => r({ code, reason: reason.toString() })));
    boardSockets[0].terminate();
    expect(await station.ended).toBe('the device went away: The device closed the connection (code 1006)');
    expect(await closed).toEqual({ code: 1011, reason: 'the device went away: The device closed the connection (code 1006)' });
    await new Promise<void>((r) => board.close(() => r()));
  });
});
