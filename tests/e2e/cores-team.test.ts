import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { createCordicModel } from '../../shared/numeric';
import { appAndBrowser } from './harness';

const env = appAndBrowser();

// The machine is shared: give the page and the server time (vitest's default poll is 1 s).
const poll = <T>(read: () => Promise<T>) => expect.poll(read, { timeout: 10_000 });

/** A fresh browser context signed in as one of the seeded accounts. */
async function signIn(who: 'engineer' | 'reviewer' | 'admin'): Promise<Page> {
  const page = await (await env.browser.newContext({ viewport: { width: 1280, height: 800 } })).newPage();
  await page.goto(`${env.app.url}/sign-in`);
  await page.getByLabel('E-mail').fill(`${who}@anglebench.test`);
  await page.getByLabel('Password').fill('anglebench');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
  return page;
}

async function openReferenceCore(page: Page) {
  await page.goto(`${env.app.url}/cores`);
  await page.getByRole('link', { name: 'Reference rotator, 16-bit' }).click();
  await poll(() => page.getByRole('heading', { level: 1 }).textContent()).toBe('Reference rotator, 16-bit');
}

describe('the core page for an engineer', () => {
  it('keeps a changed limit after a reload, as the server stored it', async () => {
    const page = await signIn('engineer');
    await openReferenceCore(page);
    const largest = page.getByLabel('Largest |error|');
    expect(await largest.inputValue()).toBe('4'); // the seeded limit
    await largest.fill('5.5');
    await page.getByRole('button', { name: 'Save changes' }).click();
    await poll(() => page.getByRole('status').filter({ hasText: 'Saved at' }).count()).toBe(1);

    await page.reload();
    await poll(() => page.getByLabel('Largest |error|').inputValue()).toBe('5.5');
    const coreId = Number(new URL(page.url()).pathname.split('/').pop());
    const stored = await page.evaluate(async (id) => (await (await fetch(`/api/cores/${id}`)).json()) as { core: { limits: Record<string, number> } }, coreId);
    expect(stored.core.limits.maxAbsErrorLsb).toBe(5.5);
  });

  it('shows a bad value next to its field and saves nothing', async () => {
    const page = await signIn('engineer');
    await openReferenceCore(page);
    await page.getByLabel('RMS error').fill('-1');
    await page.getByLabel('Output fraction bits').fill('16'); // must be below output bits (16)
    await page.getByRole('button', { name: 'Save changes' }).click();
    await poll(() => page.locator('#core-limit-maxRmsErrorLsb-error').textContent()).toBe('Must be at least 0');
    expect(await page.locator('#core-outFrac-error').textContent()).toMatch(/below outBits \(16\)/);
    await page.reload();
    await poll(() => page.getByLabel('RMS error').inputValue()).toBe('0.8');
  });
});

describe('golden vectors on the core page', () => {
  it('names the bad line of a refused CSV, lists a good set with its mismatches, and deletes it', async () => {
    const page = await signIn('engineer');
    await openReferenceCore(page);
    const coreId = Number(new URL(page.url()).pathname.split('/').pop());
    const { core } = await page.evaluate(async (id) => (await (await fetch(`/api/cores/${id}`)).json()) as { core: { modelConfig: object } }, coreId);
    const form = page.getByRole('form', { name: 'Upload golden vectors' });
    await form.getByLabel('Set name').fill('rtl-sim smoke');

    await form.getByLabel('CSV file').setInputFiles({ name: 'bad.csv', mimeType: 'text/csv', buffer: Buffer.from('angle_code,cos_code,sin_code\n0,16384,0\nabc,1,2\n') });
    await form.getByRole('button', { name: 'Upload' }).click();
    await poll(() => form.getByRole('alert').textContent()).toContain('line 3');

    // Four codes answered by the core's own model, one sin code nudged by 1 LSB: one mismatch.
    const model = createCordicModel(core.modelConfig);
    const codes = [0, 1000, 16384, 40000];
    const rows = codes.map((c, i) => {
      const { cos, sin } = model.evaluate(c);
      return `${c},${cos},${i === 1 ? sin + 1 : sin}`;
    });
    await form.getByLabel('CSV file').setInputFiles({ name: 'good.csv', mimeType: 'text/csv', buffer: Buffer.from(`angle_code,cos_code,sin_code\n${rows.join('\n')}\n`) });
    await form.getByRole('button', { name: 'Upload' }).click();
    const row = page.getByRole('table', { name: 'Golden-vector sets' }).getByRole('row').filter({ hasText: 'rtl-sim smoke' });
    await poll(() => row.count()).toBe(1);
    const cells = await row.getByRole('cell').allTextContents();
    expect(cells.slice(1, 3)).toEqual(['4', '4']);
    expect(cells[4]).toBe('1');

    page.once('dialog', (d) => void d.accept());
    await row.getByRole('button', { name: 'Delete golden vectors rtl-sim smoke' }).click();
    await poll(() => row.count()).toBe(0);
  });
});

