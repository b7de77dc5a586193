// The app on a real port, for what supertest cannot drive: WebSocket upgrades, HTTPS.
import { createServer, type Server } from 'node:http';
import { createServer as createHttpsServer } from 'node:https';
import type { AddressInfo } from 'node:net';
import type { createApp } from '../../server/app';

type App = ReturnType<typeof createApp>;

export interface ListeningApp {
  url: string;
  port: number;
  /** The same address as ws:// or wss://. */
  wsUrl: string;
  close(): Promise<void>;
}

/**
 * Listen on 127.0.0.1 (over TLS when `tls` is given) with the app's WebSocket routes attached; on
 * `port` to start a server again where an earlier one ran (a restart), else on a free one.
 */
export async function listen(app: App, tls?: { cert: Buffer; key: Buffer }, port = 0): Promise<ListeningApp> {
  const server: Server = tls ? createHttpsServer(tls, app) : createServer(app);
  app.sockets.attach(server);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', resolve);
  });
  const { port: at } = server.address() as AddressInfo;
  const scheme = tls ? 'https' : 'http';
  return {
    url: `${scheme}://127.0.0.1:${at}`,
    port: at,
    wsUrl: `${tls ? 'wss' : 'ws'}://127.0.0.1:${at}`,
    close: async () => {
      const closed = new Promise<void>((resolve) => server.close(() => resolve()));
      await app.sockets.close();
      server.closeAllConnections();
      await closed;
    },
  };
}

/**
 * Sign in over the wire as a browser would and return the sign-in cookie (`name=value`), for
 * WebSocket handshakes.
 */
export async function signInCookie(baseUrl: string, email: string, password: string): Promise<string> {
  const csrf = await fetch(`${baseUrl}/api/auth/csrf`);
  const first = cookieOf(csrf);
  const { token } = (await csrf.json()) as { token: string };
  const login = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-csrf-token': token, cookie: first },
    body: JSON.stringify({ email, password }),
  });
  if (!login.ok) throw new Error(`sign-in as ${email} failed: ${login.status} ${await login.text()}`);
  return cookieOf(login);
}

function cookieOf(res: Response): string {
  const set = res.headers.getSetCookie().find((c) => c.startsWith('anglebench.sid='));
  if (!set) throw new Error('no sign-in cookie in the response');
  return set.split(';')[0];
}
