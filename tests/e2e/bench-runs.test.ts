import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startMockServer, type MockServer } from '../../mock-device/ws-server';
import { defaultBoardSettings } from '../../mock-device/board-session';
import { samplesFromArchive } from '../../shared/link-engine/archive-samples';
import { readArchive } from '../../shared/link';
import { appAndBrowser, signInAs } from './harness';

// The page reaches this test's own simulated board (npm run mock's), so the CSP must list it.
const ctx = appAndBrowser({ BRIDGE_ORIGINS: 'ws://127.0.0.1:*' });
let board: MockServer;

beforeAll(async () => {
  board = await startMockServer(defaultBoardSettings(), 0, '127.0.0.1', () => undefined);
});
afterAll(async () => {
  await board?.close();
});

describe('two runs on one bench connection', () => {
  it('saves the second with its own traffic only, plus the HELLO → INFO preamble', async () => {
    const { app, browser } = ctx;
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signInAs(page, app, 'engineer', '/bench');
    await page.getByLabel('Board address').fill(board.url);
    await page.getByRole('button', { name: 'Connect' }).click();
    await expect.poll(() => page.getByTestId('device-info').textContent(), { timeout: 10_000 }).toContain('simulated board');

    // First run: 300 codes of a sweep from 0.
    await page.getByLabel('What to ask').selectOption('sweep');
    await page.getByLabel('Count').fill('300');
    await page.getByRole('button', { name: 'Run', exact: true }).click();
    await expect.poll(() => page.getByTestId('run-progress').textContent(), { timeout: 30_000 }).toBe('300 / 300');
    await expect.poll(() => page.getByTestId('run-state').textContent()).toBe('Complete');

    // Second run on the same connection: three raw codes.
    await page.getByLabel('What to ask').selectOption('list');
    await page.getByLabel('Angles in').selectOption('code');
    await page.getByLabel('Angles (commas, spaces or lines between)').fill('7, 9000, 41');
    await page.getByRole('button', { name: 'Run', exact: true }).click();
    await expect.poll(() => page.getByTestId('run-progress').textContent(), { timeout: 30_000 }).toBe('3 / 3');
    await expect.poll(() => page.getByTestId('run-state').textContent()).toBe('Complete');
    await expect.poll(() => page.getByTestId('stat-scored').textContent()).toContain('3');
    await page.screenshot({ path: '/tmp/bench-runs-second-done.png', fullPage: true });

    await page.getByRole('button', { name: 'Save session' }).click();
    const form = page.getByRole('form', { name: 'Save session' });
    await expect.poll(() => form.getByLabel('Core').inputValue()).not.toBe('');
    // Operating conditions, with the caution once; a value out of range is refused on its field.
    expect(await form.getByRole('note').filter({ hasText: 'rated temperature, supply or clock' }).count()).toBe(1);
    await form.getByLabel('Temperature (°C)').fill('400');
    await form.getByRole('button', { name: 'Save', exact: true }).click();
    await expect.poll(() => form.getByText('temperature_c must be -70..200 °C, got 400').count()).toBe(1);
    await form.getByLabel('Temperature (°C)').fill('55');
    await form.getByLabel('Supply, VCCINT (V)').fill('0.95');
    await form.getByLabel(/^Other conditions/).fill('chamber=TC-2');
    await form.getByRole('button', { name: 'Save', exact: true }).click();
    await page.waitForURL(/\/sessions\/\d+$/, { timeout: 20_000 });
    await expect.poll(() => page.getByLabel('Recorded conditions').innerText()).toMatch(/Temperature\s+55 °C[\s\S]*Core supply\s+0\.95 V[\s\S]*chamber\s+TC-2/);
    const id = Number(new URL(page.url()).pathname.split('/').pop());
    // The session's page has read everything it shows.
    await page.waitForLoadState('networkidle');
    await page.screenshot({ path: '/tmp/bench-runs-saved.png', fullPage: true });

    const archive = Uint8Array.from(
      await page.evaluate(async (sid) => Array.from(new Uint8Array(await (await fetch(`/api/sessions/${sid}/archive`)).arrayBuffer())), id),
    );
    expect(JSON.parse(readArchive(archive).header.label)).toMatchObject({ recordedBy: 'anglebench bench' });
    const found = samplesFromArchive(archive);
    expect(found.info?.name).toContain('simulated board');
    expect(Array.from(found.codes)).toEqual([7, 9000, 41]);
    expect(found.incompleteRequests).toBe(0);

    // The server rebuilt the session's samples from the same archive.
    const row = await page.evaluate(async (sid) => {
      const res = await fetch('/api/sessions', { headers: { accept: 'application/json' } });
      const body = (await res.json()) as { items: { id: number; sampleCount: number }[] };
      return body.items.find((s) => s.id === sid);
    }, id);
    expect(row?.sampleCount).toBe(3);

    // The session page's capture pane reads the same archive and decodes it again, comparing
    // the device's frames (the only ones the bench records) with the recorded ones.
    await page.getByRole('button', { name: 'Open capture' }).click();
    await expect.poll(() => page.getByTestId('capture-recheck').textContent(), { timeout: 10_000 }).toMatch(/frames from the device and \d+ skips, the same frames as recorded/);
    await page.screenshot({ path: '/tmp/bench-runs-capture.png', fullPage: true });

    // Back on the bench afterwards, for a look at the page once the run is saved.
    await page.goto(`${app.url}/bench`);
    await page.getByRole('heading', { name: 'Bench' }).waitFor();
    await page.waitForLoadState('networkidle');
    await page.screenshot({ path: '/tmp/bench-runs-bench-after-save.png', fullPage: true });
  }, 120_000);
});
