// The API from inside a signed-in page, with its cookie (and, for writes, its CSRF token), as
// the client itself calls it.
import type { Page } from 'playwright-core';

/** GET `path` as JSON from the page. */
export async function pageGet<T>(page: Page, path: string): Promise<T> {
  const r = await page.evaluate(async (p) => {
    const res = await fetch(p, { headers: { accept: 'application/json' } });
    return { status: res.status, body: (await res.json()) as unknown };
  }, path);
  if (r.status !== 200) throw new Error(`GET ${path}: ${r.status} ${JSON.stringify(r.body)}`);
  return r.body as T;
}

/** POST `body` as JSON from the page. */
export function pagePost(page: Page, path: string, body: unknown): Promise<{ status: number; body: unknown }> {
  return page.evaluate(
    async ({ path, body }) => {
      const { token } = (await (await fetch('/api/auth/csrf')).json()) as { token: string };
      const res = await fetch(path, { method: 'POST', headers: { 'content-type': 'application/json', 'x-csrf-token': token }, body: JSON.stringify(body) });
      return { status: res.status, body: (await res.json()) as unknown };
    },
    { path, body },
  );
}

export interface UploadedSession {
  status: number;
  body: { id: number; passed: boolean; error?: { code: string; message: string } };
}

/**
 * POST /api/sessions from the page as the Bench page does: `session` JSON, the packed `samples`
 * and an optional capture `archive`.
 */
export function uploadSession(page: Page, session: Record<string, unknown>, samples: Uint8Array, archive: Uint8Array | null = null): Promise<UploadedSession> {
  return page.evaluate(
    async ({ session, samples, archive }) => {
      const { token } = (await (await fetch('/api/auth/csrf')).json()) as { token: string };
      const form = new FormData();
      form.set('session', JSON.stringify(session));
      form.set('samples', new Blob([new Uint8Array(samples)]), 'samples.bin');
      if (archive) form.set('archive', new Blob([new Uint8Array(archive)]), 'capture.abrc');
      const res = await fetch('/api/sessions', { method: 'POST', body: form, headers: { 'x-csrf-token': token } });
      return { status: res.status, body: (await res.json()) as UploadedSession['body'] };
    },
    { session, samples: Array.from(samples), archive: archive && Array.from(archive) },
  );
}
