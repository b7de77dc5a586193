// `bridge`: one serial port on this machine, offered to a browser elsewhere over WebSocket with
// the raw-bytes transport the simulated board uses (each binary message: line bytes, unchanged).
// A token guards it; one client at a time; a silent client is let go after the idle timeout.
import { timingSafeEqual } from 'node:crypto';
import type { IncomingMessage } from 'node:http';
import type { AddressInfo } from 'node:net';
import { parseArgs } from 'node:util';
import { WebSocketServer, type WebSocket } from 'ws';
import { runCommand, UsageError } from './command';
import type { CliIo } from './io';
import { PortSerialLink } from './transport/port-serial-link';
import { ChunkCoalescer } from '../shared/link-engine/chunk-coalescer';
import { realClock } from './clock';

const USAGE = 'usage: anglebench bridge --device <serial path> --ws-port N --token T [options]';

const HELP = `${USAGE}
       (from a checkout: npm run --silent cli -- bridge …)

  --device PATH        the serial port of the board (/dev/ttyUSB0, COM3)
  --baud N             line rate, 9600..12000000 (default 3000000)
  --ws-port N          WebSocket port to listen on (0: any free port)
  --host H             address to listen on (default 127.0.0.1: this machine only)
  --token T            clients must send it, as ?token=T or "Authorization: Bearer T"
  --idle-timeout-s S   let a client go after S seconds without a byte either way (default 600)

Runs until interrupted; exits 2 when the port cannot be opened or goes away.
With --server URL the bridge dials the team server as a station instead (bridge --server URL --help).
`;

/** Close codes (RFC 6455 registry): 1008 policy violation, 1013 try again later, 1011 server error. */
const REFUSED = 1008;
const BUSY = 1013;
const DEVICE_GONE = 1011;
/** A private-use code for "you were idle" (4000–4999 are the application's own). */
const IDLE = 4000;
const MAX_MESSAGE_BYTES = 64 * 1024;

export interface BridgeOptions {
  device: string;
  baud: number;
  port: number;
  host: string;
  token: string;
  idleTimeoutS: number;
}

export interface BridgeDeps {
  serialBinding?: object;
  log?: (line: string) => void;
}

export interface Bridge {
  url: string;
  port: number;
  /** Settles when the serial port goes away (with its reason) or close() was called (null). */
  ended: Promise<string | null>;
  close(): Promise<void>;
}

function tokenOf(req: IncomingMessage): string | null {
  const bearer = /^Bearer\s+(\S+)$/i.exec(req.headers.authorization ?? '');
  if (bearer) return bearer[1];
  const query = new URL(req.url ?? '/', 'ws://bridge').searchParams.get('token');
  return query;
}

function sameToken(given: string | null, expected: string): boolean {
  if (given === null) return false;
  const a = Buffer.from(given);
  const b = Buffer.from(expected);
  return a.length === b.length && timingSafeEqual(a, b);
}

/** Open the port and listen; rejects with a one-line reason. */
export async function startBridge(o: BridgeOptions, deps: BridgeDeps = {}): Promise<Bridge> {
  const log = deps.log ?? ((line: string) => console.log(line));
  const link = await PortSerialLink.open({ path: o.device, baud: o.baud, binding: deps.serialBinding });
  const wss = new WebSocketServer({ port: o.port, host: o.host, maxPayload: MAX_MESSAGE_BYTES });
  let active: { ws: WebSocket; outgoing: ChunkCoalescer; touch: () => void; count: (dir: 'in' | 'out', n: number) => void } | null = null;
  let connections = 0;
  let endedWith: (reason: string | null) => void = () => {};
  const ended = new Promise<string | null>((r) => (endedWith = r));

  link.onBytes((bytes) => {
    if (!active || active.ws.readyState !== active.ws.OPEN) return; // nobody listening: the line's bytes fall away
    active.count('out', bytes.length);
    active.touch();
    active.outgoing.push(bytes);
  });
  link.onWarning((m) => log(`[bridge] ${o.device}: ${m}`));
  link.onClose((r) => {
    if (r.requested) return;
    active?.ws.close(DEVICE_GONE, `the serial port went away: ${r.message}`.slice(0, 120));
    endedWith(r.message);
  });

  wss.on('connection', (ws, req) => {
    const id = ++connections;
    const peer = `${req.socket.remoteAddress}:${req.socket.remotePort}`;
    if (!sameToken(tokenOf(req), o.token)) {
      const why = tokenOf(req) === null ? 'refused: no token (send ?token= or Authorization: Bearer)' : 'refused: wrong token';
      log(`[bridge] connection ${id} from ${peer} ${why}`);
      ws.close(REFUSED, why);
      return;
    }
    if (active) {
      log(`[bridge] connection ${id} from ${peer} refused: another client is connected`);
      ws.close(BUSY, `busy: another client is using ${o.device}`);
      return;
    }
    const started = Date.now();
    let toBoard = 0;
    let toClient = 0;
    let idleTimer: NodeJS.Timeout | undefined;
    let closeNote = '';
    const touch = () => {
      clearTimeout(idleTimer);
      idleTimer = setTimeout(() => {
        closeNote = `idle for ${o.idleTimeoutS} s`;
        ws.close(IDLE, closeNote);
      }, o.idleTimeoutS * 1000);
    };
    // The port's small reads, merged: a message per USB packet costs a browser more than the bytes.
    const outgoing = new ChunkCoalescer({ clock: realClock, emit: (bytes) => ws.readyState === ws.OPEN && ws.send(bytes, { binary: true }) });
    active = { ws, outgoing, touch, count: (dir, n) => (dir === 'in' ? (toBoard += n) : (toClient += n)) };
    touch();
    ws.on('message', (data, isBinary) => {
      if (!isBinary) return; // text has no place on a byte line: ignored
      const buf = Array.isArray(data) ? Buffer.concat(data) : Buffer.from(data as ArrayBuffer);
      toBoard += buf.length;
      touch();
      link.write(new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength)).catch((err: Error) => ws.close(DEVICE_GONE, `write failed: ${err.message}`.slice(0, 120)));
    });
    ws.on('error', () => undefined); // oversized or broken frames: 'close' follows
    ws.on('close', (code, reason) => {
      clearTimeout(idleTimer);
      outgoing.close();
      if (active?.ws === ws) active = null;
      const why = closeNote || reason.toString() || `code ${code}`;
      log(`[bridge] connection ${id} from ${peer}: ${((Date.now() - started) / 1000).toFixed(1)} s, ${toBoard} B to the board, ${toClient} B to the client, closed (${why})`);
    });
  });

  await new Promise<void>((resolve, reject) => {
    wss.once('error', (e) => {
      void link.close();
      reject(new Error(`cannot listen on ${o.host}:${o.port}: ${e.message}`));
    });
    wss.once('listening', () => resolve());
  });
  const port = (wss.address() as AddressInfo).port;
  return {
    url: `ws://${o.host}:${port}/`,
    port,
    ended,
    close: async () => {
      for (const c of wss.clients) c.terminate();
      await new Promise<void>((r) => wss.close(() => r()));
      await link.close();
      endedWith(null);
    },
  };
}

