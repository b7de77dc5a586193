// The simulated board's WebSocket and the bench bridge fed garbage, text and oversized messages:
// they stay up, answer what can be answered (or pass bytes on unchanged), close only the client
// at fault, and take a new client afterwards.
import { SerialPortMock } from 'serialport';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import WebSocket from 'ws';
import { startBridge, type Bridge } from '../../cli/bridge';
import { defaultBoardSettings } from '../../mock-device/board-session';
import { seededRandom } from '../../mock-device/line-faults';
import { startMockServer, type MockServer } from '../../mock-device/ws-server';
import { FrameDecoder, type DecodedFrame } from '../../shared/link/decoder';
import { encodeFrame } from '../../shared/link/frame';
import { Kind, NakReason } from '../../shared/link/kinds';
import { decodePayload, encodeMessage } from '../../shared/link/payloads';
import { DEFAULT_PROFILE } from '../../shared/link/wire-profile';
import { createCordicModel } from '../../shared/numeric';

/** Both servers refuse messages above 64 KiB (MAX_MESSAGE_BYTES in ws-server.ts and bridge.ts). */
const OVERSIZED = 64 * 1024 + 1;
/** RFC 6455 section 7.4.1: 1009, a message too big to process. */
const MESSAGE_TOO_BIG = 1009;

function client(url: string, headers: Record<string, string> = {}) {
  const ws = new WebSocket(url, { headers });
  const frames: DecodedFrame[] = [];
  const decoder = new FrameDecoder({ accept: 'replies', onFrame: (f) => frames.push(f) });
  ws.on('message', (d: Buffer) => decoder.push(new Uint8Array(d)));
  const closed = new Promise<number>((r) => ws.on('close', (code) => r(code)));
  const opened = new Promise<void>((r, j) => {
    ws.on('open', () => r());
    ws.on('error', j);
  });
  return { ws, frames, closed, opened };
}

/**
 * The one-client servers log a line when a connection is over, after freeing their slot: a test
 * waits for that line before the next client, rather than for a time.
 */
function connectionEnds() {
  const waiters: Array<() => void> = [];
  return {
    log: (line: string) => {
      if (/^\[(board|bridge)\] connection \d+ from \S+: /.test(line)) waiters.splice(0).forEach((w) => w());
    },
    /** Settles at the next end of a connection (call it before closing). */
    next: () => new Promise<void>((resolve) => waiters.push(resolve)),
  };
}

const until = async (check: () => boolean, ms = 3000) => {
  const end = Date.now() + ms;
  while (!check()) {
    if (Date.now() > end) throw new Error('timed out waiting');
    await new Promise((r) => setTimeout(r, 5));
  }
};

const garbage = (n: number, seed: number) => {
  const random = seededRandom(seed);
  return Uint8Array.from({ length: n }, () => Math.floor(random() * 256));
};

