// HTTPS and what depends on it: the sign-in cookie is Secure and HSTS is sent whenever the
// request came over HTTPS (the server's own TLS, made with `npm run cert`'s code, or a trusted
// proxy's X-Forwarded-Proto), and never over plain http; the CSP's connect-src comes from the
// configuration; PUBLIC_URL makes the links in e-mail.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import https from 'node:https';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import WebSocket from 'ws';
import { SIM_BOARD_PATH } from '../../server/sockets/sim-boards';
import { makeLabCertificate, type LabCertificate } from '../../scripts/lab-certificate';
import { listen, type ListeningApp } from '../support/listening-app';
import { TEST_PASSWORD, testApp, type TestApp } from '../support/test-app';

interface Reply {
  status: number;
  headers: Record<string, string | string[] | undefined>;
  body: string;
}

/** A request over TLS that trusts exactly the lab certificate. */
function httpsRequest(url: string, ca: Buffer, init: { method?: string; headers?: Record<string, string>; body?: string } = {}): Promise<Reply> {
  return new Promise((resolve, reject) => {
    const req = https.request(url, { method: init.method ?? 'GET', headers: init.headers, ca }, (res) => {
      let body = '';
      res.on('data', (d: Buffer) => (body += d.toString()));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body }));
    });
    req.on('error', reject);
    req.end(init.body);
  });
}

const sidCookie = (setCookie: string[] | undefined) => setCookie?.find((c) => c.startsWith('anglebench.sid='));

let cert: LabCertificate;
let certDir: string;
beforeAll(() => {
  certDir = fs.mkdtempSync(path.join(os.tmpdir(), 'anglebench-tls-'));
  cert = makeLabCertificate({ hosts: ['localhost', '127.0.0.1'], outDir: certDir });
});
afterAll(() => fs.rmSync(certDir, { recursive: true, force: true }));

describe('npm run cert', () => {
  it('makes a certificate for the named hosts whose fingerprint openssl itself confirms', () => {
    // The reference: openssl's own SHA-256 fingerprint of the same file.
    const out = spawnSync('openssl', ['x509', '-in', cert.certFile, '-noout', '-fingerprint', '-sha256', '-ext', 'subjectAltName'], { encoding: 'utf8' }).stdout;
    expect(out).toContain(`=${cert.fingerprint}`);
    expect(out).toMatch(/DNS:localhost, IP Address:127\.0\.0\.1/);
    expect(fs.statSync(cert.keyFile).mode & 0o777).toBe(0o600);
  });

  it('refuses to overwrite, and says plainly when openssl is missing', () => {
    expect(() => makeLabCertificate({ hosts: ['lab-server'], outDir: certDir })).toThrow(/already there.*--force/);
    expect(() => makeLabCertificate({ hosts: ['lab-server'], outDir: path.join(certDir, 'x'), openssl: 'no-such-openssl' })).toThrow(/no-such-openssl was not found: install OpenSSL/);
  });
});

describe('served over HTTPS (TLS_CERT_FILE, TLS_KEY_FILE)', () => {
  let t: TestApp;
  let server: ListeningApp;
  beforeAll(async () => {
    t = await testApp({ env: { TLS_CERT_FILE: cert.certFile, TLS_KEY_FILE: cert.keyFile } });
    server = await listen(t.app, t.config.tls);
  });
  afterAll(async () => {
    await server?.close();
    await t?.close();
  });

  it('marks the sign-in cookie Secure and sends HSTS', async () => {
    const ca = fs.readFileSync(cert.certFile);
    const csrf = await httpsRequest(`${server.url}/api/auth/csrf`, ca);
    expect(csrf.headers['strict-transport-security']).toMatch(/^max-age=\d+/);
    const first = sidCookie(csrf.headers['set-cookie'] as string[]);
    expect(first).toMatch(/;\s*Secure/i);
    const login = await httpsRequest(`${server.url}/api/auth/login`, ca, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-csrf-token': JSON.parse(csrf.body).token, cookie: first!.split(';')[0] },
      body: JSON.stringify({ email: t.users.engineer.email, password: TEST_PASSWORD }),
    });
    expect(login.status).toBe(200);
    const signedIn = sidCookie(login.headers['set-cookie'] as string[]);
    expect(signedIn).toMatch(/;\s*Secure/i);
    expect(signedIn).toMatch(/;\s*HttpOnly/i);

    // The same cookie opens a hosted board over wss:// on the same port.
    const ws = new WebSocket(`${server.wsUrl}${SIM_BOARD_PATH}`, { ca, headers: { cookie: signedIn!.split(';')[0], origin: server.url } });
    await new Promise<void>((resolve, reject) => {
      ws.once('open', () => resolve());
      ws.once('error', reject);
    });
    ws.close();
  });
});

