// A session's CSV and JSON exports, downloaded from its page and read back against the samples
// it was saved with, and its printable report.
import fs from 'node:fs';
import Decimal from 'decimal.js';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { packSamples } from '../../shared/link-engine/sample-pack';
import { createCordicModel, parseModelConfig } from '../../shared/numeric';
import { appAndBrowser, signInAs } from './harness';
import { pageGet, uploadSession } from './page-fetch';

const ctx = appAndBrowser();
let page: Page;
let id: number;

// 256 codes, every 256th of the 16-bit circle, answered as the reference-16 model does, but the
// cos of every 32nd answer 5 LSB high: a session that fails, so the exports carry real errors.
const N = 256;
const codes = Int32Array.from({ length: N }, (_, i) => i * 256);
const modelCos = new Int32Array(N);
const modelSin = new Int32Array(N);
createCordicModel(parseModelConfig({})).evaluateInto(codes, modelCos, modelSin);
const cos = modelCos.map((c, i) => (i % 32 === 0 ? c + 5 : c));
const sin = modelSin;
const NOTES = 'export check, bay 4';

beforeAll(async () => {
  page = await ctx.browser.newPage({ viewport: { width: 1280, height: 800 } });
  await signInAs(page, ctx.app, 'engineer', '/sessions');
  const session = { coreSlug: 'reference-16', startedAt: new Date().toISOString(), plan: { kind: 'sweep', start: 0, step: 256, count: N }, transport: { kind: 'test' }, notes: NOTES, tags: ['export'] };
  const up = await uploadSession(page, session, packSamples(codes, cos, sin, new Uint8Array(N).fill(1)));
  expect(up.status).toBe(201);
  id = up.body.id;
});
afterAll(async () => {
  await page?.close();
});

/** Click `name` on the session's page and read the file it downloads. */
async function download(name: string) {
  const started = page.waitForEvent('download');
  await page.getByRole(name === 'Export JSON' ? 'button' : 'link', { name, exact: true }).click();
  const file = await started;
  return { name: file.suggestedFilename(), text: fs.readFileSync((await file.path())!, 'utf8') };
}

describe('a session’s exports', () => {
  it('downloads a CSV with a row per saved sample: its code and answer, the exact values and the model’s', async () => {
    await page.goto(`${ctx.app.url}/sessions/${id}`);
    await page.getByRole('heading', { name: 'Baseline, compare and export' }).waitFor();
    const csv = await download('Export CSV');
    expect(csv.name).toBe(`session-${id}.csv`);
    const [header, ...rows] = csv.text.trimEnd().split('\n');
    expect(header).toBe('index,angle_code,angle_deg,cos_code,sin_code,exact_cos,exact_sin,model_cos,model_sin,cos_err_lsb,sin_err_lsb');
    expect(rows).toHaveLength(N);
    // Exact values from decimal.js at 40 digits (π from Decimal.acos(-1)), beside the core's Q1.14
    // outputs: 2^14 codes to 1.0 for the 16-bit output with 14 fraction bits.
    Decimal.set({ precision: 40 });
    const pi = Decimal.acos(-1);
    rows.forEach((row, i) => {
      const f = row.split(',').map(Number);
      expect(f.slice(0, 2)).toEqual([i, codes[i]]);
      expect(f[2]).toBe((codes[i] * 360) / 65536); // a binary fraction: exact in a double
      expect(f.slice(3, 5)).toEqual([cos[i], sin[i]]);
      const turn = new Decimal(codes[i]).div(65536).times(pi.times(2));
      const [exactCos, exactSin] = [Decimal.cos(turn).toNumber(), Decimal.sin(turn).toNumber()];
      expect(f[5]).toBeCloseTo(exactCos, 14);
      expect(f[6]).toBeCloseTo(exactSin, 14);
      expect(f.slice(7, 9)).toEqual([modelCos[i], modelSin[i]]);
      expect(f[9]).toBeCloseTo(cos[i] - exactCos * 16384, 9);
      expect(f[10]).toBeCloseTo(sin[i] - exactSin * 16384, 9);
    });
  });

  it('downloads the session record as JSON, the same the server gives', async () => {
    await page.goto(`${ctx.app.url}/sessions/${id}`);
    await page.getByRole('heading', { name: 'Baseline, compare and export' }).waitFor();
    const json = await download('Export JSON');
    expect(json.name).toBe(`session-${id}.json`);
    const saved = JSON.parse(json.text) as { id: number; sampleCount: number; passed: boolean; notes: string; stats: { count: number; mismatches: { count: number; maxAbsDiffLsb: number } } };
    expect(saved).toEqual((await pageGet<{ session: unknown }>(page, `/api/sessions/${id}`)).session);
    expect(saved).toMatchObject({ id, sampleCount: N, passed: false, notes: NOTES });
    // 8 of the 256 answers are off the model, each by 5 LSB.
    expect(saved.stats.count).toBe(N);
    expect(saved.stats.mismatches).toMatchObject({ count: N / 32, maxAbsDiffLsb: 5 });
  });

  it('opens the printable report, which prints without the app’s header and buttons', async () => {
    await page.goto(`${ctx.app.url}/sessions/${id}`);
    await page.getByRole('link', { name: 'Printable report' }).click();
    await page.waitForURL(new RegExp(`/sessions/${id}/report$`));
    const title = page.getByRole('heading', { level: 1 });
    await expect.poll(() => title.textContent()).toMatch(new RegExp(`^Bench session #${id} — `));
    const report = page.getByRole('article');
    await expect.poll(() => report.textContent()).toContain(NOTES);
    expect(await report.getByRole('table').first().textContent()).toMatch(/Model mismatches|Largest/);
    await page.screenshot({ path: '/tmp/report-screen.png', fullPage: true });

    await page.emulateMedia({ media: 'print' });
    expect(await page.getByRole('banner').count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Print' }).isVisible()).toBe(false);
    expect(await title.isVisible()).toBe(true);
    const pdf = await page.pdf({ format: 'A4' });
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    await page.screenshot({ path: '/tmp/report-print.png', fullPage: true });
    await page.emulateMedia({ media: 'screen' });
  });
});
