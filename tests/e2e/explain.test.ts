import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { appAndBrowser, signInAs } from './harness';

// The demo's regression: build ref16-r3 came back with output bit 0 of both channels stuck at 1
// (server/db/seed-sessions.ts). Its session page's Explain panel must name that defect, save the
// server's own explanation, and the printable report must show it.
const ctx = appAndBrowser();
const STUCK = 'output bit 0 of cos and sin stuck at 1';
const SHOTS = process.env.EXPLAIN_SCREENSHOTS;

/** The id of the demo session on build ref16-r3, asked of the API with the page's cookie. */
function regressionSessionId(page: Page): Promise<number> {
  return page.evaluate(async () => {
    const { builds } = (await (await fetch('/api/builds')).json()) as { builds: Array<{ id: number; label: string }> };
    const r3 = builds.find((b) => b.label === 'ref16-r3')!;
    const { items } = (await (await fetch(`/api/sessions?buildId=${r3.id}`)).json()) as { items: Array<{ id: number }> };
    return items[0].id;
  });
}

describe('Explain panel', () => {
  it('names the stuck output bit of ref16-r3, saves the explanation and shows it on the report', async () => {
    const page = await ctx.browser.newPage({ viewport: { width: 1400, height: 1800 } });
    try {
      await signInAs(page, ctx.app, 'engineer', '/sessions');
      const id = await regressionSessionId(page);
      await page.goto(`${ctx.app.url}/sessions/${id}`);
      const panel = page.getByTestId('explain-panel');
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

      await page.goto(`${ctx.app.url}/sessions/${id}/report`);
      const report = page.getByTestId('report-explanation');
      await report.waitFor();
      expect(await report.getByTestId('explanation-outcome').textContent()).toBe('Explained');
      expect(await report.textContent()).toContain(STUCK);
      if (SHOTS) await page.screenshot({ path: `${SHOTS}/explain-report.png`, fullPage: true });
    } finally {
      await page.close();
    }
  });
});
