// A signed-in client for a real listening server, over plain fetch: the sign-in cookie is kept
// by hand and the CSRF token rides on every write, as the browser client does.
import { packSamples } from '../../../cli/run-server';
import { createCordicModel } from '../../../shared/numeric';

export interface HttpSession {
  cookie: string;
  csrf: string;
  fetch(path: string, init?: RequestInit): Promise<Response>;
}

const cookieOf = (res: Response) => res.headers.getSetCookie().find((c) => c.startsWith('anglebench.sid='))?.split(';')[0];

/** Sign in at `baseUrl` and return a client that carries the cookie and the CSRF token. */
export async function signInOverHttp(baseUrl: string, email: string, password: string): Promise<HttpSession> {
  const first = await fetch(`${baseUrl}/api/auth/csrf`);
  const visitorCookie = cookieOf(first);
  const { token } = (await first.json()) as { token: string };
  const login = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-csrf-token': token, cookie: visitorCookie ?? '' },
    body: JSON.stringify({ email, password }),
  });
  if (login.status !== 200) throw new Error(`sign-in as ${email} answered ${login.status}: ${await login.text()}`);
  const cookie = cookieOf(login)!;
  const { csrfToken } = (await login.json()) as { csrfToken: string };
  return {
    cookie,
    csrf: csrfToken,
    fetch: (path, init = {}) => fetch(`${baseUrl}${path}`, { ...init, headers: { ...(init.headers as Record<string, string>), cookie, 'x-csrf-token': csrfToken } }),
  };
}

/** Packed samples of `n` codes answered as the default model does: a passing session. */
export function modelSamples(n: number): Uint8Array {
  const codes = new Int32Array(n).map((_, i) => (i * 65_536) / n);
  const cos = new Int32Array(n);
  const sin = new Int32Array(n);
  createCordicModel({}).evaluateInto(codes, cos, sin);
  return packSamples(codes, cos, sin, new Uint8Array(n).fill(1));
}

/** The JSON part of a session upload, for the core, build and board given. */
export function sessionPart(ids: { coreId: number; buildId: number | null; boardId: number | null }, notes = ''): string {
  return JSON.stringify({
    ...ids,
    startedAt: '2026-03-02T10:00:00.000Z',
    endedAt: '2026-03-02T10:01:00.000Z',
    plan: { kind: 'sweep', start: 0, step: 16, count: 4096 },
    transport: { kind: 'serial', device: '/dev/ttyUSB1', baud: 3_000_000 },
    notes,
  });
}

/** A multipart session upload body. */
export function sessionForm(part: string, samples: Uint8Array): FormData {
  const form = new FormData();
  form.set('session', part);
  form.set('samples', new Blob([Buffer.from(samples)]), 'samples.bin');
  return form;
}
