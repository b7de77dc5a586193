import fs from 'node:fs';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startMockServer, type MockServer } from '../../mock-device/ws-server';
import { defaultBoardSettings } from '../../mock-device/board-session';
import { parseCoreFault } from '../../mock-device/faulty-core';
import { samplesFromArchive } from '../../shared/link-engine/archive-samples';
import { readArchive } from '../../shared/link';
import { progressOf } from './bench-steps';
import { launchBrowser, startApp, type RunningApp } from './harness';

/** Whether the browser's store (the Bench page's IndexedDB) still holds an unsaved run: nothing to offer once it does not. */
const keepsUnsavedRun = (page: Page) =>
  page.evaluate(
    () =>
      new Promise<boolean>((resolve, reject) => {
        const open = indexedDB.open('anglebench-bench', 1);
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const db = open.result;
          const get = db.transaction('unsaved-run').objectStore('unsaved-run').get('latest');
          get.onerror = () => reject(get.error);
          get.onsuccess = () => {
            db.close();
            resolve(get.result !== undefined);
          };
        };
      }),
  );

let app: RunningApp;
let browser: Browser;

beforeAll(async () => {
  // The page reaches these tests' own simulated boards (npm run mock's), so the CSP must list them.
  app = await startApp({ BRIDGE_ORIGINS: 'ws://127.0.0.1:*' });
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await app?.stop();
});

async function signIn(page: Page, email = 'engineer@anglebench.test') {
  await page.goto(`${app.url}/bench`);
  await page.waitForURL(/\/sign-in\?next=%2Fbench/);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill('anglebench');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/bench$/);
}

describe('sign-in in a real browser', () => {
  it('sends a visitor to /bench to the sign-in page, and back to the bench once signed in', async () => {
    const page = await browser.newPage();
    await signIn(page);
    await expect.poll(() => page.getByTestId('signed-in-as').textContent()).toContain('engineer');
  });

  it('says so plainly when the password is wrong', async () => {
    const page = await browser.newPage();
    await page.goto(`${app.url}/sign-in`);
    await page.getByLabel('E-mail').fill('engineer@anglebench.test');
    await page.getByLabel('Password').fill('not-it');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByRole('alert').textContent()).toContain('Wrong e-mail or password');
  });

  it('keeps a reviewer off the bench: no Bench link, and the page says who it is for', async () => {
    const page = await browser.newPage();
    await signIn(page, 'reviewer@anglebench.test');
    await expect.poll(() => page.getByRole('heading', { name: 'The bench is for engineers' }).isVisible()).toBe(true);
    expect(await page.getByRole('button', { name: 'Connect' }).count()).toBe(0);
    expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Bench' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Save session' }).count()).toBe(0);
  });

  it('signs out with the CSRF token and lands on the sign-in page', async () => {
    const page = await browser.newPage();
    await signIn(page);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);
    await page.goto(`${app.url}/bench`);
    await page.waitForURL(/\/sign-in/);
  });
});

/** Connect the bench to `board`, run every code of the 16-bit core and wait for the end. */
async function runExhaustive(page: Page, board: MockServer, shots?: string) {
  await page.getByLabel('Board address').fill(board.url);
  await page.getByRole('button', { name: 'Connect' }).click();
  await expect.poll(() => page.getByTestId('device-info').textContent(), { timeout: 10_000 }).toContain('simulated board');
  if (shots) await page.screenshot({ path: `/tmp/bench-${shots}-connected.png`, fullPage: true });
  await page.getByLabel('What to ask').selectOption('exhaustive');
  await page.getByRole('button', { name: 'Run', exact: true }).click();
  if (shots) {
    // Under way: some answers are in.
    await expect.poll(async () => (await progressOf(page)).done, { timeout: 10_000 }).toBeGreaterThan(0);
    await page.screenshot({ path: `/tmp/bench-${shots}-running.png`, fullPage: true });
  }
  await expect.poll(() => page.getByTestId('run-state').textContent(), { timeout: 45_000 }).toBe('Complete');
  expect(await page.getByTestId('run-progress').textContent()).toBe('65,536 / 65,536');
  // The final summary follows the last batch from the worker.
  await expect.poll(() => page.getByTestId('stat-scored').textContent()).toContain('65,536');
}

