import { spawn, type ChildProcess } from 'node:child_process';
import { get as httpGet } from 'node:http';
import { get as httpsGet } from 'node:https';
import { createServer } from 'node:net';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { projectRoot } from '../../server/paths';
import { tempDatabase } from '../support/temp-db';

/** A port the kernel says is free right now. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as { port: number };
      srv.close(() => resolve(port));
    });
  });
}

/** True when GET url answers 2xx; a self-signed test certificate is accepted. */
function answers(url: string): Promise<boolean> {
  return new Promise((resolve) => {
    const get = url.startsWith('https:') ? httpsGet : httpGet;
    get(url, { rejectUnauthorized: false }, (res) => {
      res.resume();
      resolve((res.statusCode ?? 500) < 300);
    }).on('error', () => resolve(false));
  });
}

export interface RunningApp {
  url: string;
  output: () => string;
  stop(): Promise<void>;
}

/**
 * Start the production server on a free port and a temporary database, the way `npm start`
 * runs it (over HTTPS when env has TLS_CERT_FILE), and wait until it answers. `stop` ends it
 * (and everything it started) for sure.
 */
export async function startApp(env: Record<string, string> = {}): Promise<RunningApp> {
  // env.PORT (with env.DATABASE_URL) starts a server again where an earlier one ran: a restart.
  const port = env.PORT ? Number(env.PORT) : await freePort();
  const db = await tempDatabase();
  const child: ChildProcess = spawn(process.execPath, [path.join(projectRoot, 'node_modules/tsx/dist/cli.mjs'), 'server/index.ts'], {
    cwd: projectRoot,
    env: { ...process.env, NODE_ENV: 'production', PORT: String(port), DATABASE_URL: db.url, UPLOAD_DIR: path.join(db.dir, 'uploads'), SESSION_SECRET: 'e2e-secret-0123456789abcdef', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
    detached: true, // its own process group, so stop() reaches grandchildren too
  });
  let log = '';
  child.stdout!.on('data', (d) => (log += d));
  child.stderr!.on('data', (d) => (log += d));
  const url = `${env.TLS_CERT_FILE ? 'https' : 'http'}://127.0.0.1:${port}`;
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));

  const stop = async () => {
    if (child.exitCode === null && child.signalCode === null) {
      process.kill(-child.pid!, 'SIGTERM');
      const timer = setTimeout(() => child.exitCode === null && process.kill(-child.pid!, 'SIGKILL'), 5000);
      await exited;
      clearTimeout(timer);
    }
    await db.cleanup();
  };

  // Generous: first start migrates and seeds the demo (a few seconds alone), and CI machines are busy.
  const deadline = Date.now() + 90_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`server exited early:\n${log}`);
    if (await answers(`${url}/api/health`)) break;
    if (Date.now() > deadline) {
      await stop();
      throw new Error(`server did not come up in 90 s:\n${log}`);
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  return { url, output: () => log, stop };
}

/** Debian's Chromium, headless, with a fresh profile and no background traffic (plus `extraArgs`). */
export function launchBrowser(extraArgs: string[] = []): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
      ...extraArgs,
    ],
  });
}

/** The demo accounts the seed creates, password `anglebench`. */
export type DemoRole = 'engineer' | 'reviewer' | 'admin';

/** Sign in through the form as a demo account and wait until the app has gone on to `next`. */
export async function signInAs(page: Page, app: RunningApp, who: DemoRole, next = '/'): Promise<void> {
  await page.goto(`${app.url}/sign-in?next=${encodeURIComponent(next)}`);
  await page.getByLabel('E-mail').fill(`${who}@anglebench.test`);
  await page.getByLabel('Password').fill('anglebench');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => u.pathname + u.search === next || u.pathname === next);
}

/**
 * The production server and a browser for one test file: started before its tests, stopped after
 * them. Read `app` and `browser` inside tests (they exist once the hooks have run).
 */
export function appAndBrowser(env: Record<string, string> = {}): { readonly app: RunningApp; readonly browser: Browser } {
  let app: RunningApp | undefined;
  let browser: Browser | undefined;
  beforeAll(async () => {
    app = await startApp(env);
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await app?.stop();
  });
  return {
    get app() {
      return app!;
    },
    get browser() {
      return browser!;
    },
  };
}

/** A personal API token of a demo account, made through the API as the Account page makes one. */
export async function demoApiToken(app: RunningApp, who: DemoRole, name = 'test token'): Promise<string> {
  const cookies = (res: Response) => res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  const csrf = await fetch(`${app.url}/api/auth/csrf`);
  const { token: csrfToken } = (await csrf.json()) as { token: string };
  const login = await fetch(`${app.url}/api/auth/login`, {
    method: 'POST',
    headers: { cookie: cookies(csrf), 'x-csrf-token': csrfToken, 'content-type': 'application/json' },
    body: JSON.stringify({ email: `${who}@anglebench.test`, password: 'anglebench' }),
  });
  if (!login.ok) throw new Error(`sign-in as ${who} failed: ${login.status}`);
  const { csrfToken: sessionCsrf } = (await login.json()) as { csrfToken: string };
  const made = await fetch(`${app.url}/api/tokens`, {
    method: 'POST',
    headers: { cookie: cookies(login), 'x-csrf-token': sessionCsrf, 'content-type': 'application/json' },
    body: JSON.stringify({ name }),
  });
  if (made.status !== 201) throw new Error(`making an API token failed: ${made.status}`);
  return ((await made.json()) as { token: string }).token;
}

export interface StationProcess {
  /** Settles once the station says it is online; rejects if it exits first. */
  online: Promise<void>;
  log(): string;
  /** SIGKILL: the lab PC gone without a word. */
  kill(): void;
  /** SIGTERM, and wait until it has exited. */
  stop(): Promise<void>;
}

/** `anglebench bridge --server …` as its own process: a station dialling `server`. */
export function startStationProcess(server: string, token: string, device: string, name: string, baud = 3_000_000): StationProcess {
  const child: ChildProcess = spawn(
    process.execPath,
    [path.join(projectRoot, 'node_modules/tsx/dist/cli.mjs'), 'cli/index.ts', 'bridge', '--server', server, '--token', token, '--device', device, '--name', name, '--baud', String(baud)],
    // Its own process group: tsx runs the command in a child, and a signal must reach both.
    { cwd: projectRoot, stdio: ['ignore', 'pipe', 'pipe'], detached: true },
  );
  let log = '';
  child.stdout!.on('data', (d) => (log += d));
  child.stderr!.on('data', (d) => (log += d));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const online = new Promise<void>((resolve, reject) => {
    child.stdout!.on('data', () => log.includes('online at') && resolve());
    child.once('exit', (code) => reject(new Error(`the station exited with ${code}:\n${log}`)));
  });
  online.catch(() => undefined); // a station killed on purpose rejects it with nobody waiting
  const running = () => child.exitCode === null && child.signalCode === null;
  return {
    online,
    log: () => log,
    kill: () => void (running() && process.kill(-child.pid!, 'SIGKILL')),
    stop: async () => {
      if (!running()) return;
      process.kill(-child.pid!, 'SIGTERM');
      await exited;
    },
  };
}
