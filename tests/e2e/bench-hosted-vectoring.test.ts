// The demo's vectoring core on the server's own simulated board, from the Bench page: choosing the
// core gives the hosted board's address for it; the page speaks that core's CRC and baud, sees a
// vectoring board and runs a grid whose every answer equals the model.
import { describe, expect, it } from 'vitest';
import { runButton } from './bench-steps';
import { appAndBrowser, signInAs } from './harness';

const ctx = appAndBrowser();

describe('the hosted simulated board for a vectoring core', () => {
  it('connects to phase-detector-16 on this server and runs a grid bit-exact with the model', async () => {
    const { app, browser } = ctx;
    const context = await browser.newContext({ viewport: { width: 1500, height: 1000 } });
    try {
      const page = await context.newPage();
      await signInAs(page, app, 'engineer', '/bench');
      const picker = page.getByLabel('Core on the simulated board');
      await expect.poll(() => picker.locator('option').allTextContents()).toContain('phase-detector-16 (vectoring)');
      await picker.selectOption('phase-detector-16');
      expect(await page.getByLabel('Board address').inputValue()).toMatch(/^ws:\/\/[^/]+\/api\/sim-board\?core=phase-detector-16$/);
      await page.getByRole('button', { name: 'Connect' }).click();
      await expect.poll(() => page.getByTestId('device-info').textContent(), { timeout: 15_000 }).toContain('simulated board (phase-detector-16)');

      const plan = page.getByRole('form', { name: 'Vectoring plan' });
      await expect.poll(() => plan.getByLabel('Score against').locator('option:checked').textContent()).toContain('phase-detector-16');
      await plan.getByLabel('Pairs to ask').selectOption('grid');
      await plan.getByLabel('Pairs, at most (a square grid)').fill('4096');
      await runButton(page, 'Run').click();
      await expect.poll(() => page.getByTestId('run-state').textContent(), { timeout: 60_000 }).toBe('Complete');
      expect(await page.getByTestId('run-progress').textContent()).toBe('4,096 / 4,096');
      await expect.poll(() => page.getByTestId('stat-scored').textContent()).toBe('4,096');
      expect(await page.getByTestId('stat-mismatches').textContent()).toBe('0');
    } finally {
      await context.close();
    }
  }, 180_000);
});
