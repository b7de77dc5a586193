// Stations in a real browser: the CLI bridge (a child process, `bridge --server`) dials the
// production server with an engineer's API token, its device a simulated board in this process;
// engineers drive it from the Bench page through the server's relay.
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { defaultBoardSettings } from '../../mock-device/board-session';
import { startMockServer, type MockServer } from '../../mock-device/ws-server';
import { appAndBrowser, demoApiToken, freePort, signInAs, startApp, startStationProcess, type StationProcess } from './harness';
import { tempDatabase } from '../support/temp-db';

const env = appAndBrowser();

const BAY = 'Bay 3 / bench A';
const SLOW = 'Bay 7 / slow line';

async function connectStation(page: Page, name: string) {
  await page.getByLabel('Station (a board on a lab PC, through this server)').check();
  await page.getByLabel(new RegExp(`^${name.replace(/[/]/g, '\\/')}`)).check();
  await page.getByRole('button', { name: 'Connect' }).click();
  await expect.poll(() => page.getByTestId('device-info').textContent(), { timeout: 15_000 }).toContain('simulated board');
}

describe('stations in the browser', () => {
  let fast: MockServer;
  let slow: MockServer;
  let bay: StationProcess;
  let slowBay: StationProcess;
  let engineerPage: Page;

  beforeAll(async () => {
    fast = await startMockServer(defaultBoardSettings(), 0, '127.0.0.1', () => undefined);
    // A slow line, so the run is still going when its station is killed.
    slow = await startMockServer({ ...defaultBoardSettings(), baud: 460_800 }, 0, '127.0.0.1', () => undefined);
    const token = await demoApiToken(env.app, 'engineer', 'bench station');
    bay = startStationProcess(env.app.url, token, fast.url, BAY, 3_000_000);
    slowBay = startStationProcess(env.app.url, token, slow.url, SLOW, 460_800);
    await Promise.all([bay.online, slowBay.online]);
  });
  afterAll(async () => {
    bay?.kill();
    slowBay?.kill();
    await fast?.close();
    await slow?.close();
  });

  it('lists the stations online on the Bench page, and runs an exhaustive plan through one bit-exactly', async () => {
    engineerPage = await env.browser.newPage({ viewport: { width: 1280, height: 900 } });
    const page = engineerPage;
    await signInAs(page, env.app, 'engineer', '/bench');
    await page.getByLabel('Station (a board on a lab PC, through this server)').check();
    const picker = page.getByTestId('station-picker');
    await expect.poll(() => picker.textContent()).toContain(BAY);
    expect(await picker.textContent()).toContain('Free · registered by Tomas Brandvold');
    await page.screenshot({ path: '/tmp/stations-bench-list.png', fullPage: true });
    await connectStation(page, BAY);
    await page.getByLabel('What to ask').selectOption('exhaustive');
    await page.getByRole('button', { name: 'Run', exact: true }).click();
    await expect.poll(() => page.getByTestId('run-state').textContent(), { timeout: 45_000 }).toBe('Complete');
    expect(await page.getByTestId('run-progress').textContent()).toBe('65,536 / 65,536');
    await expect.poll(() => page.getByTestId('stat-scored').textContent()).toContain('65,536');
    expect(await page.getByTestId('stat-mismatches').textContent()).toBe('0');
    await page.screenshot({ path: '/tmp/stations-bench-done.png', fullPage: true });
  }, 120_000);

  it('shows a second engineer the station in use, by whom and since when, and the relay refuses them', async () => {
    const context = await env.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signInAs(page, env.app, 'admin', '/bench');
    await page.getByLabel('Station (a board on a lab PC, through this server)').check();
    const busy = page.getByLabel(new RegExp(`^${BAY.replace(/[/]/g, '\\/')}`));
    await busy.waitFor();
    expect(await busy.isDisabled()).toBe(true);
    await expect.poll(() => page.getByTestId('station-picker').textContent()).toMatch(/In use by Tomas Brandvold, since \d\d:\d\d:\d\d/);
    await page.screenshot({ path: '/tmp/stations-bench-in-use.png', fullPage: true });
    // Around the page, straight at the relay: refused with the same words.
    const refusal = await page.evaluate(
      (url) =>
        new Promise<{ code: number; reason: string }>((resolve) => {
          const ws = new WebSocket(url);
          ws.onclose = (e) => resolve({ code: e.code, reason: e.reason });
        }),
      `${env.app.url.replace('http', 'ws')}/api/stations/${encodeURIComponent(BAY)}/drive`,
    );
    expect(refusal.code).toBe(1013);
    expect(refusal.reason).toMatch(/^"Bay 3 \/ bench A" is in use by Tomas Brandvold since /);

    // The Boards page lists the stations too.
    await page.goto(`${env.app.url}/boards`);
    const row = page.getByTestId(`station-${BAY}`);
    await expect.poll(() => row.textContent()).toMatch(/Bay 3 \/ bench A.*3,000,000.*Tomas Brandvold.*Tomas Brandvold, since/);
    expect(await page.getByTestId(`station-${SLOW}`).textContent()).toContain('free');
    await page.screenshot({ path: '/tmp/stations-boards.png', fullPage: true });
    await context.close();
  });

  it('ends the run with the station\'s message when the station is killed mid-run, and keeps the partial results', async () => {
    const page = engineerPage;
    await page.getByRole('button', { name: 'Disconnect' }).click();
    await connectStation(page, SLOW);
    await page.getByLabel('What to ask').selectOption('exhaustive');
    await page.getByRole('button', { name: 'Run', exact: true }).click();
    await expect.poll(async () => Number((await page.getByTestId('run-progress').textContent())!.split(' / ')[0].replace(/,/g, '')), { timeout: 20_000 }).toBeGreaterThan(4_000);
    slowBay.kill();
    await expect.poll(() => page.getByTestId('run-state').textContent(), { timeout: 20_000 }).toBe('Failed');
    const alerts = (await page.getByRole('alert').allTextContents()).join('\n');
    expect(alerts).toContain('The station "Bay 7 / slow line" went offline: its connection was lost');
    // Progress counts codes given up as done; the scored answers are what the run got.
    expect(await page.getByTestId('run-progress').textContent()).toBe('65,536 / 65,536');
    await expect.poll(() => page.getByText(/^[\d,]+ missing$/).isVisible()).toBe(true);
    const missing = Number((await page.getByText(/^[\d,]+ missing$/).textContent())!.split(' ')[0].replace(/,/g, ''));
    const done = 65_536 - missing;
    await expect.poll(() => page.getByTestId('stat-scored').textContent()).toContain(done.toLocaleString('en-US'));
    expect(done).toBeGreaterThan(4_000);
    expect(done).toBeLessThan(65_536);
    await page.screenshot({ path: '/tmp/stations-killed.png', fullPage: true });

    // The results so far are kept in the browser, as for any lost link.
    await page.reload();
    const offer = page.getByRole('region', { name: 'Unsaved run' });
    await offer.waitFor({ timeout: 10_000 });
    expect(await offer.textContent()).toContain(`exhaustive, ${done.toLocaleString('en-US')} results`);
    // And the station is gone from the list.
    await page.getByLabel('Station (a board on a lab PC, through this server)').check();
    await expect.poll(() => page.getByTestId('station-picker').textContent()).not.toContain(SLOW);
  }, 90_000);
});

