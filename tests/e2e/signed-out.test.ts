import { describe, expect, it } from 'vitest';
import type { Page, Request } from 'playwright-core';
import { appAndBrowser } from './harness';

// Signed out, the app opens on the sign-in form rather than on pages whose data it may not read,
// and finding out that nobody is signed in is not an error in the browser's console.

const env = appAndBrowser();

/** Every console error, uncaught page error and failed API reply of a page, as text. */
function watchForErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(`console: ${m.text()}`);
  });
  page.on('pageerror', (e) => errors.push(`page error: ${e.message}`));
  page.on('response', (r) => {
    if (new URL(r.url()).pathname.startsWith('/api/') && r.status() >= 400) errors.push(`${r.status()} ${r.request().method()} ${r.url()}`);
  });
  return errors;
}

async function expectSignInForm(page: Page) {
  await expect.poll(() => page.getByRole('heading', { name: 'Sign in' }).isVisible()).toBe(true);
  expect(await page.getByLabel('E-mail').isVisible()).toBe(true);
  expect(await page.getByLabel('Password').isVisible()).toBe(true);
}

describe('signed out', () => {
  it.each([
    ['/', '/sign-in?next=%2F'],
    ['/sessions', '/sign-in?next=%2Fsessions'],
  ])('opening %s shows the sign-in form, and the console stays clean', async (path, landing) => {
    const page = await env.browser.newPage();
    const errors = watchForErrors(page);
    await page.goto(`${env.app.url}${path}`);
    await page.waitForURL((u) => u.pathname + u.search === landing);
    await expectSignInForm(page);
    // The overview's and the list's panels were never drawn, so their data was never asked for.
    expect(await page.getByRole('heading', { name: 'Bench overview' }).count()).toBe(0);
    expect(await page.getByRole('region', { name: 'Latest sessions' }).count()).toBe(0);
    await page.waitForLoadState('networkidle');
    expect(errors).toEqual([]);
    await page.close();
  });

  it('signing in from there goes on to the page asked for; signing out comes back to the form, still without errors', async () => {
    const page = await env.browser.newPage();
    const errors = watchForErrors(page);
    await page.goto(`${env.app.url}/sessions`);
    await expectSignInForm(page);
    await page.getByLabel('E-mail').fill('reviewer@anglebench.test');
    await page.getByLabel('Password').fill('anglebench');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((u) => u.pathname === '/sessions');
    // The list has asked for its data; a sign-out racing those requests is a separate case (the
    // server may refuse them after the sign-out, and the browser logs each refusal).
    await page.waitForLoadState('networkidle');
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL((u) => u.pathname === '/sign-in');
    await expectSignInForm(page);
    await page.waitForLoadState('networkidle');
    expect(errors).toEqual([]);
    await page.close();
  });

  it('signing out while the list is still loading its data leaves no refused request behind', async () => {
    const page = await env.browser.newPage();
    const errors = watchForErrors(page);
    await page.goto(`${env.app.url}/sessions`);
    await expectSignInForm(page);
    await page.getByLabel('E-mail').fill('reviewer@anglebench.test');
    await page.getByLabel('Password').fill('anglebench');
    // The worst order, made certain: the list's own request is held until the server has signed
    // out, then let through before the page hears the sign-out's answer. Unless the page dropped
    // it before signing out, it reaches the server signed out and is refused (a logged 401).
    let release!: () => void;
    const released = new Promise<void>((resolve) => (release = resolve));
    let listAsked!: (request: Request) => void;
    const listRequest = new Promise<Request>((resolve) => (listAsked = resolve));
    await page.route(
      (u) => u.pathname === '/api/sessions',
      async (route) => {
        listAsked(route.request());
        await released;
        await route.continue().catch(() => undefined); // dropped by the page meanwhile
      },
    );
    await page.route(
      (u) => u.pathname === '/api/auth/logout',
      async (route) => {
        const signedOut = await route.fetch();
        release();
        await (await listRequest).response(); // null when the page dropped it
        await route.fulfill({ response: signedOut });
      },
    );
    await page.getByRole('button', { name: 'Sign in' }).click();
    await listRequest;
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL((u) => u.pathname === '/sign-in');
    await expectSignInForm(page);
    await page.waitForLoadState('networkidle');
    expect(errors).toEqual([]);
    await page.close();
  });
});
