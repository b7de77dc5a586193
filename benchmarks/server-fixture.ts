// The real app (createApp over a fresh migrated database, SQLite file or PostgreSQL, as the
// server tests build it) on a loopback port, with a 20-bit core whose exhaustive run is 1,048,576 samples, and helpers to
// call it the two ways clients do: a bearer token (the runner) or a signed-in cookie (the page).
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { createCordicModel } from '../shared/numeric';
import { packSamples } from '../shared/link-engine/sample-pack';
import { Core } from '../server/db/models';
import { modelConfigSchema } from '../server/schemas/core';
import { testApp, TEST_PASSWORD, type TestApp } from '../tests/support/test-app';
import type { BenchDialect } from './bare-driver';

/** 2^20 codes: a 20-bit binary-angle core's exhaustive run. */
export const BIG_SESSION_SAMPLES = 1 << 20;
export const BIG_CORE_CONFIG = modelConfigSchema.parse({ angleBits: 20 });

export interface BenchServer {
  t: TestApp;
  url: string;
  bigCore: Core;
  /** A personal API token of the engineer. */
  token: string;
  /** Cookie and CSRF header of a signed-in engineer, as a browser holds them. */
  cookieHeaders(): Promise<Record<string, string>>;
  close(): Promise<void>;
}

export async function startBenchServer(dialect: BenchDialect): Promise<BenchServer> {
  const t = await testApp({ dialect });
  const http: Server = createServer(t.app);
  await new Promise<void>((r) => http.listen(0, '127.0.0.1', r));
  const url = `http://127.0.0.1:${(http.address() as AddressInfo).port}`;
  const bigCore = await Core.create({ name: 'Twenty-bit core', slug: 'bench-20', linkProfile: {}, modelConfig: BIG_CORE_CONFIG, limits: { maxAbsErrorLsb: 4 }, baselineSessionId: null });
  const engineer = await t.signInAs('engineer');
  const token = (await engineer.post('/api/tokens').send({ name: 'bench' }).expect(201)).body.token as string;
  const cookieHeaders = async () => {
    const csrf = await fetch(`${url}/api/auth/csrf`);
    const first = cookieOf(csrf);
    const { token: csrfToken } = (await csrf.json()) as { token: string };
    const login = await fetch(`${url}/api/auth/login`, {
      method: 'POST',
      headers: { cookie: first, 'x-csrf-token': csrfToken, 'content-type': 'application/json' },
      body: JSON.stringify({ email: t.users.engineer.email, password: TEST_PASSWORD }),
    });
    if (!login.ok) throw new Error(`sign-in failed: ${login.status} ${await login.text()}`);
    return { cookie: cookieOf(login) || first, 'x-csrf-token': ((await login.json()) as { csrfToken: string }).csrfToken };
  };
  return {
    t,
    url,
    bigCore,
    token,
    cookieHeaders,
    close: async () => {
      await new Promise((r) => http.close(r));
      http.closeAllConnections();
      await t.close();
    },
  };
}

const cookieOf = (res: Response) => res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');

/** Every code of the 20-bit core once, answered by the reference model: packed samples. */
export function bigExhaustiveSamples(): { codes: Float64Array; cos: Int32Array; sin: Int32Array; packed: Uint8Array<ArrayBuffer> } {
  const n = BIG_SESSION_SAMPLES;
  const codes = new Float64Array(n);
  for (let i = 0; i < n; i++) codes[i] = i;
  const cos = new Int32Array(n);
  const sin = new Int32Array(n);
  createCordicModel(BIG_CORE_CONFIG).evaluateInto(codes, cos, sin);
  return { codes, cos, sin, packed: packSamples(codes, cos, sin, new Uint8Array(n).fill(1)) };
}