describe('plain http and a reverse proxy (TRUST_PROXY)', () => {
  const apps: TestApp[] = [];
  afterAll(() => Promise.all(apps.map((a) => a.close())));
  const app = async (env: Record<string, string>) => {
    const a = await testApp({ env });
    apps.push(a);
    return a;
  };

  it('over plain http: no Secure cookie, no HSTS, and a forged X-Forwarded-Proto changes nothing', async () => {
    const t = await app({});
    const agent = await t.visitor();
    for (const headers of [{}, { 'x-forwarded-proto': 'https' }]) {
      const res = await agent.get('/api/auth/csrf').set(headers).expect(200);
      expect(res.headers['strict-transport-security']).toBeUndefined();
    }
    const login = await agent.post('/api/auth/login').set('x-forwarded-proto', 'https').send({ email: t.users.engineer.email, password: TEST_PASSWORD }).expect(200);
    const cookie = sidCookie(login.headers['set-cookie'] as unknown as string[]);
    expect(cookie).toBeDefined();
    expect(cookie).not.toMatch(/Secure/i);
  });

  it.each([['a hop count', '1'], ['an address list', '10.9.9.9, loopback']])('behind a proxy trusted by %s: Secure and HSTS when it says https, neither when it says http', async (_what, trust) => {
    const t = await app({ TRUST_PROXY: trust });
    const agent = await t.visitor();
    const secure = await agent.post('/api/auth/login').set('x-forwarded-proto', 'https').send({ email: t.users.engineer.email, password: TEST_PASSWORD }).expect(200);
    expect(sidCookie(secure.headers['set-cookie'] as unknown as string[])).toMatch(/;\s*Secure/i);
    expect(secure.headers['strict-transport-security']).toMatch(/^max-age=\d+/);
    const plain = await (await t.visitor()).post('/api/auth/login').set('x-forwarded-proto', 'http').send({ email: t.users.engineer.email, password: TEST_PASSWORD }).expect(200);
    expect(sidCookie(plain.headers['set-cookie'] as unknown as string[])).not.toMatch(/Secure/i);
    expect(plain.headers['strict-transport-security']).toBeUndefined();
  });

  it("builds the CSP's connect-src from the configuration, never a fixed localhost list", async () => {
    const connectSrc = async (env: Record<string, string>) => {
      const t = await app(env);
      const csp = (await (await t.visitor()).get('/api/health')).headers['content-security-policy'] as string;
      return /connect-src ([^;]*)/.exec(csp)?.[1];
    };
    expect(await connectSrc({})).toBe("'self'");
    expect(await connectSrc({ BRIDGE_ORIGINS: 'wss://bay3-pc.lab:5176, ws://10.0.0.7:5176' })).toBe("'self' wss://bay3-pc.lab:5176 ws://10.0.0.7:5176");
  });

  it('puts PUBLIC_URL in the links it mails', async () => {
    const t = await app({ PUBLIC_URL: 'https://anglebench.lab.example/' });
    const admin = await t.signInAs('admin');
    await admin.post('/api/invitations').send({ email: 'far.away@lab.test', role: 'engineer' }).expect(201);
    const messages: { to: string; text: string }[] = (await admin.get('/api/outbox').expect(200)).body.messages;
    const mail = messages.find((m) => m.to.includes('far.away@lab.test'));
    expect(mail?.text).toMatch(/https:\/\/anglebench\.lab\.example\/invite\/\S+/);
  });
});
