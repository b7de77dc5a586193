import { execFileSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, startApp, type RunningApp } from './harness';

let app: RunningApp;
let browser: Browser;
let tmp: string;

beforeAll(async () => {
  app = await startApp();
  browser = await launchBrowser();
  tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'anglebench-builds-'));
});
afterAll(async () => {
  await browser?.close();
  await app?.stop();
  fs.rmSync(tmp, { recursive: true, force: true });
});

async function signIn(page: Page, who: 'engineer' | 'reviewer' | 'admin', next = '/builds') {
  await page.goto(`${app.url}${next}`);
  await page.waitForURL(/\/sign-in\?next=/);
  await page.getByLabel('E-mail').fill(`${who}@anglebench.test`);
  await page.getByLabel('Password').fill('anglebench');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => u.pathname === next.split('?')[0]);
}

// Shared by the tests below, which run in order: the engineer's build is the one reviewed.
let buildUrl = '';
let buildId = 0;

describe('builds in a real browser', () => {
  it('lets an engineer create a build and upload its bitstream, whose SHA-256 matches sha256sum', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signIn(page, 'engineer');
    await page.getByRole('button', { name: 'New build' }).click();
    const form = page.getByRole('form', { name: 'New build' });
    await expect.poll(() => form.getByLabel('Core').locator('option').count()).toBeGreaterThan(1);
    await form.getByLabel('Core').selectOption({ label: 'Reference rotator, 16-bit (reference-16)' });
    // The form says what is missing before it sends anything.
    await form.getByRole('button', { name: 'Create build' }).click();
    await expect.poll(() => form.getByText('Give the build a label').isVisible()).toBe(true);
    await form.getByLabel('Label').fill('ref16-e2e');
    await form.getByLabel('Source revision').fill('0badc0de');
    await form.getByLabel('Tool version').fill('synth 2025.2');
    await form.getByLabel('Clock, MHz').fill('187.5');
    await form.getByLabel('Notes').fill('Built by the browser test.');
    await form.getByRole('button', { name: 'Create build' }).click();
    await page.waitForURL(/\/builds\/\d+$/);
    buildUrl = page.url();
    buildId = Number(buildUrl.split('/').pop());
    await expect.poll(() => page.getByRole('heading', { level: 1 }).textContent()).toBe('Build ref16-e2e');
    expect(await page.getByTestId('build-status').first().textContent()).toBe('untested');

    const file = path.join(tmp, 'top_level.bit');
    const bytes = randomBytes(300_000);
    fs.writeFileSync(file, bytes);
    // The outside reference: coreutils' sha256sum over the same file.
    const expected = execFileSync('sha256sum', [file], { encoding: 'utf8' }).split(/\s+/)[0];
    await page.getByLabel('Bitstream file').setInputFiles(file);
    await expect.poll(() => page.getByTestId('bitstream-sha256').textContent(), { timeout: 15_000 }).toBe(expected);
    expect(await page.getByTestId('bitstream-size').textContent()).toContain('300,000 bytes');
    expect(await page.getByTestId('bitstream-name').textContent()).toBe('top_level.bit');
    expect(await page.getByRole('link', { name: 'Download the bitstream' }).getAttribute('href')).toBe(`/api/builds/${buildId}/file`);
    await page.screenshot({ path: '/tmp/build-page-engineer.png', fullPage: true });

    // The same file on a second build: the page warns and links back to the first.
    await page.goto(`${app.url}/builds`);
    const r1 = page.getByRole('link', { name: 'ref16-r1', exact: true });
    await r1.click();
    await page.waitForURL(/\/builds\/\d+$/);
    await page.getByLabel('Bitstream file').setInputFiles(file);
    const warning = page.getByTestId('duplicate-warning');
    await expect.poll(() => warning.textContent(), { timeout: 15_000 }).toContain('ref16-e2e');
    expect(await warning.getByRole('link', { name: 'ref16-e2e' }).getAttribute('href')).toBe(`/builds/${buildId}`);
    await page.screenshot({ path: '/tmp/build-page-duplicate.png', fullPage: true });

    // The engineer asks for a review; the seeded team has one reviewer.
    await page.goto(buildUrl);
    await page.getByRole('button', { name: 'Request review' }).click();
    await expect.poll(() => page.getByTestId('review-requested').textContent()).toBe('Mailed 1 reviewer.');
  });

  it('shows a reviewer the list without a create button, and records a rejection with its note in the trail', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signIn(page, 'reviewer');
    await expect.poll(() => page.getByRole('table', { name: 'Builds' }).isVisible()).toBe(true);
    expect(await page.getByRole('button', { name: 'New build' }).count()).toBe(0);
    const row = page.getByTestId(`build-row-${buildId}`);
    expect(await row.textContent()).toContain('top_level.bit');
    expect(await row.getByTestId('build-status').textContent()).toBe('untested');
    await page.screenshot({ path: '/tmp/builds-list-reviewer.png', fullPage: true });

    await page.goto(buildUrl);
    await expect.poll(() => page.getByRole('heading', { level: 1 }).textContent()).toBe('Build ref16-e2e');
    // Engineer-only actions are absent for a reviewer.
    expect(await page.getByLabel('Bitstream file').count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Request review' }).count()).toBe(0);
    await page.getByLabel('Note for the author').fill('No session on this build yet; run the edge set first.');
    await page.getByRole('button', { name: 'Reject' }).click();
    await expect.poll(() => page.getByTestId('build-status').first().textContent()).toBe('rejected');
    const trail = page.getByRole('list', { name: 'Review trail' });
    await expect.poll(() => trail.textContent()).toContain('No session on this build yet; run the edge set first.');
    expect(await trail.locator('li').first().textContent()).toMatch(/^rejected by Mei Lindqvist/);
  });

  it("lets the admin read the rejection mailed to the build's author in the outbox", async () => {
    const page = await browser.newPage();
    await signIn(page, 'admin', '/team');
    const messages = await page.evaluate(async () => {
      const res = await fetch('/api/outbox', { headers: { accept: 'application/json' } });
      return ((await res.json()) as { messages: { to: string; subject: string; text: string }[] }).messages;
    });
    const mail = messages.find((m) => m.subject.startsWith('Build ref16-e2e'));
    expect(mail?.subject).toBe('Build ref16-e2e of Reference rotator, 16-bit rejected');
    expect(mail?.to).toContain('engineer@anglebench.test');
    expect(mail?.text).toContain('run the edge set first');
    expect(mail?.text).toContain(`/builds/${buildId}`);
  });
});