describe('the baseline on the core page', () => {
  it('links the baseline session with its verdict, and an engineer can clear it', async () => {
    const page = await signIn('engineer');
    await page.goto(`${env.app.url}/cores`);
    await page.getByRole('link', { name: 'Receiver mixer NCO, 18-bit' }).click();
    await page.waitForURL(/\/cores\/\d+$/);
    const coreId = Number(new URL(page.url()).pathname.split('/').pop());
    const before = await page.evaluate(async (id) => (await (await fetch(`/api/cores/${id}`)).json()) as { core: { baselineSessionId: number | null } }, coreId);
    expect(before.core.baselineSessionId).not.toBeNull();
    const link = page.getByRole('link', { name: `Session #${before.core.baselineSessionId}` });
    await poll(() => link.getAttribute('href')).toBe(`/sessions/${before.core.baselineSessionId}`);
    await poll(() => page.getByRole('list', { name: 'Baseline verdict' }).count()).toBe(1);

    await page.getByRole('button', { name: 'Clear baseline' }).click();
    await poll(() => page.getByText('No baseline.').count()).toBe(1);
    await page.reload();
    await poll(() => page.getByText('No baseline.').count()).toBe(1);
    const after = await page.evaluate(async (id) => (await (await fetch(`/api/cores/${id}`)).json()) as { core: { baselineSessionId: number | null } }, coreId);
    expect(after.core.baselineSessionId).toBeNull();
  });
});

describe('a new core', () => {
  it('is created from the list page with the default model and opens on its own page', async () => {
    const page = await signIn('engineer');
    await page.goto(`${env.app.url}/cores`);
    await page.getByRole('button', { name: 'New core' }).click();
    const form = page.getByRole('form', { name: 'New core' });
    await form.getByLabel('Name').fill('Bring-up rotator, 12-bit');
    await form.getByLabel('Slug').fill('bringup-12');
    await form.getByLabel('Output bits').fill('12');
    await form.getByLabel('Output fraction bits').fill('10');
    await form.getByRole('button', { name: 'Create core' }).click();
    await page.waitForURL(/\/cores\/\d+$/);
    await poll(() => page.getByRole('heading', { level: 1 }).textContent()).toBe('Bring-up rotator, 12-bit');
    expect(await page.getByLabel('Output bits').inputValue()).toBe('12');
    expect(await page.getByText('No baseline.').count()).toBe(1);
  });
});

describe('the core page for a reviewer', () => {
  it('shows the settings as values, with no form controls and no engineer actions', async () => {
    const page = await signIn('reviewer');
    await openReferenceCore(page);
    await poll(() => page.getByRole('heading', { name: 'Acceptance limits' }).isVisible()).toBe(true);
    const coreId = Number(new URL(page.url()).pathname.split('/').pop());
    const stored = await page.evaluate(async (id) => (await (await fetch(`/api/cores/${id}`)).json()) as { core: { limits: Record<string, number> } }, coreId);
    expect(await page.getByTestId('value-Largest |error|').textContent()).toBe(`at most ${stored.core.limits.maxAbsErrorLsb} LSB`);
    expect(await page.locator('main input, main select, main textarea').count()).toBe(0);
    for (const name of ['Save changes', 'Clear baseline', 'Upload', 'New core']) {
      expect(await page.getByRole('button', { name }).count()).toBe(0);
    }
    // Watching is for everyone signed in.
    expect(await page.getByRole('button', { name: /watching|Watch this core/ }).count()).toBe(1);
  });
});

describe('watching a core', () => {
  it('lets a reviewer stop and start watching, and the watcher list follows', async () => {
    const page = await signIn('reviewer');
    await openReferenceCore(page);
    const watchers = page.getByTestId('watchers');
    const stop = page.getByRole('button', { name: 'Stop watching' });
    const start = page.getByRole('button', { name: 'Watch this core' });
    // The seeded reviewer starts as a watcher; either way, toggle twice and check both states.
    if ((await start.count()) === 1) await start.click();
    await poll(() => watchers.textContent()).toContain('Mei Lindqvist');
    expect(await stop.getAttribute('aria-pressed')).toBe('true');
    await stop.click();
    await poll(() => watchers.textContent()).not.toContain('Mei Lindqvist');
    expect(await start.getAttribute('aria-pressed')).toBe('false');
    await page.reload();
    await poll(() => start.count()).toBe(1);
    await start.click();
    await poll(() => watchers.textContent()).toContain('Mei Lindqvist');
  });
});