describe('the Bench page against the simulated board', () => {
  let good: MockServer;
  let folded: MockServer;
  beforeAll(async () => {
    good = await startMockServer(defaultBoardSettings(), 0, '127.0.0.1', () => undefined);
    folded = await startMockServer({ ...defaultBoardSettings(), coreFault: parseCoreFault('fold') }, 0, '127.0.0.1', () => undefined);
  });
  afterAll(async () => {
    await good?.close();
    await folded?.close();
  });

  it('runs an exhaustive 16-bit sweep to the end with zero model mismatches', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signIn(page);
    await runExhaustive(page, good, '1280');
    expect(await page.getByTestId('stat-mismatches').textContent()).toBe('0');
    await page.screenshot({ path: '/tmp/bench-1280-done.png', fullPage: true });
    await page.setViewportSize({ width: 1920, height: 1080 });
    await page.waitForFunction(() => window.innerWidth === 1920);
    await page.screenshot({ path: '/tmp/bench-1920-done.png', fullPage: true });

    // Save it: the core defaults to reference-16, and the server judges the samples itself.
    await page.getByRole('button', { name: 'Save session' }).click();
    const form = page.getByRole('form', { name: 'Save session' });
    await expect.poll(() => form.getByLabel('Core').inputValue()).not.toBe('');
    expect(await form.getByLabel('Core').locator('option:checked').textContent()).toContain('reference-16');
    await form.getByLabel('Notes').fill('exhaustive sweep from the browser test');
    await form.getByLabel('Tags (comma-separated)').fill('e2e, exhaustive');
    await form.getByRole('button', { name: 'Save', exact: true }).click();
    // Saved: the page moves to the session's own page.
    await page.waitForURL(/\/sessions\/\d+$/, { timeout: 20_000 });
    const id = Number(new URL(page.url()).pathname.split('/').pop());
    expect(id).toBeGreaterThan(0);
    // The session's page has read everything it shows.
    await page.waitForLoadState('networkidle');
    await page.screenshot({ path: '/tmp/bench-1920-saved.png', fullPage: true });

    // The session list (with the page's own cookies) has it, passed, with all 65,536 samples.
    const list = await page.evaluate(async () => {
      const res = await fetch('/api/sessions', { headers: { accept: 'application/json' } });
      return (await res.json()) as { items: { id: number; passed: boolean; sampleCount: number; tags: string[]; notes: string }[] };
    });
    const row = list.items.find((s) => s.id === id);
    expect(row).toMatchObject({ passed: true, sampleCount: 65_536, tags: ['e2e', 'exhaustive'], notes: 'exhaustive sweep from the browser test' });

    // Its archive is the HELLO → INFO preamble and this run's traffic, every code answered.
    const archive = Uint8Array.from(
      await page.evaluate(async (sid) => Array.from(new Uint8Array(await (await fetch(`/api/sessions/${sid}/archive`)).arrayBuffer())), id),
    );
    const read = readArchive(archive);
    expect(JSON.parse(read.header.label)).toMatchObject({ recordedBy: 'anglebench bench' });
    const replayed = samplesFromArchive(archive);
    // A retried request answered late appears twice in the capture, so count distinct codes.
    expect(replayed.codes.length).toBeGreaterThanOrEqual(65_536);
    expect(new Set(replayed.codes).size).toBe(65_536);
    expect(read.streams['to-host'].length).toBeGreaterThan(65_536 * 4);
  }, 120_000);

  it('shows model mismatches for a core with a folding fault', async () => {
    const page = await browser.newPage({ viewport: { width: 1920, height: 1080 } });
    await signIn(page);
    await runExhaustive(page, folded, '1920-fold');
    const mismatches = Number((await page.getByTestId('stat-mismatches').textContent())!.replace(/,/g, ''));
    expect(mismatches).toBeGreaterThan(0);
    expect(await page.getByText('First mismatches').isVisible()).toBe(true);
    await page.screenshot({ path: '/tmp/bench-1920-fold-done.png', fullPage: true });
    // Mismatches carry their request index; an exhaustive sweep asks code i at index i (codes from 0).
    const first = page.getByRole('table').filter({ hasText: 'First mismatches' }).locator('tbody tr').first();
    const [index, code] = await first.locator('td').allTextContents();
    expect(Number(index)).toBe(Number(code));
  });

  it('keeps an unsaved tone run through a reload, with its spectral figures', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 }, permissions: ['clipboard-read', 'clipboard-write'] });
    await signIn(page);
    await page.getByLabel('Board address').fill(good.url);
    await page.getByRole('button', { name: 'Connect' }).click();
    await expect.poll(() => page.getByTestId('device-info').textContent(), { timeout: 10_000 }).toContain('simulated board');
    await page.getByLabel('What to ask').selectOption('tone');
    await page.getByLabel('Cycles').fill('127');
    await page.getByLabel('Samples (power of 2)').fill('4096');
    await page.getByRole('button', { name: 'Run', exact: true }).click();
    await expect.poll(() => page.getByTestId('run-state').textContent(), { timeout: 30_000 }).toBe('Complete');
    await expect.poll(() => page.getByTestId('stat-scored').textContent()).toContain('4,096');
    // The 16-bit model's spurs sit far below the tone (its error is a few LSB of 2^14).
    await expect.poll(() => page.getByTestId('tone-sfdr-cos').textContent()).toMatch(/dB$/);
    const sfdr = parseFloat((await page.getByTestId('tone-sfdr-cos').textContent())!);
    expect(sfdr).toBeGreaterThan(60);
    const enob = parseFloat((await page.getByTestId('tone-enob-sin').textContent())!);
    expect(enob).toBeGreaterThan(8);
    expect(enob).toBeLessThan(16);

    // Find in the kept traffic: every RESULTS frame line, forwards and back. The pane takes its
    // lines once a frame, so on a busy machine the last few may still join between two searches:
    // each search counts what is kept at that moment, and the positions are what is checked.
    const find = page.getByLabel('Find in traffic');
    await find.fill('results tag');
    await find.press('Enter');
    await expect.poll(() => page.getByTestId('traffic-find-status').textContent()).toMatch(/^1 of \d+$/);
    const total = Number((await page.getByTestId('traffic-find-status').textContent())!.split(' of ')[1]);
    expect(total).toBeGreaterThan(1);
    await page.getByRole('button', { name: 'Next match' }).click();
    expect(await page.getByTestId('traffic-find-status').textContent()).toMatch(/^2 of \d+$/);
    await page.getByRole('button', { name: 'Previous match' }).click();
    await page.getByRole('button', { name: 'Previous match' }).click();
    // Back past the first match wraps to the last one.
    expect(await page.getByTestId('traffic-find-status').textContent()).toMatch(/^(\d+) of \1$/);
    await find.fill('no such bytes zz');
    await find.press('Enter');
    expect(await page.getByTestId('traffic-find-status').textContent()).toBe('Not found');
    // Copy all puts the kept traffic, without colour codes, on the clipboard…
    await page.getByRole('button', { name: 'Copy all' }).click();
    await expect.poll(() => page.getByText('Copied the kept traffic.').isVisible()).toBe(true);
    const copied = await page.evaluate(() => navigator.clipboard.readText());
    expect(copied).toContain('RESULTS tag');
    expect(copied).not.toContain('\x1b[');
    // …and where the clipboard refuses, the same text arrives as a download.
    await page.evaluate(() => {
      navigator.clipboard.writeText = () => Promise.reject(new DOMException('denied', 'NotAllowedError'));
    });
    const download = page.waitForEvent('download');
    await page.getByRole('button', { name: 'Copy all' }).click();
    const file = await download;
    expect(file.suggestedFilename()).toBe('line-traffic.txt');
    const text = fs.readFileSync((await file.path())!, 'utf8');
    expect(text).toContain('RESULTS tag');
    expect(text).not.toContain('\x1b[');

    await page.reload();
    const restore = page.getByRole('button', { name: /^Restore unsaved run from / });
    await restore.waitFor({ timeout: 10_000 });
    await page.screenshot({ path: '/tmp/bench-1280-restore-offer.png', fullPage: true });
    await restore.click();
    await expect.poll(() => page.getByTestId('stat-scored').textContent()).toContain('4,096');
    expect(await page.getByTestId('stat-mismatches').textContent()).toBe('0');
    expect(await page.getByTestId('run-progress').textContent()).toBe('4,096 / 4,096');
    await expect.poll(() => page.getByTestId('tone-sfdr-cos').textContent()).toBe(`${sfdr.toFixed(1)} dB`);
    expect(await page.getByRole('button', { name: 'Save session' }).isVisible()).toBe(true);
    await page.screenshot({ path: '/tmp/bench-1280-restored.png', fullPage: true });

    // Discarded, it is not offered again.
    await page.reload();
    await page.getByRole('button', { name: 'Discard' }).click();
    await expect.poll(() => keepsUnsavedRun(page)).toBe(false);
    await page.reload();
    await page.getByRole('heading', { name: 'Bench' }).waitFor();
    expect(await restore.count()).toBe(0);
  });
});