function int(name: string, text: string | undefined, min: number, max: number, fallback?: number): number {
  if (text === undefined) {
    if (fallback === undefined) throw new UsageError(`--${name} is required (see bridge --help)`);
    return fallback;
  }
  // Decimal digits only: Number() would also take "", " 5", "0x10" and "1e3".
  const n = /^\d+$/.test(text) ? Number(text) : NaN;
  if (!Number.isSafeInteger(n) || n < min || n > max) throw new UsageError(`--${name} must be an integer ${min}..${max}, got "${text}"`);
  return n;
}

export function parseBridgeArgs(argv: string[]): BridgeOptions | 'help' {
  let values: Record<string, string | boolean | undefined>;
  try {
    ({ values } = parseArgs({
      args: argv,
      strict: true,
      options: {
        device: { type: 'string' },
        baud: { type: 'string' },
        'ws-port': { type: 'string' },
        host: { type: 'string' },
        token: { type: 'string' },
        'idle-timeout-s': { type: 'string' },
        help: { type: 'boolean', short: 'h' },
      },
    }));
  } catch (e) {
    throw new UsageError((e as Error).message.split('\n')[0]);
  }
  if (values.help) return 'help';
  const s = (k: string) => values[k] as string | undefined;
  if (s('device') === undefined) throw new UsageError('--device is required (see bridge --help)');
  if (s('device') === '') throw new UsageError('--device must not be empty');
  if (s('host') === '') throw new UsageError('--host must not be empty');
  const token = s('token');
  if (!token) throw new UsageError('--token is required: the bridge never runs unguarded');
  if (token.length < 8) throw new UsageError('--token must be at least 8 characters');
  return {
    device: s('device')!,
    baud: int('baud', s('baud'), 9_600, 12_000_000, 3_000_000),
    port: int('ws-port', s('ws-port'), 0, 65_535),
    host: s('host') ?? '127.0.0.1',
    token,
    idleTimeoutS: int('idle-timeout-s', s('idle-timeout-s'), 1, 7 * 24 * 3600, 600),
  };
}

/** The `bridge` command: runs until SIGINT/SIGTERM (exit 0) or the port goes away (exit 2). */
export const runBridgeCommand = (argv: string[], io: CliIo, deps: BridgeDeps = {}): Promise<number> =>
  runCommand(argv, io, { parse: parseBridgeArgs, help: HELP, usage: USAGE, run: (o) => bridgeUntilEnded(o, io, deps) });

async function bridgeUntilEnded(o: BridgeOptions, io: CliIo, deps: BridgeDeps): Promise<number> {
  let bridge: Bridge;
  try {
    bridge = await startBridge(o, { log: (l) => io.stdout(`${l}\n`), ...deps });
  } catch (e) {
    io.stderr(`error: ${(e as Error).message}\n`);
    return 2;
  }
  io.stdout(`[bridge] ${o.device} at ${o.baud} baud on ${bridge.url} (token required, one client at a time, idle timeout ${o.idleTimeoutS} s)\n`);
  const stop = () => void bridge.close();
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
  const reason = await bridge.ended;
  process.off('SIGINT', stop);
  process.off('SIGTERM', stop);
  if (reason === null) return 0;
  io.stderr(`error: ${reason}\n`);
  await bridge.close().catch(() => undefined);
  return 2;
}
