// A session whose capture cannot be read (uploaded here through the API with a damaged archive):
// opening it says so plainly, and the rest of the session's page goes on working.
import type { Page } from 'playwright-core';
import { afterEach, beforeAll, describe, expect, it } from 'vitest';
import { packSamples } from '../../shared/link-engine/sample-pack';
import { createCordicModel, parseModelConfig } from '../../shared/numeric';
import { listCapture } from '../support/capture';
import { appAndBrowser, signInAs } from './harness';
import { uploadSession } from './page-fetch';

const ctx = appAndBrowser();
const codes = Array.from({ length: 64 }, (_, i) => i * 1024);
const good = listCapture(codes);
// Damaged three ways: cut short in its records, its first bytes (the format's magic) overwritten,
// and no archive at all but text.
const damaged: [what: string, bytes: Uint8Array][] = [
  ['cut short', good.subarray(0, Math.floor(good.length * 0.6))],
  ['with its magic overwritten', Uint8Array.from(good, (b, i) => (i < 4 ? 0x58 : b))],
  ['that is text', new TextEncoder().encode('index,angle_code\n0,0\n')],
];
const ids = new Map<string, number>();

beforeAll(async () => {
  const page = await ctx.browser.newPage();
  await signInAs(page, ctx.app, 'engineer', '/sessions');
  const cos = new Int32Array(codes.length);
  const sin = new Int32Array(codes.length);
  createCordicModel(parseModelConfig({})).evaluateInto(Int32Array.from(codes), cos, sin);
  const samples = packSamples(codes, cos, sin, new Uint8Array(codes.length).fill(1));
  for (const [what, bytes] of damaged) {
    const session = { coreSlug: 'reference-16', startedAt: new Date().toISOString(), plan: { kind: 'list', codes }, transport: { kind: 'test' }, notes: `capture ${what}` };
    const up = await uploadSession(page, session, samples, bytes);
    expect(up.status, JSON.stringify(up.body)).toBe(201);
    ids.set(what, up.body.id);
  }
  await page.close();
});

const pages: Page[] = [];
afterEach(async () => {
  await Promise.all(pages.splice(0).map((p) => p.close()));
});

describe('a session whose capture cannot be read', () => {
  for (const [what] of damaged) {
    it(`says the capture ${what} could not be read, and the page goes on working`, async () => {
      const page = await ctx.browser.newPage({ viewport: { width: 1280, height: 800 } });
      pages.push(page);
      const crashes: string[] = [];
      page.on('pageerror', (e) => crashes.push(e.message));
      const id = ids.get(what)!;
      await signInAs(page, ctx.app, 'engineer', `/sessions/${id}`);
      await page.getByRole('button', { name: 'Open capture' }).click();
      const pane = page.getByRole('region', { name: 'Recorded capture' });
      await expect.poll(() => pane.getByRole('alert').textContent(), { timeout: 10_000 }).toMatch(/^The capture could not be read: \S/);
      console.log(`${what}: ${await pane.getByRole('alert').textContent()}`);
      await page.screenshot({ path: `/tmp/capture-damaged-${what.replace(/\W+/g, '-')}.png`, fullPage: true });
      // The rest of the page is still there and still answers.
      expect(await page.getByRole('heading', { level: 1 }).textContent()).toContain(`#${id}`);
      expect(await page.getByRole('table', { name: 'Verdict per limit' }).isVisible()).toBe(true);
      await page.getByRole('link', { name: 'Printable report' }).click();
      await page.waitForURL(new RegExp(`/sessions/${id}/report$`));
      await expect.poll(() => page.getByRole('heading', { level: 1 }).textContent()).toContain(`#${id}`);
      expect(crashes).toEqual([]);
    });
  }
});
