import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { appAndBrowser, signInAs } from './harness';

const env = appAndBrowser();

/** A JSON write from the page, with its session cookie and CSRF token, as the client sends it. */
function pageWrite(page: Page, path: string, body: unknown) {
  return page.evaluate(
    async ({ path, body }) => {
      const { token } = (await (await fetch('/api/auth/csrf')).json()) as { token: string };
      const res = await fetch(path, { method: 'POST', headers: { 'content-type': 'application/json', 'x-csrf-token': token }, body: JSON.stringify(body) });
      return { status: res.status, body: (await res.json()) as unknown };
    },
    { path, body },
  );
}

describe('the account page', () => {
  it('makes a runner token shown once, which the API accepts as Bearer until it is revoked', async () => {
    const page = await env.browser.newPage();
    await signInAs(page, env.app, 'engineer', '/account');
    await page.getByLabel('Token name').fill('CI runner, lab 3');
    await page.getByRole('button', { name: 'Make token' }).click();
    const secret = await page.getByTestId('new-token').inputValue();
    expect(secret).toMatch(/^ab_/);
    const asRunner = () => fetch(`${env.app.url}/api/sessions?pageSize=1`, { headers: { authorization: `Bearer ${secret}` } });
    expect((await asRunner()).status).toBe(200);

    await page.getByRole('button', { name: 'Done' }).click();
    expect(await page.getByTestId('new-token').count()).toBe(0);
    const row = page.getByRole('row').filter({ hasText: 'CI runner, lab 3' });
    expect(await row.textContent()).toContain(secret.slice(0, 10));
    page.once('dialog', (d) => void d.accept());
    await row.getByRole('button', { name: 'Revoke' }).click();
    await expect.poll(() => row.count()).toBe(0);
    expect((await asRunner()).status).toBe(401);
  });

  it('tells a reviewer that tokens take the engineer role, with no token form', async () => {
    const page = await env.browser.newPage();
    await signInAs(page, env.app, 'reviewer', '/account');
    await expect.poll(() => page.getByText('which takes the engineer role').isVisible()).toBe(true);
    expect(await page.getByLabel('Token name').count()).toBe(0);
  });
});

// The error sits inside the field's label, so after a refusal the labels read longer: find the two
// password fields in order.
const passwords = (page: Page) => page.locator('input[autocomplete="new-password"]');

describe('an invitation link', () => {
  it('lets the invited person choose a name and password, signs them in, and works once', async () => {
    const admin = await env.browser.newPage();
    await signInAs(admin, env.app, 'admin', '/team');
    const invited = await pageWrite(admin, '/api/invitations', { email: 'new.hire@anglebench.test', role: 'reviewer' });
    expect(invited.status).toBe(201);
    const outbox = (await admin.evaluate(async () => (await fetch('/api/outbox')).json())) as { messages: Array<{ to: string; text: string }> };
    const link = /https?:\/\/\S+\/invite\/\S+/.exec(outbox.messages.find((m) => m.to.includes('new.hire@anglebench.test'))!.text)![0];

    const context = await env.browser.newContext();
    const page = await context.newPage();
    await page.goto(new URL(new URL(link).pathname, env.app.url).href);
    await page.getByLabel('Your name').fill('Noor Haddad');
    await passwords(page).nth(0).fill('short');
    await passwords(page).nth(1).fill('different');
    await page.getByRole('button', { name: 'Create account and sign in' }).click();
    expect(await page.getByText('At least 8 characters').isVisible()).toBe(true);
    expect(await page.getByText('The two passwords differ').isVisible()).toBe(true);

    await passwords(page).nth(0).fill('a long enough password');
    await passwords(page).nth(1).fill('a long enough password');
    await page.getByRole('button', { name: 'Create account and sign in' }).click();
    await page.waitForURL((u) => u.pathname === '/');
    await expect.poll(() => page.getByTestId('signed-in-as').textContent()).toContain('Noor Haddad');

    // The link is spent.
    const again = await (await env.browser.newContext()).newPage();
    await again.goto(page.url().replace(/\/$/, '') + new URL(link).pathname);
    await again.getByLabel('Your name').fill('Someone else');
    await passwords(again).nth(0).fill('another long password');
    await passwords(again).nth(1).fill('another long password');
    await again.getByRole('button', { name: 'Create account and sign in' }).click();
    await expect.poll(() => again.getByRole('alert').textContent()).toMatch(/unknown, already used or expired/);
    await context.close();
  });
});
