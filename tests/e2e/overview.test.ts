import { describe, expect, it } from 'vitest';
import { appAndBrowser, signInAs } from './harness';

const env = appAndBrowser();

describe('the overview page in a real browser', () => {
  it('shows the server health read from /api/health', async () => {
    const page = await env.browser.newPage();
    await signInAs(page, env.app, 'reviewer'); // signed out, / is the sign-in form (signed-out.test.ts)
    await expect.poll(() => page.getByTestId('health-status').textContent()).toBe('OK');
    const version = await page.getByTestId('health-version').textContent();
    const health = (await (await fetch(`${env.app.url}/api/health`)).json()) as { version: string };
    expect(version).toBe(health.version);
    expect(await page.getByTestId('health-db').textContent()).toContain('sqlite');
    expect(await page.title()).toBe('Anglebench');
  });

  it('shows a signed-in reviewer what needs attention: the seeded regression, failing builds and the latest sessions', async () => {
    const page = await env.browser.newPage();
    await signInAs(page, env.app, 'reviewer');
    const attention = page.getByRole('region', { name: 'Needs attention' });
    // Two regressions in the demo: ref16-r3's stuck output bit, and the baseline build's soak at
    // 85 °C and 0.90 V, whose unstable answers fail the limits the baseline passed.
    await expect.poll(() => attention.getByRole('link', { name: /^Session \d+$/ }).count()).toBe(2);
    // The builds arrive by their own query, after the regressions perhaps.
    await expect.poll(() => attention.getByRole('link', { name: 'ref16-r3' }).isVisible()).toBe(true);
    expect(await attention.getByTestId('build-status').first().textContent()).toMatch(/fail/i);
    const latest = page.getByRole('region', { name: 'Latest sessions' });
    await expect.poll(() => latest.getByRole('row').count()).toBe(9); // a header and eight sessions
    expect(await latest.getByTestId('verdict').first().textContent()).toMatch(/^(Pass|Fail)$/);
    // The reviewer is not offered the bench.
    expect(await page.getByRole('link', { name: 'Open the bench' }).count()).toBe(0);
    await attention.getByRole('link', { name: /^Session \d+$/ }).first().click();
    await page.waitForURL(/\/sessions\/\d+$/);
  });

  it('shows a not-found page for an unknown address, inside the layout', async () => {
    const page = await env.browser.newPage();
    await page.goto(`${env.app.url}/no/such/page`);
    await expect.poll(() => page.getByRole('heading', { name: 'No such page' }).isVisible()).toBe(true);
    expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(true);
  });
});