describe('the simulated board WebSocket under hostile input', () => {
  let server: MockServer;
  const ends = connectionEnds();
  beforeAll(async () => {
    server = await startMockServer({ ...defaultBoardSettings(), baud: 12_000_000 }, 0, '127.0.0.1', ends.log);
  });
  afterAll(() => server?.close());

  it('after 64 KiB of random bytes and a text message, still answers HELLO, and NAKs a bad CHECK, an unknown KIND and a bad LEN', async () => {
    const c = client(server.url);
    await c.opened;
    const junk = garbage(64 * 1024, 1);
    for (let at = 0; at < junk.length; at += 1024) c.ws.send(junk.subarray(at, at + 1024));
    c.ws.send('HELLO, board?'); // text: ignored
    // Flush: a run of zeros ends any frame the garbage left half-open (at most 259 bytes).
    c.ws.send(new Uint8Array(300));
    const badCheck = encodeFrame(Kind.Hello, 0x31);
    badCheck[badCheck.length - 1] ^= 0xff;
    c.ws.send(badCheck);
    c.ws.send(encodeFrame(0x55, 0x32));
    c.ws.send(encodeFrame(Kind.One, 0x33, new Uint8Array(5)));
    c.ws.send(encodeFrame(Kind.Hello, 0x34));
    // The garbage draws NAKs of its own, with random TAGs: the answer to each request is the last.
    const tagged = (tag: number) => c.frames.findLast((f) => f.tag === tag);
    await until(() => [0x31, 0x32, 0x33, 0x34].every((t) => tagged(t)));
    const nak = (tag: number) => decodePayload(tagged(tag)!.kind, tagged(tag)!.payload, DEFAULT_PROFILE);
    expect(nak(0x31)).toEqual({ kind: Kind.Nak, refused: Kind.Hello, reason: NakReason.BadCheck });
    expect(nak(0x32)).toEqual({ kind: Kind.Nak, refused: 0x55, reason: NakReason.UnknownKind });
    expect(nak(0x33)).toEqual({ kind: Kind.Nak, refused: Kind.One, reason: NakReason.BadLength });
    expect(tagged(0x34)!.kind).toBe(Kind.Info);
    expect(c.ws.readyState).toBe(WebSocket.OPEN);
    const freed = ends.next();
    c.ws.close();
    await c.closed;
    await freed;
  });

  it('closes a client that sends an oversized message with 1009, and then serves a new client correctly', async () => {
    const big = client(server.url);
    await big.opened;
    const bigFreed = ends.next();
    big.ws.send(new Uint8Array(OVERSIZED));
    expect(await big.closed).toBe(MESSAGE_TOO_BIG);
    await bigFreed;

    const next = client(server.url);
    await next.opened;
    const code = 12_345;
    next.ws.send(encodeMessage({ kind: Kind.One, angleCode: code }, 0x40, DEFAULT_PROFILE));
    await until(() => next.frames.some((f) => f.tag === 0x40));
    const reply = decodePayload(Kind.Results, next.frames.find((f) => f.tag === 0x40)!.payload, DEFAULT_PROFILE);
    const expected = createCordicModel({}).evaluate(code);
    expect(reply).toMatchObject({ kind: Kind.Results, firstIndex: 0, cos: Int32Array.of(expected.cos), sin: Int32Array.of(expected.sin) });
    const freed = ends.next();
    next.ws.close();
    await next.closed;
    await freed;
  });
});

describe('the bench bridge under hostile input', () => {
  const TOKEN = 'robustness-bridge-token';
  const MockBinding = SerialPortMock.binding;
  type MockPort = Awaited<ReturnType<typeof MockBinding.open>>;
  let bridge: Bridge;
  const opened: { port?: MockPort } = {};
  const ends = connectionEnds();

  beforeAll(async () => {
    MockBinding.createPort('/dev/ttyROBUST0', { echo: false, record: true });
    const binding = {
      ...MockBinding,
      async open(options: Parameters<typeof MockBinding.open>[0]) {
        opened.port = await MockBinding.open(options);
        return opened.port;
      },
    };
    bridge = await startBridge({ device: '/dev/ttyROBUST0', baud: 3_000_000, port: 0, host: '127.0.0.1', token: TOKEN, idleTimeoutS: 60 }, { serialBinding: binding, log: ends.log });
  });
  afterAll(() => bridge?.close());

  const recorded = () => (opened.port?.recording.length ?? 0);

  it('passes 64 KiB of random bytes to the port unchanged, ignores text, and drops an oversized message with 1009 without going down', async () => {
    const c = client(`${bridge.url}?token=${TOKEN}`);
    await c.opened;
    const junk = garbage(64 * 1024, 2);
    for (let at = 0; at < junk.length; at += 4096) c.ws.send(junk.subarray(at, at + 4096));
    c.ws.send('not line bytes');
    await until(() => recorded() >= junk.length);
    expect(Buffer.from(opened.port!.recording).equals(Buffer.from(junk))).toBe(true);

    const freed = ends.next();
    c.ws.send(new Uint8Array(OVERSIZED));
    expect(await c.closed).toBe(MESSAGE_TOO_BIG);
    await freed; // the bridge has dropped the client, and with it the message
    expect(recorded()).toBe(junk.length); // nothing of the oversized message reached the port

    const next = client(bridge.url, { authorization: `Bearer ${TOKEN}` });
    await next.opened;
    next.ws.send(Uint8Array.of(0xa5, 0x01, 0x07, 0x00));
    await until(() => recorded() >= junk.length + 4);
    const back: Buffer[] = [];
    next.ws.on('message', (d: Buffer) => back.push(d));
    opened.port!.emitData(Buffer.from([0xa5, 0xa0, 0x07]));
    await until(() => Buffer.concat(back).length >= 3);
    expect([...Buffer.concat(back)]).toEqual([0xa5, 0xa0, 0x07]);
    const nextFreed = ends.next();
    next.ws.close();
    await next.closed;
    await nextFreed;
  });
});
