// The explain benchmark's browser half: the same answers searched in the session page's Web Worker
// in headless Chromium. Each set of answers is stored as a session of the demo's reference core
// (through the API, as an upload), its page opened and "Explain in this browser" pressed `passes`
// times; the time is the one the worker measures (unpacking and the search, not the drawing). The
// first pass starts a fresh worker (cold); the page keeps it for the later ones (warm), as it does
// for a user who searches again.
import { chromium, type Page } from 'playwright-core';
import { packColumns } from '../shared/link-engine/sample-pack';
import { startPageApp } from './page-app';

export interface PageSamples {
  angle: Float64Array;
  cos: Int32Array;
  sin: Int32Array;
}

/** Store the answers as a session of reference-16 with the page's cookie and CSRF token; its id. */
function uploadSession(page: Page, s: PageSamples): Promise<number> {
  const packed = Array.from(packColumns({ codes: s.angle, cos: s.cos, sin: s.sin }));
  return page.evaluate(async (bytes) => {
    const { token } = (await (await fetch('/api/auth/csrf')).json()) as { token: string };
    const form = new FormData();
    form.set('session', JSON.stringify({ coreSlug: 'reference-16', startedAt: new Date().toISOString(), plan: { kind: 'exhaustive' }, transport: { kind: 'benchmark' }, notes: 'explain benchmark' }));
    form.set('samples', new Blob([new Uint8Array(bytes)]), 'samples.bin');
    const res = await fetch('/api/sessions', { method: 'POST', body: form, headers: { 'x-csrf-token': token } });
    if (!res.ok) throw new Error(`upload refused: ${res.status} ${await res.text()}`);
    return ((await res.json()) as { id: number }).id;
  }, packed);
}

/** The `run`-th search on the open session page: its time in the worker and the best hypothesis the panel names. */
async function searchOnce(page: Page, run: number): Promise<{ ms: number; best: string }> {
  const panel = page.getByTestId('explain-panel');
  await panel.getByRole('button', { name: 'Explain in this browser' }).click();
  const elapsed = panel.locator(`[data-testid="explain-elapsed"][data-run="${run}"]`);
  await elapsed.waitFor({ timeout: 180_000 });
  const best = await panel.getByTestId('explain-result').getByTestId('explanation-hypotheses').locator('li').first().locator('span').first().textContent();
  return { ms: Number(await elapsed.getAttribute('data-elapsed-ms')), best: best ?? '' };
}

/** Each set of answers searched `passes` times in the page's worker (the first cold): the times, and the best hypothesis named. */
export async function explainInPage(sets: PageSamples[], passes: number): Promise<Array<{ ms: number[]; best: string }>> {
  const app = await startPageApp();
  const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', headless: true, args: ['--no-sandbox', '--disable-gpu'] });
  try {
    const page = await browser.newPage({ viewport: { width: 1400, height: 1400 } });
    await page.goto(`${app.url}/sign-in?next=/sessions`);
    await page.getByLabel('E-mail').fill('engineer@anglebench.test');
    await page.getByLabel('Password').fill('anglebench');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((u) => u.pathname === '/sessions');
    const out: Array<{ ms: number[]; best: string }> = [];
    for (const s of sets) {
      const id = await uploadSession(page, s);
      await page.goto(`${app.url}/sessions/${id}`);
      const runs: Array<{ ms: number; best: string }> = [];
      for (let p = 1; p <= passes; p++) runs.push(await searchOnce(page, p));
      const names = new Set(runs.map((r) => r.best));
      if (names.size !== 1) throw new Error(`the page named different best hypotheses on the same answers: ${[...names].join(' | ')}`);
      out.push({ ms: runs.map((r) => r.ms), best: runs[0].best });
    }
    return out;
  } finally {
    await browser.close();
    await app.stop();
  }
}
