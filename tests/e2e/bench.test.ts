import type { Browser, Page } from 'playwright-core';
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

  it('signs out with the CSRF token and lands on the sign-in page', async () => {
    const page = await browser.newPage();
    await signIn(page);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);
    await page.goto(`${app.url}/bench`);
    await page.waitForURL(/\/sign-in/);
  });
});
