// `bridge --server`: one board on this machine offered to the team server as a station. The
// station dials OUT (so the lab PC needs no open port), registers its device, keeps the connection
// alive with pings, and dials again with backoff whenever the server restarts or the network
// drops. Line bytes pass unchanged as binary messages; text messages are the server's notes.
import { readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import WebSocket from 'ws';
import type { ByteLink } from '../shared/link-engine/byte-link';
import { ChunkCoalescer } from '../shared/link-engine/chunk-coalescer';
import { Backoff } from '../shared/stations/backoff';
import { STATION_CONNECT_PATH, STATION_MAX_MESSAGE_BYTES, StationClose, parseRegistration, type StationNote } from '../shared/stations/wire';
import { realClock } from './clock';
import { isSocketDevice, openDevice, type DeviceDeps } from './device';
import { runCommand, UsageError } from './command';
import type { CliIo } from './io';
import { upgradeRefusal } from './transport/ws-link';

const STATION_USAGE = 'usage: anglebench bridge --server URL --token T --device D --name NAME [options]';

export const STATION_HELP = `${STATION_USAGE}
       (from a checkout: npm run --silent cli -- bridge --server …)

Offers a board to the team server as a station: the bridge connects out to the server (no port
opens on this machine), and engineers drive the board from the Bench page or with
\`run --device station:NAME\`.

  --server URL   the Anglebench server (https://… gives wss://)
  --token T      an engineer's personal API token (Account page); the station runs as that engineer
  --device D     the board's serial port (/dev/ttyUSB0, COM3) or a simulated board (ws://127.0.0.1:5175/)
  --name NAME    what the station is called on the server, e.g. "Bay 3 / bench A"
  --baud N       line rate, 9600..12000000 (default 3000000)
  --ca FILE      trust the server certificate in FILE (PEM): a lab's self-signed certificate
  --insecure     do not check the server's certificate at all (trying out only: anyone on the
                 network path could pose as the server and read the token)

Runs until interrupted; exits 2 when the device cannot be opened or goes away, or when the server
refuses the token or the name.
`;

export interface StationOptions {
  server: string;
  token: string;
  device: string;
  name: string;
  baud: number;
  ca: string | null;
  insecure: boolean;
}

export interface StationDeps extends DeviceDeps {
  log?: (line: string) => void;
  /** Reading --ca's file (tests swap it). */
  readFile?: (path: string) => string;
  /** Ping interval, ms; a server silent for two of them is taken as gone. Default 10 s. */
  heartbeatMs?: number;
  /** Reconnection backoff (default 250 ms doubling to 4 s, with jitter). */
  backoff?: Backoff;
}

export interface Station {
  /** True while registered with the server. */
  readonly online: boolean;
  /** Settles with the reason the station stopped on its own, or null after close(). */
  ended: Promise<string | null>;
  close(): Promise<void>;
}

export const stationUrl = (server: string, reg: { name: string; device: string; baud: number }) => {
  const u = new URL(STATION_CONNECT_PATH, server.replace(/^http/i, 'ws'));
  u.search = new URLSearchParams({ name: reg.name, device: reg.device, baud: String(reg.baud) }).toString();
  return u.toString();
};

/** Open the device, then keep a connection to the server until close() or the device goes. */
export async function startStation(o: StationOptions, deps: StationDeps = {}): Promise<Station> {
  const log = deps.log ?? ((line: string) => console.log(line));
  const heartbeatMs = deps.heartbeatMs ?? 10_000;
  const backoff = deps.backoff ?? new Backoff({ baseMs: 250, capMs: 4_000 });
  let ca: string | undefined;
  try {
    ca = o.ca ? (deps.readFile ?? ((p: string) => readFileSync(p, 'utf8')))(o.ca) : undefined;
  } catch (e) {
    throw new Error(`cannot read --ca ${o.ca}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  const url = stationUrl(o.server, o);
  const link: ByteLink = await openDevice(o.device, o.baud, deps);
  const tag = `[station ${o.name}]`;
  log(`${tag} ${o.device} at ${o.baud} baud, dialling ${o.server}${o.insecure ? ' (certificate NOT checked: --insecure)' : ''}`);

  let ws: WebSocket | null = null;
  let online = false;
  let stopping = false;
  let retry: NodeJS.Timeout | undefined;
  let endedWith: (reason: string | null) => void = () => {};
  const ended = new Promise<string | null>((r) => (endedWith = r));
  // A serial port's small reads, merged into fewer messages (as the listening bridge does). A
  // WebSocket device already sends merged chunks: merging again would only add delay.
  const coalesce = !isSocketDevice(o.device);
  let outgoing: ChunkCoalescer | null = null;

  const stop = async (reason: string | null, code = 1000) => {
    if (stopping) return;
    stopping = true;
    clearTimeout(retry);
    outgoing?.flush();
    ws?.close(code, (reason ?? 'the station was stopped').slice(0, 120));
    await link.close().catch(() => undefined);
    endedWith(reason);
  };

  link.onBytes((bytes) => outgoing?.push(bytes));
  link.onWarning((m) => log(`${tag} ${o.device}: ${m}`));
  link.onClose((r) => {
    if (!r.requested) void stop(`the device went away: ${r.message}`, StationClose.deviceGone);
  });

  const dial = () => {
    if (stopping) return;
    const socket = new WebSocket(url, {
      headers: { authorization: `Bearer ${o.token}` },
      maxPayload: STATION_MAX_MESSAGE_BYTES,
      handshakeTimeout: 10_000,
      ...(ca ? { ca } : {}),
      ...(o.insecure ? { rejectUnauthorized: false } : {}),
    });
    ws = socket;
    let lastPong = Date.now();
    let heartbeat: NodeJS.Timeout | undefined;
    let refusedAtUpgrade: string | null = null;

    socket.on('unexpected-response', (_req, res) => {
      void upgradeRefusal(res).then((why) => {
        refusedAtUpgrade = why;
        socket.terminate();
      });
    });
    socket.on('open', () => {
      // Never a message over the relay's limit (the server would close with 1009): a serial read
      // can be as large as the limit by itself.
      const send = (bytes: Uint8Array) => {
        for (let at = 0; at < bytes.length && socket.readyState === WebSocket.OPEN; at += STATION_MAX_MESSAGE_BYTES) {
          socket.send(bytes.subarray(at, at + STATION_MAX_MESSAGE_BYTES), { binary: true });
        }
      };
      outgoing = new ChunkCoalescer({ clock: realClock, emit: send, ...(coalesce ? {} : { flushBytes: 1 }) });
      socket.on('pong', () => (lastPong = Date.now()));
      heartbeat = setInterval(() => {
        if (Date.now() - lastPong > 2 * heartbeatMs) {
          log(`${tag} no answer from the server for ${Math.round((2 * heartbeatMs) / 1000)} s: dialling again`);
          socket.terminate();
          return;
        }
        socket.ping();
      }, heartbeatMs);
    });
    socket.on('message', (data: Buffer, isBinary: boolean) => {
      if (isBinary) {
        link.write(new Uint8Array(data.buffer, data.byteOffset, data.byteLength)).catch((err: Error) => log(`${tag} write to ${o.device} failed: ${err.message}`));
        return;
      }
      let note: StationNote;
      try {
        note = JSON.parse(data.toString()) as StationNote;
      } catch {
        return; // not a note: nothing for the board either
      }
      if (note.type === 'registered') {
        online = true;
        backoff.reset();
        log(`${tag} online at ${o.server} (${o.device}, ${o.baud} baud)`);
      } else if (note.type === 'driven') log(`${tag} driven by ${note.by} since ${note.since}`);
      else if (note.type === 'released') log(`${tag} free again (${note.by}: ${note.why})`);
    });
    socket.on('error', (err) => {
      if (!refusedAtUpgrade) log(`${tag} ${err.message || 'connection failed'}`);
    });
    socket.on('close', (code, reasonBuf) => {
      clearInterval(heartbeat);
      outgoing?.close();
      outgoing = null;
      const wasOnline = online;
      online = false;
      if (stopping) return;
      const reason = reasonBuf.toString();
      // A refusal that will not change by trying again: stop and say why.
      if (refusedAtUpgrade && /^40[013] /.test(refusedAtUpgrade)) {
        void stop(`the server refused the station: ${refusedAtUpgrade}`);
        return;
      }
      if (code === StationClose.refused) {
        void stop(`the server refused the station: ${reason || `code ${code}`}`);
        return;
      }
      const wait = backoff.next();
      const why = refusedAtUpgrade ?? (reason ? `${reason} (code ${code})` : `code ${code}`);
      log(`${tag} ${wasOnline ? 'offline' : 'not connected'}: ${why}; dialling again in ${(wait / 1000).toFixed(1)} s`);
      retry = setTimeout(dial, wait);
    });
  };
  dial();

  return {
    get online() {
      return online;
    },
    ended,
    close: () => stop(null),
  };
}

export function parseStationArgs(argv: string[]): StationOptions | 'help' {
  let values: Record<string, string | boolean | undefined>;
  try {
    ({ values } = parseArgs({
      args: argv,
      strict: true,
      options: {
        server: { type: 'string' },
        token: { type: 'string' },
        device: { type: 'string' },
        name: { type: 'string' },
        baud: { type: 'string' },
        ca: { type: 'string' },
        insecure: { type: 'boolean' },
        help: { type: 'boolean', short: 'h' },
      },
    }));
  } catch (e) {
    throw new UsageError((e as Error).message.split('\n')[0]);
  }
  if (values.help) return 'help';
  const s = (k: string) => values[k] as string | undefined;
  const server = s('server') ?? '';
  if (!/^https?:\/\/[^/\s]+/i.test(server)) throw new UsageError(`--server must be the server's http:// or https:// address, got "${server}"`);
  const token = s('token');
  if (!token) throw new UsageError('--token is required: a station runs as the engineer whose API token it holds');
  if (s('ca') && values.insecure) throw new UsageError('--ca and --insecure contradict each other: give one');
  const baudText = s('baud') ?? '3000000';
  try {
    const reg = parseRegistration({ name: s('name') ?? null, device: s('device') ?? null, baud: baudText });
    return { server: server.replace(/\/+$/, ''), token, ...reg, ca: s('ca') ?? null, insecure: values.insecure === true };
  } catch (e) {
    throw new UsageError(`--${(e as Error).message}`);
  }
}

/** `bridge --server …`: runs until SIGINT/SIGTERM (exit 0), the device goes or the server refuses (exit 2). */
export const runStationCommand = (argv: string[], io: CliIo, deps: StationDeps = {}): Promise<number> =>
  runCommand(argv, io, { parse: parseStationArgs, help: STATION_HELP, usage: STATION_USAGE, run: (o) => stationUntilEnded(o, io, deps) });

async function stationUntilEnded(o: StationOptions, io: CliIo, deps: StationDeps): Promise<number> {
  let station: Station;
  try {
    station = await startStation(o, { log: (l) => io.stdout(`${l}\n`), readFile: io.readFile, ...deps });
  } catch (e) {
    io.stderr(`error: ${(e as Error).message}\n`);
    return 2;
  }
  const interrupt = () => void station.close();
  process.once('SIGINT', interrupt);
  process.once('SIGTERM', interrupt);
  const reason = await station.ended;
  process.off('SIGINT', interrupt);
  process.off('SIGTERM', interrupt);
  if (reason === null) return 0;
  io.stderr(`error: ${reason}\n`);
  return 2;
}
