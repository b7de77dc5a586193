import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { packSamples } from '../../shared/link-engine/sample-pack';
import { createCordicModel } from '../../shared/numeric';
import { launchBrowser, startApp, type RunningApp } from './harness';

let app: RunningApp;
let browser: Browser;
const ids = { good: 0, altered: 0 };
// Codes whose cos answer is made 1 LSB high in the second session.
const ALTERED = [100, 2_000, 30_000, 45_678, 65_000];

const cookieOf = (res: Response) => res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');

/** POST a session of every 16-bit code to reference-16 as the engineer, over HTTP. */
async function postSessions(url: string, sessions: Uint8Array<ArrayBuffer>[]): Promise<number[]> {
  const csrf = await fetch(`${url}/api/auth/csrf`);
  const { token } = (await csrf.json()) as { token: string };
  const login = await fetch(`${url}/api/auth/login`, {
    method: 'POST',
    headers: { cookie: cookieOf(csrf), 'x-csrf-token': token, 'content-type': 'application/json' },
    body: JSON.stringify({ email: 'engineer@anglebench.test', password: 'anglebench' }),
  });
  expect(login.status).toBe(200);
  const cookie = cookieOf(login);
  const { csrfToken } = (await login.json()) as { csrfToken: string };
  const out: number[] = [];
  for (const samples of sessions) {
    const form = new FormData();
    const session = { coreSlug: 'reference-16', startedAt: new Date().toISOString(), plan: { kind: 'exhaustive' }, transport: { kind: 'e2e' }, link: { checkFailures: 0 } };
    form.set('session', JSON.stringify(session));
    form.set('samples', new Blob([samples]), 'samples.bin');
    const res = await fetch(`${url}/api/sessions`, { method: 'POST', headers: { cookie, 'x-csrf-token': csrfToken }, body: form });
    expect(res.status).toBe(201);
    out.push(((await res.json()) as { id: number }).id);
  }
  return out;
}

beforeAll(async () => {
  app = await startApp();
  browser = await launchBrowser();
  // reference-16 runs the default model configuration (server/db/seed.ts).
  const model = createCordicModel({});
  const n = 65_536;
  const codes = Int32Array.from({ length: n }, (_, i) => i);
  const cos = new Int32Array(n);
  const sin = new Int32Array(n);
  model.evaluateInto(codes, cos, sin);
  const all = new Uint8Array(n).fill(1);
  const good = packSamples(codes, cos, sin, all);
  for (const c of ALTERED) cos[c] += 1;
  const altered = packSamples(codes, cos, sin, all);
  [ids.good, ids.altered] = await postSessions(app.url, [good, altered]);
});
afterAll(async () => {
  await browser?.close();
  await app?.stop();
});

async function signInAt(page: Page, path: string) {
  await page.goto(`${app.url}${path}`);
  await page.waitForURL(/\/sign-in\?next=/);
  await page.getByLabel('E-mail').fill('reviewer@anglebench.test');
  await page.getByLabel('Password').fill('anglebench');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => u.pathname === '/compare');
}

describe('the Compare page in a real browser', () => {
  it('shows how many codes differ, where, and the limit the altered session fails', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signInAt(page, `/compare?ids=${ids.good},${ids.altered}`);
    const count = page.getByTestId(`diff-count-${ids.altered}`);
    await expect.poll(() => count.textContent(), { timeout: 15_000 }).toBe('5');
    expect(await page.getByTestId(`diff-summary-${ids.altered}`).textContent()).toContain('5 of 65,536 codes both answered differ; the largest difference is 1 LSB.');
    const listed = page.getByRole('table', { name: /^First differing codes/ });
    expect(await listed.locator('tbody tr td:first-child').allTextContents()).toEqual(ALTERED.map(String));

    const failing = page.getByTestId(`verdict-${ids.altered}-maxModelMismatches`);
    expect(await failing.textContent()).toMatch(/Model mismatches\s*at most 0 results\s*5 results\s*FAIL/);
    expect(await page.getByTestId(`verdict-${ids.good}-maxModelMismatches`).textContent()).toMatch(/0 results\s*PASS$/);
    expect(await page.getByTestId(`verdict-${ids.good}`).textContent()).not.toContain('FAIL');
    // The statistics say the mismatches got worse, in words as well as colour.
    expect(await page.getByTestId('stat-row-modelMismatches').textContent()).toContain('▲ +5 worse');
    for (const chart of ['compare-error-chart', 'compare-histogram-chart', 'compare-diff-chart']) {
      expect(await page.getByTestId(chart).locator('canvas').count()).toBe(1);
    }
    await page.screenshot({ path: '/tmp/compare-1280.png', fullPage: true });
  });

  it('keeps the chosen sessions in the address: adding one from the latest of the same core, removing one', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signInAt(page, `/compare?ids=${ids.altered}`);
    await expect.poll(() => page.getByText('Choose at least two sessions').isVisible()).toBe(true);
    const select = page.getByLabel('Latest sessions of the same core');
    await expect.poll(() => select.locator(`option[value="${ids.good}"]`).count()).toBe(1);
    await select.selectOption(String(ids.good));
    await page.waitForURL((u) => u.searchParams.get('ids') === `${ids.altered},${ids.good}`);
    // The altered session is now the reference; the good one differs from it in the same 5 codes.
    await expect.poll(() => page.getByTestId(`diff-count-${ids.good}`).textContent(), { timeout: 15_000 }).toBe('5');
    await page.getByRole('button', { name: `Remove session #${ids.altered}` }).click();
    await page.waitForURL((u) => u.searchParams.get('ids') === String(ids.good));
  });
});
