// Who may open the app server's WebSockets: refused at the upgrade with a plain 401/403/404 (no
// socket is opened, so nothing can be relayed), let in with the sign-in cookie or an API token.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import WebSocket from 'ws';
import { NodeSocketLink } from '../../../cli/transport/ws-link';
import { SIM_BOARD_PATH } from '../../../server/sockets/sim-boards';
import { errorReply } from '../../../shared/contract/common';
import { LinkEngine } from '../../../shared/link-engine/link-engine';
import { realEngineClock } from '../../support/in-process-board';
import { listen, signInCookie, type ListeningApp } from '../../support/listening-app';
import { TEST_PASSWORD, testApp, type TestApp } from '../../support/test-app';

/** The handshake's outcome: the HTTP status of a refusal with its JSON body, or 101 once open. */
function handshake(url: string, headers: Record<string, string> = {}): Promise<{ status: number; body: string }> {
  return new Promise((resolve, reject) => {
    const ws = new WebSocket(url, { headers });
    ws.on('unexpected-response', (_req, res) => {
      let body = '';
      res.on('data', (d: Buffer) => (body += d.toString()));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body }));
    });
    ws.on('open', () => {
      ws.close();
      resolve({ status: 101, body: '' });
    });
    ws.on('error', reject);
  });
}

describe('the WebSocket upgrade dispatcher', () => {
  let t: TestApp;
  let server: ListeningApp;
  let engineerCookie: string;
  let reviewerCookie: string;
  let token: string;
  let boardUrl: string;

  beforeAll(async () => {
    t = await testApp();
    server = await listen(t.app);
    boardUrl = `${server.wsUrl}${SIM_BOARD_PATH}`;
    engineerCookie = await signInCookie(server.url, t.users.engineer.email, TEST_PASSWORD);
    reviewerCookie = await signInCookie(server.url, t.users.reviewer.email, TEST_PASSWORD);
    const engineer = await t.signInAs('engineer');
    token = (await engineer.post('/api/tokens').send({ name: 'socket test' }).expect(201)).body.token;
  });
  afterAll(async () => {
    await server?.close();
    await t?.close();
  });

  it('refuses a signed-out caller with 401 and opens nothing', async () => {
    const r = await handshake(boardUrl);
    expect(r.status).toBe(401);
    // The refusal's body is the API's error reply (shared/contract errorReply).
    expect(errorReply.parse(JSON.parse(r.body)).error.code).toBe('signed_out');
    expect(t.app.sockets.openSockets(SIM_BOARD_PATH)).toBe(0);
  });

  it('refuses a wrong or malformed token with 401', async () => {
    const wrong = await handshake(boardUrl, { authorization: 'Bearer ab_not-a-real-token' });
    expect(wrong.status).toBe(401);
    expect(JSON.parse(wrong.body).error.message).toMatch(/Unknown or revoked API token/);
    const malformed = await handshake(boardUrl, { authorization: 'Basic abc' });
    expect(malformed.status).toBe(401);
    expect(t.app.sockets.openSockets(SIM_BOARD_PATH)).toBe(0);
  });

  it("refuses a reviewer's sign-in with 403", async () => {
    const r = await handshake(boardUrl, { cookie: reviewerCookie, origin: server.url });
    expect(r.status).toBe(403);
    expect(JSON.parse(r.body).error.message).toBe('This needs the engineer role');
    expect(t.app.sockets.openSockets(SIM_BOARD_PATH)).toBe(0);
  });

  it("refuses an engineer's cookie sent from another site's page with 403", async () => {
    const r = await handshake(boardUrl, { cookie: engineerCookie, origin: 'https://elsewhere.example' });
    expect(r.status).toBe(403);
    expect(JSON.parse(r.body).error.code).toBe('bad_origin');
  });

  it('answers 404 for a path no route serves', async () => {
    const r = await handshake(`${server.wsUrl}/api/no-such-socket`, { authorization: `Bearer ${token}` });
    expect(r.status).toBe(404);
  });

  it('gives the runner the refusal in words', async () => {
    await expect(NodeSocketLink.open(boardUrl)).rejects.toThrow(/401 Unauthorized: Sign in first/);
  });

  it("lets an engineer in with the sign-in cookie from the page's own origin, and with an API token", async () => {
    expect((await handshake(boardUrl, { cookie: engineerCookie, origin: server.url })).status).toBe(101);
    const link = await NodeSocketLink.open(boardUrl, 5000, { headers: { authorization: `Bearer ${token}` } });
    try {
      const engine = new LinkEngine({ link, clock: realEngineClock, baud: 3_000_000 });
      const info = await engine.hello();
      expect(info.name).toContain('simulated board');
      expect(t.app.sockets.openSockets(SIM_BOARD_PATH)).toBe(1);
    } finally {
      await link.close();
    }
  });
});

describe('the upgrade behind a proxy that rewrites Host', () => {
  it("lets a cookie in from PUBLIC_URL's origin, and still no other", async () => {
    const t = await testApp({ env: { PUBLIC_URL: 'https://bench.lab.example' } });
    const server = await listen(t.app);
    try {
      const cookie = await signInCookie(server.url, t.users.engineer.email, TEST_PASSWORD);
      const url = `${server.wsUrl}${SIM_BOARD_PATH}`;
      expect((await handshake(url, { cookie, origin: 'https://bench.lab.example' })).status).toBe(101);
      expect((await handshake(url, { cookie, origin: 'https://bench.lab.example.evil.test' })).status).toBe(403);
    } finally {
      await server.close();
      await t.close();
    }
  });
});