describe('the board pages', () => {
  it('list the sessions run on a board with their verdict in words, and keep an engineer’s edit', async () => {
    const page = await signIn('engineer');
    await page.goto(`${env.app.url}/boards`);
    await page.getByRole('link', { name: 'Bay 3 / bench A' }).click();
    await poll(() => page.getByRole('heading', { level: 1 }).textContent()).toBe('Bay 3 / bench A');
    const boardId = Number(new URL(page.url()).pathname.split('/').pop());
    const listed = await page.evaluate(async (id) => (await (await fetch(`/api/sessions?boardId=${id}&pageSize=100`)).json()) as { total: number; items: Array<{ id: number; passed: boolean }> }, boardId);
    const table = page.getByRole('table', { name: 'Sessions on this board' });
    await poll(() => table.getByRole('row').count()).toBe(Math.min(listed.total, 20) + 1);
    const first = listed.items[0];
    const firstRow = table.getByRole('row').nth(1);
    expect(await firstRow.getByRole('link').getAttribute('href')).toBe(`/sessions/${first.id}`);
    expect(await firstRow.getByTestId('board-session-verdict').textContent()).toMatch(first.passed ? /^Pass$/ : /^Fail/);

    await page.getByRole('button', { name: 'Edit board' }).click();
    await page.getByRole('form', { name: 'Edit board' }).getByLabel('Location').fill('Signal lab, bay 4');
    await page.getByRole('button', { name: 'Save board' }).click();
    await poll(() => page.getByRole('form', { name: 'Edit board' }).count()).toBe(0);
    await page.reload();
    await poll(() => page.getByText('Signal lab, bay 4').count()).toBe(1);
  });

  it('offer a reviewer no way to add or edit a board', async () => {
    const page = await signIn('reviewer');
    await page.goto(`${env.app.url}/boards`);
    await page.getByRole('link', { name: 'Bay 3 / bench A' }).click();
    await poll(() => page.getByRole('heading', { name: 'Sessions on this board' }).isVisible()).toBe(true);
    expect(await page.getByRole('button', { name: 'Edit board' }).count()).toBe(0);
    await page.goto(`${env.app.url}/boards`);
    await poll(() => page.getByRole('link', { name: 'Bay 3 / bench A' }).count()).toBe(1);
    expect(await page.getByRole('button', { name: 'New board' }).count()).toBe(0);
  });
});

describe('the team page for an admin', () => {
  it('invites someone, and the invitation mail is readable in the outbox', async () => {
    const page = await signIn('admin');
    await page.goto(`${env.app.url}/team`);
    const form = page.getByRole('form', { name: 'Invite someone' });
    await form.getByLabel('E-mail').fill('lab.newcomer@lab.test');
    await form.getByLabel('Name').fill('Lab Newcomer');
    await form.getByLabel('Role').selectOption('reviewer');
    await page.getByRole('button', { name: 'Send invitation' }).click();
    const pending = page.getByRole('table', { name: 'Pending invitations' });
    await poll(() => pending.textContent()).toContain('lab.newcomer@lab.test');
    expect(await pending.textContent()).toContain('Lab Newcomer');
    expect(await pending.textContent()).toContain('reviewer');

    await page.getByRole('list', { name: 'Messages' }).getByRole('button').filter({ hasText: 'lab.newcomer@lab.test' }).click();
    await poll(() => page.getByTestId('mail-to').textContent()).toContain('lab.newcomer@lab.test');
    expect(await page.locator('#mail-subject').textContent()).toBe('You are invited to Anglebench');
    expect(await page.getByTestId('mail-text').textContent()).toMatch(/\/invite\/\S{10,}/);
  });

  it('disables a user, who then cannot sign in, and offers no way to disable themselves', async () => {
    const page = await signIn('admin');
    await page.goto(`${env.app.url}/team`);
    const row = page.getByTestId('user-reviewer@anglebench.test');
    await row.getByRole('button', { name: 'Disable Mei Lindqvist' }).click();
    await poll(() => row.textContent()).toContain('Disabled');
    expect(await page.getByTestId('user-admin@anglebench.test').getByRole('button').count()).toBe(0);

    const other = await (await env.browser.newContext()).newPage();
    await other.goto(`${env.app.url}/sign-in`);
    await other.getByLabel('E-mail').fill('reviewer@anglebench.test');
    await other.getByLabel('Password').fill('anglebench');
    await other.getByRole('button', { name: 'Sign in' }).click();
    await poll(() => other.getByRole('alert').count()).toBe(1);
    expect(new URL(other.url()).pathname).toBe('/sign-in');
  });

  it('shows an engineer a plain admins-only notice', async () => {
    const page = await signIn('engineer');
    await page.goto(`${env.app.url}/team`);
    await poll(() => page.getByRole('heading', { name: 'Admins only' }).isVisible()).toBe(true);
    expect(await page.getByRole('table').count()).toBe(0);
  });
});
