// A vectoring core end to end in the browser: a simulated vectoring board (npm run mock's), a grid
// run from the Bench page with its plots and figures, saved to the demo's vectoring core; the
// session page's vectoring figures, verdict and plots; the compare of two vectoring sessions. Each
// new page state passes the WCAG 2.1 AA audit.
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { defaultBoardSettings } from '../../mock-device/board-session';
import { startMockServer, type MockServer } from '../../mock-device/ws-server';
import { PHASE_DETECTOR_CONFIG } from '../../server/db/seed-vectoring';
import { describeViolations, landmarkViolations, seriousViolations } from './axe-audit';
import { runButton } from './bench-steps';
import { appAndBrowser, signInAs } from './harness';

// The page reaches this test's own simulated board, so the CSP must list it.
const ctx = appAndBrowser({ BRIDGE_ORIGINS: 'ws://127.0.0.1:*' });
let board: MockServer;

beforeAll(async () => {
  // The demo's phase detector, so its saved sessions are judged against that core's limits.
  board = await startMockServer({ ...defaultBoardSettings(), vector: { core: PHASE_DETECTOR_CONFIG } }, 0, '127.0.0.1', () => undefined);
});
afterAll(async () => {
  await board?.close();
});

async function audited(page: Page, what: string) {
  await page.screenshot({ path: `/tmp/vectoring-${what}.png`, fullPage: true });
  const found = [...(await seriousViolations(page)), ...(await landmarkViolations(page))];
  expect(describeViolations(found), `serious or critical WCAG 2.1 AA violations, or repeated landmarks, on the ${what} page`).toBe('');
}

/** Run a plan already chosen in the form to completion; its "done / total". */
async function runToCompletion(page: Page, total: string) {
  await runButton(page, 'Run').click();
  await expect.poll(() => page.getByTestId('run-state').textContent(), { timeout: 60_000 }).toBe('Complete');
  expect(await page.getByTestId('run-progress').textContent()).toBe(total);
}

async function save(page: Page): Promise<number> {
  await page.getByRole('button', { name: 'Save session' }).click();
  const form = page.getByRole('form', { name: 'Save session' });
  // Only vectoring cores are offered for a vectoring run; the demo has one, chosen for us.
  await expect.poll(() => form.getByLabel('Core').locator('option:checked').textContent()).toContain('phase-detector-16');
  expect(await form.getByLabel('Core').locator('option').allTextContents()).not.toContain('reference-16');
  await form.getByRole('button', { name: 'Save', exact: true }).click();
  await page.waitForURL(/\/sessions\/\d+$/, { timeout: 30_000 });
  return Number(new URL(page.url()).pathname.split('/').pop());
}