describe('a server restart', () => {
  it('brings the station back online by itself within a few seconds, without touching the lab PC', async () => {
    const port = String(await freePort());
    const db = await tempDatabase();
    const same = { PORT: port, DATABASE_URL: db.url, UPLOAD_DIR: path.join(db.dir, 'uploads') };
    const board = await startMockServer(defaultBoardSettings(), 0, '127.0.0.1', () => undefined);
    let app = await startApp(same);
    let station: StationProcess | null = null;
    try {
      const token = await demoApiToken(app, 'engineer', 'restart station');
      station = startStationProcess(app.url, token, board.url, 'Bay 9', 3_000_000);
      await station.online;
      const listed = async () => {
        const res = await fetch(`${app.url}/api/stations`, { headers: { authorization: `Bearer ${token}` } }).catch(() => null);
        return res?.ok ? ((await res.json()) as { stations: { name: string }[] }).stations.map((s) => s.name) : null;
      };
      expect(await listed()).toEqual(['Bay 9']);
      await app.stop(); // SIGTERM: the server closes every socket and exits
      app = await startApp(same);
      await expect.poll(listed, { timeout: 30_000, interval: 100 }).toEqual(['Bay 9']);
      // "Within a few seconds" is the back-off's promise, read from the station's own schedule
      // rather than from the clock of a busy machine: it never waited longer than its cap (4 s).
      const waits = [...station.log().matchAll(/dialling again in ([\d.]+) s/g)].map((m) => Number(m[1]));
      expect(waits.length).toBeGreaterThan(0);
      expect(Math.max(...waits)).toBeLessThanOrEqual(4);
    } finally {
      station?.kill();
      await app.stop();
      await board.close();
      db.cleanup();
    }
  }, 180_000);
});
