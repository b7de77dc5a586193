import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { appAndBrowser, signInAs } from './harness';

// The demo's regression: build ref16-r3 came back with output bit 0 of both channels stuck at 1
// (server/db/seed-sessions.ts). Its session page's Explain panel must name that defect, save the
// server's own explanation, and the printable report must show it.
const ctx = appAndBrowser();
const STUCK = 'output bit 0 of cos and sin stuck at 1';
const SHOTS = process.env.EXPLAIN_SCREENSHOTS;

/** The id of a demo session on `build`, asked of the API with the page's cookie. */
function sessionOfBuild(page: Page, build: string): Promise<number> {
  return page.evaluate(async (label) => {
    const { builds } = (await (await fetch('/api/builds')).json()) as { builds: Array<{ id: number; label: string }> };
    const b = builds.find((x) => x.label === label)!;
    const { items } = (await (await fetch(`/api/sessions?buildId=${b.id}`)).json()) as { items: Array<{ id: number }> };
    return items[0].id;
  }, build);
}

describe('Explain panel', () => {
  it('can be cancelled, names the stuck output bit of ref16-r3, saves the explanation and shows it on the report and the compare page', async () => {
    const page = await ctx.browser.newPage({ viewport: { width: 1400, height: 1800 } });
    try {
      await signInAs(page, ctx.app, 'engineer', '/sessions');
      const id = await sessionOfBuild(page, 'ref16-r3');
      await page.goto(`${ctx.app.url}/sessions/${id}`);
      const panel = page.getByTestId('explain-panel');

      // Cancel: the samples are held back until Cancel is pressed, so the search is surely still running.
      let release = () => {};
      const held = new Promise<void>((r) => (release = r));
      await page.route('**/api/sessions/*/samples', async (route) => {
        await held;
        await route.continue().catch(() => undefined); // the page has given up on it
      });
      await panel.getByRole('button', { name: 'Explain in this browser' }).click();
      await panel.getByRole('progressbar', { name: 'Explaining the answers' }).waitFor();
      await panel.getByRole('button', { name: 'Cancel' }).click();
      await panel.getByText('Cancelled; nothing was saved.').waitFor();
      release();
      await page.unroute('**/api/sessions/*/samples');
      expect(await panel.getByTestId('explain-result').count()).toBe(0);

      await panel.getByRole('button', { name: 'Explain in this browser' }).click();
      const result = panel.getByTestId('explain-result');
      await result.waitFor({ timeout: 60_000 });
      // Best first: the stuck bit, reproducing all 65,536 answers.
      const first = result.getByTestId('explanation-hypotheses').locator('li').first();
      expect(await first.textContent()).toContain('reproduces 65,536 of 65,536 answers exactly');
      expect(await first.textContent()).toContain(STUCK);
      expect(await result.getByTestId('explanation-outcome').textContent()).toBe('Explained');
      // Both difference charts drawn, and a trace whose first difference is at the output.
      await result.getByTestId('chart-board-minus-hypothesis').locator('canvas').waitFor();
      await result.getByTestId('chart-board-minus-declared').locator('canvas').waitFor();
      expect(await result.getByTestId('trace-parting').textContent()).toBe('They part at: output.');
      if (SHOTS) await panel.screenshot({ path: `${SHOTS}/explain-panel.png` });

      await result.getByRole('button', { name: 'Save explanation' }).click();
      const saved = panel.getByTestId('saved-explanation');
      await saved.waitFor({ timeout: 60_000 });
      expect(await saved.getByTestId('explanation-hypotheses').locator('li').first().textContent()).toContain(STUCK);
      if (SHOTS) await panel.screenshot({ path: `${SHOTS}/explain-saved.png` });

      // Read back on a fresh page: the saved explanation, and its differences drawn without a new search.
      await page.reload();
      const again = page.getByTestId('explain-panel');
      await again.getByTestId('saved-explanation').waitFor();
      await again.getByRole('button', { name: 'Show the differences and a trace' }).click();
      await again.getByTestId('chart-board-minus-hypothesis').locator('canvas').waitFor({ timeout: 60_000 });
      expect(await again.getByTestId('explain-elapsed').count()).toBe(0);
      expect(await again.getByTestId('trace-parting').textContent()).toBe('They part at: output.');

      await page.goto(`${ctx.app.url}/sessions/${id}/report`);
      const report = page.getByTestId('report-explanation');
      await report.waitFor();
      expect(await report.getByTestId('explanation-outcome').textContent()).toBe('Explained');
      expect(await report.textContent()).toContain(STUCK);
      if (SHOTS) await page.screenshot({ path: `${SHOTS}/explain-report.png`, fullPage: true });

      // The compare page: the regression's saved explanation beside a clean session of ref16-r2.
      const clean = await sessionOfBuild(page, 'ref16-r2');
      await page.goto(`${ctx.app.url}/compare?ids=${id},${clean}`);
      const lines = page.getByTestId('compare-explanations');
      await lines.getByTestId(`explanation-${id}`).filter({ hasText: STUCK }).waitFor();
      expect(await lines.getByTestId(`explanation-${clean}`).textContent()).toMatch(/the core matches its model$/);
    } finally {
      await page.close();
    }
  });

  it('explains the demo vectoring core\'s bypassed gain multiply on the server and applies the deviation to its vectoring configuration', async () => {
    const page = await ctx.browser.newPage({ viewport: { width: 1400, height: 1800 } });
    try {
      await signInAs(page, ctx.app, 'engineer', '/sessions');
      // pd16-r1: the phase detector built without its gain-compensating multiply (server/db/seed-vectoring.ts).
      const id = await sessionOfBuild(page, 'pd16-r1');
      await page.goto(`${ctx.app.url}/sessions/${id}`);
      const panel = page.getByTestId('explain-panel');
      await panel.getByRole('button', { name: 'Explain on the server' }).click();
      const saved = panel.getByTestId('saved-explanation');
      await saved.waitFor({ timeout: 60_000 });
      expect(await saved.getByTestId('explanation-outcome').textContent()).toBe('Explained');
      const first = await saved.getByTestId('explanation-hypotheses').locator('li').first().textContent();
      expect(first).toContain('no gain compensation: the magnitude keeps the CORDIC gain');
      expect(first).toMatch(/reproduces ([\d,]+) of \1 answers exactly/);
      // A rotating core's differences and trace are not offered for a vectoring one.
      expect(await panel.getByRole('button', { name: 'Show the differences and a trace' }).count()).toBe(0);
      expect(await saved.textContent()).toContain('gainCompensation "multiply" → "none"');
      if (SHOTS) await panel.screenshot({ path: `${SHOTS}/explain-vectoring.png` });

      await saved.getByRole('button', { name: 'Apply to the core' }).click();
      await saved.getByTestId('explanation-decision').filter({ hasText: 'Applied to the core’s vectoring configuration' }).waitFor();
      const core = await page.evaluate(async (sessionId) => {
        const { session } = (await (await fetch(`/api/sessions/${sessionId}`)).json()) as { session: { coreId: number } };
        return ((await (await fetch(`/api/cores/${session.coreId}`)).json()) as { core: { mode: string; vectorConfig: { gainCompensation: string } } }).core;
      }, id);
      expect(core).toMatchObject({ mode: 'vectoring', vectorConfig: { gainCompensation: 'none' } });
    } finally {
      await page.close();
    }
  });
});