describe('a vectoring core on the Bench, Session and Compare pages', () => {
  it('runs a grid, plots and saves it; shows the stored session and compares two', async () => {
    const { app, browser } = ctx;
    // axe-core goes in as an inline script, which the app's CSP forbids: this context bypasses it.
    const context = await browser.newContext({ bypassCSP: true, viewport: { width: 1500, height: 1000 } });
    try {
      const page = await context.newPage();
      await signInAs(page, app, 'engineer', '/bench');
      await page.getByLabel('Board address').fill(board.url);
      await page.getByRole('button', { name: 'Connect' }).click();
      await expect.poll(() => page.getByTestId('device-info').textContent(), { timeout: 15_000 }).toContain('simulated board');

      // The board reports a vectoring core: the vectoring plans are offered, scored against the demo core of the same formats.
      const plan = page.getByRole('form', { name: 'Vectoring plan' });
      await expect.poll(() => plan.getByLabel('Score against').locator('option:checked').textContent()).toContain('phase-detector-16');
      // A bad entry is refused on its field, and nothing runs.
      await plan.getByLabel('Pairs to ask').selectOption('circle');
      await plan.getByLabel('Radius, codes').fill('40000');
      await runButton(page, 'Run').click();
      await expect.poll(() => plan.getByText('A whole number from 1 to 32,767').count()).toBe(1);
      await plan.getByLabel('Pairs to ask').selectOption('exhaustive');
      await runButton(page, 'Run').click();
      await expect.poll(() => page.getByRole('alert').filter({ hasText: 'exhaustive plans take inputs of at most 8 bits' }).count()).toBe(1);

      // A grid of 64 × 64 pairs over the x–y square.
      await plan.getByLabel('Pairs to ask').selectOption('grid');
      await plan.getByLabel('Pairs, at most (a square grid)').fill('4096');
      await runToCompletion(page, '4,096 / 4,096');
      await expect.poll(() => page.getByTestId('stat-scored').textContent()).toBe('4,096');
      expect(await page.getByTestId('stat-mismatches').textContent()).toBe('0');
      expect(await page.getByTestId('stat-angle-max').textContent()).toMatch(/^\d+\.\d{3} LSB at \(-?\d+, -?\d+\)$/);
      expect(await page.getByTestId('stat-coverage').textContent()).toBe('100.00 % of 16 × 16');
      for (const chart of ['chart-angle-error', 'chart-magnitude-error', 'chart-vector-histogram']) {
        await page.getByTestId(chart).locator('canvas').waitFor();
      }
      // The error map says in words where its largest error is, once the answers are in. One pair per
      // cell; the zero vector's cell has no angle error (the zero vector has no angle).
      await expect.poll(() => page.getByTestId('chart-error-map').locator('canvas').getAttribute('aria-label')).toMatch(/4095 of 4096 cells answered; the largest, [\d.]+ LSB, near x = /);
      await audited(page, 'bench');

      const first = await save(page);
      await page.getByTestId('vector-stats').waitFor();
      expect(await page.getByTestId('vector-stats').innerText()).toMatch(/Scored pairs\s+4,096/);
      // The demo core's limits, judged by the server: every answer equals the model.
      expect(await page.getByTestId('verdict-maxModelMismatches').innerText()).toMatch(/Pass$/);
      expect(await page.getByTestId('verdict-maxAngleErrorLsb').innerText()).toContain('Largest |angle error|');
      await expect.poll(() => page.getByTestId('browser-recheck').textContent(), { timeout: 30_000 }).toContain('the same figures as the server');
      await page.getByTestId('chart-angle-error').locator('canvas').first().waitFor();
      await expect.poll(() => page.getByTestId('chart-error-map').locator('canvas').getAttribute('aria-label')).toMatch(/4095 of 4096 cells answered/);
      await audited(page, 'session');

      // A second run of the same grid, for the compare: bit for bit the same answers.
      await page.goto(`${app.url}/bench`);
      await page.getByLabel('Board address').fill(board.url);
      await page.getByRole('button', { name: 'Connect' }).click();
      await expect.poll(() => page.getByTestId('device-info').textContent(), { timeout: 15_000 }).toContain('simulated board');
      await page.getByRole('form', { name: 'Vectoring plan' }).getByLabel('Pairs, at most (a square grid)').fill('4096');
      await runToCompletion(page, '4,096 / 4,096');
      const second = await save(page);

      await page.goto(`${app.url}/compare?ids=${first},${second}`);
      await expect.poll(() => page.getByTestId(`diff-summary-${second}`).textContent(), { timeout: 30_000 }).toBe('0 of 4,096 vectors both answered differ: bit for bit the same.');
      expect(await page.getByTestId('stat-row-angleMaxAbsLsb').innerText()).toMatch(/Largest \|angle error\|, LSB\s+\d+\.\d+\s+\d+\.\d+\s+= same/);
      expect(await page.getByTestId('stat-row-coveragePct').innerText()).toMatch(/Plane coverage, % of cells\s+100\s+100/);
      await page.getByRole('heading', { name: 'Angle error against direction' }).waitFor();
      await audited(page, 'compare');
    } finally {
      await context.close();
    }
  }, 240_000);
});
