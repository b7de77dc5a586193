// Connecting the Bench page through a bench bridge (the runner's `bridge`, started here in-process
// on a mock serial port with the simulated board behind it): its address and its token.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBridge, type Bridge } from '../../cli/bridge';
import { mockSerialBoard } from '../unit/cli/run-support';
import { progressOf, runButton, runState } from './bench-steps';
import { appAndBrowser, signInAs } from './harness';

// The page reaches the bridge on this machine, so the CSP must list it.
const ctx = appAndBrowser({ BRIDGE_ORIGINS: 'ws://127.0.0.1:*' });
const TOKEN = 'bay-7-bridge-token';
let bridge: Bridge;
const log: string[] = [];

beforeAll(async () => {
  const board = mockSerialBoard();
  bridge = await startBridge({ device: board.path, baud: 3_000_000, port: 0, host: '127.0.0.1', token: TOKEN, idleTimeoutS: 600 }, { serialBinding: board.binding, log: (l) => log.push(l) });
});
afterAll(async () => {
  await bridge?.close();
});

async function bridgeForm(token: string) {
  const page = await ctx.browser.newPage({ viewport: { width: 1280, height: 800 } });
  await signInAs(page, ctx.app, 'engineer', '/bench');
  await page.getByLabel('Bench bridge (network)').check();
  await page.getByLabel('Bridge address').fill(bridge.url);
  await page.getByLabel('Bridge token').fill(token);
  await page.getByRole('button', { name: 'Connect' }).click();
  return page;
}

describe('the Bench page through a bench bridge', () => {
  it('is turned away with a wrong token, and says so', async () => {
    const page = await bridgeForm('not-the-token');
    await expect.poll(() => page.getByRole('alert').textContent(), { timeout: 15_000 }).toContain('wrong token');
    expect(await page.getByTestId('device-info').count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Connect' }).isEnabled()).toBe(true);
    await page.screenshot({ path: '/tmp/bench-bridge-refused.png', fullPage: true });
    await expect.poll(() => log.some((l) => l.includes('refused: wrong token'))).toBe(true);
    await page.close();
  });

  it('connects with its address and token, and runs a plan through it to the board', async () => {
    const page = await bridgeForm(TOKEN);
    await expect.poll(() => page.getByTestId('device-info').textContent(), { timeout: 15_000 }).toContain('simulated board');
    expect(await page.getByText(`Bench bridge ${bridge.url}`).count()).toBe(1);
    await page.getByLabel('What to ask').selectOption('random');
    await page.getByLabel('Count', { exact: true }).fill('2000');
    await page.getByLabel('Seed', { exact: true }).fill('7');
    await runButton(page, 'Run').click();
    await expect.poll(() => runState(page), { timeout: 30_000 }).toBe('Complete');
    expect(await progressOf(page)).toEqual({ done: 2000, total: 2000 });
    await expect.poll(() => page.getByTestId('stat-scored').textContent()).toContain('2,000');
    expect(await page.getByTestId('stat-mismatches').textContent()).toBe('0');
    await page.screenshot({ path: '/tmp/bench-bridge-done.png', fullPage: true });

    // Disconnecting ends the bridge's client, which it logs with the bytes both ways.
    await page.getByRole('button', { name: 'Disconnect' }).click();
    await expect.poll(() => log.some((l) => /connection \d+ from .* B to the board, \d+ B to the client/.test(l))).toBe(true);
    await page.close();
  }, 90_000);
});
