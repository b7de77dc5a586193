// explain-browser: the same explanation in Node and in the session page's Web Worker in headless
// Chromium, in the same run. The answers are an exhaustive 16-bit sweep of the demo's reference
// core with iteration 5 turning the wrong way; each side unpacks the packed samples and runs the
// shared explain() over them, three times (the page starts a fresh worker each time), and the
// medians are compared. Target: the browser within 2× of Node.
import { chromium, type Page } from 'playwright-core';
import { createFaultyModel, explain } from '../shared/explain';
import { packColumns, unpackSamples } from '../shared/link-engine/sample-pack';
import { parseModelConfig } from '../shared/numeric';
import { startPageApp } from './page-app';
import type { BenchResult } from './report';

const RUNS = 3;
const MAX_RATIO = 2;
const declared = parseModelConfig({}); // the demo's reference-16 core

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/** Every 16-bit code, answered by the reference core with one defect. */
function faultySweep(): Uint8Array {
  const n = 2 ** declared.angleBits;
  const codes = new Float64Array(n).map((_, i) => i);
  const cos = new Int32Array(n);
  const sin = new Int32Array(n);
  const core = createFaultyModel(declared, { kind: 'sign-slip', iteration: 5 });
  for (let i = 0; i < n; i++) ({ cos: cos[i], sin: sin[i] } = core.evaluate(codes[i]));
  return packColumns({ codes, cos, sin });
}

/** Node: unpack and explain, as the worker does; milliseconds of wall time. */
function nodeMs(packed: Uint8Array): { ms: number; best: string } {
  const t0 = performance.now();
  const s = unpackSamples(packed, declared.angleFormat);
  const e = explain(declared, { angle: s.codes, cos: s.cos, sin: s.sin });
  return { ms: performance.now() - t0, best: e.hypotheses[0]?.label ?? '' };
}

/** Store the samples as a session of reference-16 through the API, with the page's cookie and CSRF token. */
function uploadSession(page: Page, packed: Uint8Array): Promise<number> {
  return page.evaluate(async (bytes) => {
    const { token } = (await (await fetch('/api/auth/csrf')).json()) as { token: string };
    const form = new FormData();
    form.set('session', JSON.stringify({ coreSlug: 'reference-16', startedAt: new Date().toISOString(), plan: { kind: 'exhaustive' }, transport: { kind: 'benchmark' }, notes: 'explain-browser benchmark' }));
    form.set('samples', new Blob([new Uint8Array(bytes)]), 'samples.bin');
    const res = await fetch('/api/sessions', { method: 'POST', body: form, headers: { 'x-csrf-token': token } });
    if (!res.ok) throw new Error(`upload refused: ${res.status} ${await res.text()}`);
    return ((await res.json()) as { id: number }).id;
  }, Array.from(packed));
}

/** One search in the session page's worker: the time the worker measured, and the best hypothesis shown. */
async function browserMs(page: Page): Promise<{ ms: number; best: string }> {
  const panel = page.getByTestId('explain-panel');
  await panel.getByRole('button', { name: 'Explain in this browser' }).click();
  const elapsed = panel.getByTestId('explain-elapsed');
  await elapsed.waitFor({ timeout: 120_000 });
  const ms = Number(await elapsed.getAttribute('data-elapsed-ms'));
  const best = (await panel.getByTestId('explain-result').getByTestId('explanation-hypotheses').locator('li').first().locator('span').first().textContent()) ?? '';
  return { ms, best };
}

export async function explainBrowserBench(): Promise<BenchResult[]> {
  const packed = faultySweep();
  const node = Array.from({ length: RUNS }, () => nodeMs(packed));
  const app = await startPageApp();
  const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', headless: true, args: ['--no-sandbox', '--disable-gpu'] });
  try {
    const page = await browser.newPage({ viewport: { width: 1400, height: 1400 } });
    await page.goto(`${app.url}/sign-in?next=/sessions`);
    await page.getByLabel('E-mail').fill('engineer@anglebench.test');
    await page.getByLabel('Password').fill('anglebench');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((u) => u.pathname === '/sessions');
    const id = await uploadSession(page, packed);
    const inPage: Array<{ ms: number; best: string }> = [];
    for (let k = 0; k < RUNS; k++) {
      await page.goto(`${app.url}/sessions/${id}`);
      inPage.push(await browserMs(page));
    }
    // Both sides must have found the same thing, or the times compare different work.
    const bests = new Set([...node, ...inPage].map((r) => r.best));
    if (bests.size !== 1) throw new Error(`Node and the page named different best hypotheses: ${[...bests].join(' | ')}`);
    const nodeMedian = median(node.map((r) => r.ms));
    const pageMedian = median(inPage.map((r) => r.ms));
    console.log(`  best hypothesis: ${[...bests][0]}; Node ${node.map((r) => r.ms.toFixed(0)).join(', ')} ms; page worker ${inPage.map((r) => r.ms.toFixed(0)).join(', ')} ms`);
    return [
      { name: 'explain-node', value: nodeMedian, unit: 'ms, exhaustive 16-bit, median of 3', ratio: null, ratioOf: '', target: null, met: null },
      {
        name: 'explain-page-worker',
        value: pageMedian,
        unit: 'ms, exhaustive 16-bit, median of 3',
        ratio: pageMedian / nodeMedian,
        ratioOf: 'page worker ÷ Node, same run',
        target: `ratio ≤ ${MAX_RATIO}`,
        met: pageMedian / nodeMedian <= MAX_RATIO,
      },
    ];
  } finally {
    await browser.close();
    await app.stop();
  }
}
