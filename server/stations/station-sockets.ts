// The relay's sockets: stations dial /api/stations/connect with an engineer's API token; drivers
// (the Bench page with its sign-in cookie, the runner with a token) connect to
// /api/stations/<name>/drive. Who may open which is settled at the upgrade by the dispatcher
// (401 signed out or a wrong token, 403 a reviewer); the rules after that are StationRegistry's.
import type { IncomingMessage } from 'node:http';
import type { WebSocket } from 'ws';
import { STATION_CONNECT_PATH, STATION_MAX_MESSAGE_BYTES, parseRegistration, type StationRegistration } from '../../shared/stations/wire';
import { HttpError } from '../http-error';
import type { SocketCaller, SocketDispatcher } from '../sockets/upgrade';
import { closeReason, type RelayPeer, type StationRegistry } from './station-registry';

/**
 * A station or driver silent for two pings (no pong) is taken as gone: a half-open TCP connection
 * (a pulled cable, a laptop shut) frees the name or the station instead of holding it.
 */
export const STATION_PING_MS = 15_000;

const DRIVE = /^\/api\/stations\/([^/]+)\/drive$/;

const pathOf = (req: IncomingMessage) => new URL(req.url ?? '/', 'http://upgrade.invalid');

function peerOf(ws: WebSocket): RelayPeer {
  return {
    send: (bytes) => ws.readyState === ws.OPEN && ws.send(bytes, { binary: true }),
    note: (note) => ws.readyState === ws.OPEN && ws.send(JSON.stringify(note)),
    close: (code, reason) => ws.close(code, closeReason(reason)),
  };
}

const person = (c: SocketCaller) => ({ id: c.user.id, name: c.user.name || c.user.email });

/** Bytes of a ws 'message' (a Buffer, or fragments) as one Uint8Array, without copying one Buffer. */
const bytesOf = (data: Buffer | ArrayBuffer | Buffer[]) => (Array.isArray(data) ? Buffer.concat(data) : Buffer.isBuffer(data) ? data : Buffer.from(data));

/** Why a station's socket closed, for its driver. */
function offlineWhy(code: number, reason: string): string {
  if (reason) return reason;
  if (code === 1006) return 'its connection was lost';
  if (code === 1000 || code === 1001) return 'it was stopped';
  return `its connection closed (code ${code})`;
}

export function registerStationSockets(sockets: SocketDispatcher, registry: StationRegistry, pingMs = STATION_PING_MS) {
  const registrations = new WeakMap<IncomingMessage, StationRegistration>();
  // Pings sent since the last pong, per socket: two unanswered and the peer is taken as gone.
  const unanswered = new Map<WebSocket, number>();
  const watch = (ws: WebSocket) => {
    unanswered.set(ws, 0);
    ws.on('pong', () => unanswered.set(ws, 0));
    ws.on('close', () => unanswered.delete(ws));
  };
  const pinger = setInterval(() => {
    for (const [ws, n] of unanswered) {
      if (n >= 2) {
        ws.terminate();
        continue;
      }
      unanswered.set(ws, n + 1);
      ws.ping();
    }
  }, pingMs);
  pinger.unref();

  // Registered before the drive prefix below, so the dispatcher finds this one first.
  sockets.register(STATION_CONNECT_PATH, {
    role: 'engineer',
    maxPayload: STATION_MAX_MESSAGE_BYTES,
    admit(req) {
      const q = pathOf(req).searchParams;
      try {
        registrations.set(req, parseRegistration({ name: q.get('name'), device: q.get('device'), baud: q.get('baud') }));
      } catch (e) {
        throw new HttpError(400, 'invalid', `Station registration: ${(e as Error).message}`);
      }
    },
    handle(ws, req, caller) {
      const reg = registrations.get(req)!;
      const station = registry.online(person(caller), reg, peerOf(ws));
      if (station.refused) {
        ws.close(station.code, station.reason);
        return;
      }
      watch(ws);
      ws.on('message', (data, isBinary) => {
        if (isBinary) station.fromDevice(bytesOf(data)); // text from a station has no meaning: ignored
      });
      ws.on('error', () => undefined); // oversize or broken frames: 'close' follows with the code
      ws.on('close', (code, reason) => {
        station.offline(offlineWhy(code, reason.toString()));
      });
    },
  });

  sockets.register('/api/stations/', {
    role: 'engineer',
    maxPayload: STATION_MAX_MESSAGE_BYTES,
    admit(req) {
      if (!DRIVE.test(pathOf(req).pathname)) throw new HttpError(404, 'not_found', 'Stations are driven at /api/stations/<name>/drive');
    },
    handle(ws, req, caller) {
      let name: string;
      try {
        name = decodeURIComponent(DRIVE.exec(pathOf(req).pathname)![1]);
      } catch {
        ws.close(1008, 'The station name in the address is not valid URL encoding');
        return;
      }
      const driver = registry.drive(name, person(caller), peerOf(ws));
      if (driver.refused) {
        // Accepted, then closed with the reason: a browser never sees a refused upgrade's body.
        ws.close(driver.code, driver.reason);
        return;
      }
      watch(ws);
      ws.on('message', (data, isBinary) => {
        if (isBinary) driver.toDevice(bytesOf(data));
      });
      ws.on('error', () => undefined);
      ws.on('close', (code) => driver.leave(code === 1009 ? 'a message over the size limit' : 'disconnected'));
    },
    close() {
      clearInterval(pinger);
      registry.closeAll('The server is stopping');
    },
  });
}
