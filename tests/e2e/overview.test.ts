import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, startApp, type RunningApp } from './harness';

let app: RunningApp;
let browser: Browser;

beforeAll(async () => {
  app = await startApp();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await app?.stop();
});

describe('the overview page in a real browser', () => {
  it('shows the server health read from /api/health', async () => {
    const page = await browser.newPage();
    await page.goto(app.url);
    await expect.poll(() => page.getByTestId('health-status').textContent()).toBe('OK');
    const version = await page.getByTestId('health-version').textContent();
    const health = (await (await fetch(`${app.url}/api/health`)).json()) as { version: string };
    expect(version).toBe(health.version);
    expect(await page.getByTestId('health-db').textContent()).toContain('sqlite');
    expect(await page.title()).toBe('Anglebench');
  });

  it('shows a not-found page for an unknown address, inside the layout', async () => {
    const page = await browser.newPage();
    await page.goto(`${app.url}/no/such/page`);
    await expect.poll(() => page.getByRole('heading', { name: 'No such page' }).isVisible()).toBe(true);
    expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(true);
  });
});
