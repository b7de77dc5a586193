// The Bench from a browser on another machine: the page is reached by a made-up lab host name
// (mapped to 127.0.0.1, so it is not localhost). Over plain http the serial option is off with its
// reason; over HTTPS with `npm run cert`'s certificate, Web Serial exists, the sign-in cookie is
// Secure, and exhaustive runs on the server-hosted simulated boards complete bit-exactly — two
// browsers at once — and save.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeLabCertificate } from '../../scripts/lab-certificate';
import { launchBrowser, signInAs, startApp, type RunningApp } from './harness';

const LAB_HOST = 'lab-bench.test';

/** The app's address as the lab host name instead of 127.0.0.1. */
const asLabHost = (app: RunningApp): RunningApp => ({ ...app, url: app.url.replace('127.0.0.1', LAB_HOST) });

let certDir: string;
let browser: Browser;
beforeAll(async () => {
  certDir = fs.mkdtempSync(path.join(os.tmpdir(), 'anglebench-e2e-tls-'));
  browser = await launchBrowser([`--host-resolver-rules=MAP ${LAB_HOST} 127.0.0.1`, '--ignore-certificate-errors']);
});
afterAll(async () => {
  await browser?.close();
  fs.rmSync(certDir, { recursive: true, force: true });
});

describe('over plain http from another machine', () => {
  let app: RunningApp;
  beforeAll(async () => {
    app = asLabHost(await startApp());
  });
  afterAll(() => app?.stop());

  it('shows the serial option disabled with its reason, and the hosted board still connects', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signInAs(page, app, 'engineer', '/bench');
    expect(await page.evaluate(() => window.isSecureContext)).toBe(false);
    const serial = page.getByLabel('Serial port in this browser');
    expect(await serial.isDisabled()).toBe(true);
    const reason = page.getByTestId('serial-unavailable');
    expect(await reason.textContent()).toMatch(/plain http.*https:\/\/ address/);
    // The disabled option is described by its reason, for screen readers too.
    expect(await serial.getAttribute('aria-describedby')).toBe('serial-unavailable');
    await page.screenshot({ path: '/tmp/network-http-bench.png', fullPage: true });
    // The hosted board still works over ws:, allowed by connect-src 'self' alone (CSP Level 3
    // lets 'self' match ws: and wss: on the page's own host and port).
    expect(await page.getByLabel('Board address').inputValue()).toBe(`ws://${new URL(app.url).host}/api/sim-board`);
    await page.getByRole('button', { name: 'Connect' }).click();
    await expect.poll(() => page.getByTestId('device-info').textContent(), { timeout: 10_000 }).toContain('simulated board');
    await page.close();
  });
});

describe('over HTTPS with a certificate from npm run cert', () => {
  let app: RunningApp;
  beforeAll(async () => {
    const cert = makeLabCertificate({ hosts: [LAB_HOST], outDir: certDir });
    app = asLabHost(await startApp({ TLS_CERT_FILE: cert.certFile, TLS_KEY_FILE: cert.keyFile, SIM_BOARDS_MAX: '2' }));
  });
  afterAll(() => app?.stop());

  /** A signed-in engineer on the Bench page in a browser context of its own (its own cookies). */
  async function engineerOnBench(): Promise<{ context: BrowserContext; page: Page }> {
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    await signInAs(page, app, 'engineer', '/bench');
    return { context, page };
  }

  /** Connect to the default (hosted) simulated board and run every code of the 16-bit core. */
  async function exhaustiveOnHostedBoard(page: Page) {
    expect(await page.getByLabel('Board address').inputValue()).toBe(`wss://${new URL(app.url).host}/api/sim-board`);
    await page.getByRole('button', { name: 'Connect' }).click();
    await expect.poll(() => page.getByTestId('device-info').textContent(), { timeout: 10_000 }).toContain('simulated board');
    await page.getByLabel('What to ask').selectOption('exhaustive');
    await page.getByRole('button', { name: 'Run', exact: true }).click();
    await expect.poll(() => page.getByTestId('run-state').textContent(), { timeout: 60_000 }).toBe('Complete');
    expect(await page.getByTestId('run-progress').textContent()).toBe('65,536 / 65,536');
    await expect.poll(() => page.getByTestId('stat-scored').textContent()).toContain('65,536');
    // Bit-exact: not one result differs from the bit-accurate model.
    expect(await page.getByTestId('stat-mismatches').textContent()).toBe('0');
  }

  it('has Web Serial, a Secure sign-in cookie, and runs an exhaustive sweep on the hosted board bit-exactly and saves it', async () => {
    const { context, page } = await engineerOnBench();
    expect(await page.evaluate(() => [window.isSecureContext, 'serial' in navigator])).toEqual([true, true]);
    expect(await page.getByLabel('Serial port in this browser').isDisabled()).toBe(false);
    const cookie = (await context.cookies()).find((c) => c.name === 'anglebench.sid');
    expect(cookie).toMatchObject({ secure: true, httpOnly: true });

    await exhaustiveOnHostedBoard(page);
    await page.screenshot({ path: '/tmp/network-https-done.png', fullPage: true });
    await page.getByRole('button', { name: 'Save session' }).click();
    const form = page.getByRole('form', { name: 'Save session' });
    await expect.poll(() => form.getByLabel('Core').inputValue()).not.toBe('');
    await form.getByRole('button', { name: 'Save', exact: true }).click();
    await page.waitForURL(/\/sessions\/\d+$/, { timeout: 20_000 });
    const id = Number(new URL(page.url()).pathname.split('/').pop());
    const saved = await page.evaluate(async (sid) => ((await (await fetch(`/api/sessions/${sid}`)).json()) as { session: { passed: boolean; sampleCount: number } }).session, id);
    expect(saved).toMatchObject({ passed: true, sampleCount: 65_536 });
    await context.close();
  }, 120_000);

  it('says a bridge outside BRIDGE_ORIGINS is blocked by the server, not unreachable', async () => {
    const { context, page } = await engineerOnBench();
    await page.getByLabel('Bench bridge (network)').check();
    await page.getByLabel('Bridge address').fill('wss://bay3-pc.lab.test:5180/');
    await page.getByRole('button', { name: 'Connect' }).click();
    await expect.poll(() => page.getByRole('alert').textContent(), { timeout: 10_000 }).toMatch(/does not let the page connect to wss:\/\/bay3-pc\.lab\.test:5180: an administrator can add it to BRIDGE_ORIGINS/);
    await context.close();
  });

  it('runs two browsers on hosted boards at once, each bit-exact; with SIM_BOARDS_MAX=2 a third gets the refusal', async () => {
    const a = await engineerOnBench();
    const b = await engineerOnBench();
    await Promise.all([exhaustiveOnHostedBoard(a.page), exhaustiveOnHostedBoard(b.page)]);

    // Both boards are still held (connected): a third browser is told how many are in use.
    const c = await engineerOnBench();
    await c.page.getByRole('button', { name: 'Connect' }).click();
    await expect.poll(() => c.page.getByRole('alert').textContent(), { timeout: 10_000 }).toMatch(/All 2 simulated boards on this server are in use \(2 of 2\)/);
    await c.page.screenshot({ path: '/tmp/network-https-refused.png', fullPage: true });
    await Promise.all([a.context.close(), b.context.close(), c.context.close()]);
  }, 180_000);
});
