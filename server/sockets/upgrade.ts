// The app server's one WebSocket upgrade handler. Every socket route (the hosted simulated
// boards, the stations) is registered here; the caller is authenticated BEFORE the upgrade and
// refused with a plain HTTP status on the raw socket, so nothing is relayed to anybody who is
// not allowed.
import { STATUS_CODES, type IncomingMessage, type Server } from 'node:http';
import type { Duplex } from 'node:stream';
import { WebSocketServer, type WebSocket } from 'ws';
import type { ErrorReply } from '../../shared/contract/common';
import { hasRole } from '../auth/guards';
import type { Role, User } from '../db/models';
import { HttpError } from '../http-error';

/** Who opened a socket, and how they proved it. */
export interface SocketCaller {
  user: User;
  via: 'session' | 'token';
}

export interface SocketRoute {
  /** The least role allowed (admin ⊃ engineer ⊃ reviewer); below it the upgrade gets 403. */
  role: Role;
  /** Largest message accepted; a bigger one closes the socket with 1009 (RFC 6455 §7.4.1). */
  maxPayload: number;
  /**
   * Optional refusal after authentication and before the upgrade (e.g. an unknown station):
   * throw an HttpError and the caller gets its status and message instead of a socket.
   */
  admit?(req: IncomingMessage, caller: SocketCaller): void | Promise<void>;
  /** The socket, open; `req.url` still carries the path and query. */
  handle(ws: WebSocket, req: IncomingMessage, caller: SocketCaller): void;
  /** Free what the route holds (timers, boards) when the server stops. */
  close?(): void | Promise<void>;
}

/** How the upgrade request proves who it is: resolves to the caller, or undefined when signed out. */
export type UpgradeAuthenticator = (req: IncomingMessage) => Promise<SocketCaller | undefined>;

export interface SocketDispatcher {
  /**
   * Serve `path` (exact, e.g. `/api/sim-board`) or every path under a prefix ending in `/`
   * (e.g. `/api/stations/`). One registration per path.
   */
  register(path: string, route: SocketRoute): void;
  /** Sockets open on the route registered as `path` (0 for an unknown path). */
  openSockets(path: string): number;
  /** Handle the upgrades of this HTTP(S) server. */
  attach(server: Server): void;
  /** Close every open socket and free each route's resources. */
  close(): Promise<void>;
}

export interface DispatcherOptions {
  authenticate: UpgradeAuthenticator;
  /**
   * Origins (scheme://host[:port]) a browser's cookie-authenticated upgrade may come from besides
   * the server's own (e.g. PUBLIC_URL's origin behind a proxy that rewrites Host). A cookie rides
   * along on a cross-site WebSocket handshake, so without this check any page the engineer opens
   * could drive the bench in their name.
   */
  allowedOrigins?: string[];
  log?: (line: string) => void;
}

interface Registered {
  path: string;
  route: SocketRoute;
  wss: WebSocketServer;
}

export function createSocketDispatcher({ authenticate, allowedOrigins = [], log = console.warn }: DispatcherOptions): SocketDispatcher {
  const routes: Registered[] = [];

  const find = (pathname: string) =>
    routes.find((r) => (r.path.endsWith('/') ? pathname.startsWith(r.path) : pathname === r.path));

  async function onUpgrade(req: IncomingMessage, socket: Duplex, head: Buffer) {
    socket.on('error', () => undefined); // a peer that hangs up mid-handshake is not our error
    try {
      const pathname = new URL(req.url ?? '/', 'http://upgrade.invalid').pathname;
      const found = find(pathname);
      if (!found) throw new HttpError(404, 'not_found', `No WebSocket endpoint at ${pathname}`);
      const caller = await authenticate(req);
      if (!caller) throw new HttpError(401, 'signed_out', 'Sign in first, or send an API token as "Authorization: Bearer <token>"');
      if (caller.via === 'session' && !sameOrigin(req, allowedOrigins)) {
        throw new HttpError(403, 'bad_origin', 'This WebSocket may only be opened from the Anglebench page itself');
      }
      if (!hasRole(caller.user.role, found.route.role)) throw new HttpError(403, 'forbidden', `This needs the ${found.route.role} role`);
      await found.route.admit?.(req, caller);
      if (socket.destroyed) return;
      found.wss.handleUpgrade(req, socket, head, (ws) => {
        try {
          found.route.handle(ws, req, caller);
        } catch (err) {
          log(`[sockets] ${pathname}: ${(err as Error).message}`);
          ws.close(1011, 'internal error'); // RFC 6455 §7.4.1: 1011, the server met an unexpected condition
        }
      });
    } catch (err) {
      const e = err instanceof HttpError ? err : new HttpError(500, 'internal', 'Internal server error');
      if (!(err instanceof HttpError)) log(`[sockets] upgrade failed: ${(err as Error).stack}`);
      refuse(socket, e);
    }
  }

  return {
    register(path, route) {
      if (!path.startsWith('/')) throw new Error(`socket route must start with "/": ${path}`);
      if (routes.some((r) => r.path === path)) throw new Error(`socket route ${path} registered twice`);
      routes.push({ path, route, wss: new WebSocketServer({ noServer: true, maxPayload: route.maxPayload }) });
    },
    openSockets(path) {
      return routes.find((r) => r.path === path)?.wss.clients.size ?? 0;
    },
    attach(server) {
      server.on('upgrade', (req: IncomingMessage, socket: Duplex, head: Buffer) => void onUpgrade(req, socket, head));
    },
    async close() {
      for (const r of routes) {
        for (const ws of r.wss.clients) ws.terminate();
        await r.route.close?.();
        await new Promise<void>((done) => r.wss.close(() => done()));
      }
    },
  };
}

/** Answer the upgrade with a plain HTTP error (the API's errorReply as its body) and hang up. */
function refuse(socket: Duplex, e: HttpError) {
  if (socket.destroyed) return;
  const reply: ErrorReply = { error: { code: e.code, message: e.message } };
  const body = JSON.stringify(reply);
  socket.end(
    `HTTP/1.1 ${e.status} ${STATUS_CODES[e.status] ?? 'Error'}\r\n` +
      'Connection: close\r\nContent-Type: application/json; charset=utf-8\r\n' +
      `Content-Length: ${Buffer.byteLength(body)}\r\n\r\n${body}`,
  );
}

/**
 * True when the handshake's Origin is the server's own (the Host it was asked for, over either
 * scheme) or one of `allowed`. A missing Origin means no browser sent it: not a cross-site page.
 */
function sameOrigin(req: IncomingMessage, allowed: string[]): boolean {
  const origin = req.headers.origin;
  if (!origin) return true;
  let o: URL;
  try {
    o = new URL(origin);
  } catch {
    return false;
  }
  if (allowed.includes(o.origin)) return true;
  return o.host === req.headers.host;
}
