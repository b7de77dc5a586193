// The serial path end to end through the Bench page: the page's own Web Serial transport
// (src/features/bench/transport/web-serial-link.ts) against a fake navigator.serial whose port
// has the simulated board behind it, a run scored, saved, and read back bit for bit.
import { describe, expect, it } from 'vitest';
import { samplesFromArchive } from '../../shared/link-engine/archive-samples';
import { createCordicModel, parseModelConfig } from '../../shared/numeric';
import { progressOf, runButton, runState } from './bench-steps';
import { fakeSerialBoard } from './fake-serial';
import { appAndBrowser, signInAs } from './harness';

const ctx = appAndBrowser();

describe('the Bench page over Web Serial', () => {
  it('opens the port with the chosen settings, runs a sweep and saves answers equal to the board’s, bit for bit', async () => {
    const page = await ctx.browser.newPage({ viewport: { width: 1280, height: 800 } });
    const board = await fakeSerialBoard(page);
    await signInAs(page, ctx.app, 'engineer', '/bench');

    await page.getByLabel('Serial port in this browser').check();
    await page.getByLabel('Baud').selectOption('3000000');
    await page.getByLabel('RTS').check();
    await page.getByRole('button', { name: 'Connect' }).click();
    // The first serial connection asks the hardware questions first.
    const caution = page.getByRole('dialog', { name: 'Before the first serial connection' });
    await caution.waitFor();
    await page.screenshot({ path: '/tmp/bench-serial-caution.png' });
    await caution.getByRole('button', { name: 'Checked — connect' }).click();
    await expect.poll(() => page.getByTestId('device-info').textContent(), { timeout: 15_000 }).toContain('simulated board');
    expect(await page.getByText('Serial port at 3,000,000 baud').count()).toBe(1);
    // 3,000,000 baud 8N1, and a receive buffer of 20 ms at that rate (7,500 B, as a power of 2).
    expect(board.opened).toEqual([{ baudRate: 3_000_000, dataBits: 8, stopBits: 1, parity: 'none', flowControl: 'none', bufferSize: 8192 }]);
    expect(board.signals).toEqual([{ dataTerminalReady: true, requestToSend: true }]);

    // 8,192 codes, every 8th of the 16-bit circle.
    await page.getByLabel('What to ask').selectOption('sweep');
    await page.getByLabel('Angles in').selectOption('code');
    await page.getByLabel('Start').fill('0');
    await page.getByLabel('Step, codes').fill('8');
    await page.getByLabel('Count').fill('8192');
    await runButton(page, 'Run').click();
    await expect.poll(() => runState(page), { timeout: 60_000 }).toBe('Complete');
    expect(await progressOf(page)).toEqual({ done: 8192, total: 8192 });
    await expect.poll(() => page.getByTestId('stat-scored').textContent()).toContain('8,192');
    expect(await page.getByTestId('stat-mismatches').textContent()).toBe('0');
    expect(board.bytesFromPage).toBeGreaterThan(0);
    await page.screenshot({ path: '/tmp/bench-serial-done.png', fullPage: true });

    await page.getByRole('button', { name: 'Save session' }).click();
    const form = page.getByRole('form', { name: 'Save session' });
    await expect.poll(() => form.getByLabel('Core').inputValue()).not.toBe('');
    await form.getByRole('button', { name: 'Save', exact: true }).click();
    await page.waitForURL(/\/sessions\/\d+$/, { timeout: 20_000 });
    const id = Number(new URL(page.url()).pathname.split('/').pop());
    // Leaving the Bench page closes the port.
    await expect.poll(() => board.closes).toBe(1);

    // The saved capture holds every code once, each answered as the board's core (the 16-bit
    // default model) answers it: nothing lost, reordered or altered on the way through the page.
    const archive = Uint8Array.from(await page.evaluate(async (sid) => Array.from(new Uint8Array(await (await fetch(`/api/sessions/${sid}/archive`)).arrayBuffer())), id));
    const found = samplesFromArchive(archive);
    expect(found.incompleteRequests).toBe(0);
    expect(Array.from(found.codes)).toEqual(Array.from({ length: 8192 }, (_, i) => i * 8));
    const cos = new Int32Array(8192);
    const sin = new Int32Array(8192);
    createCordicModel(parseModelConfig({})).evaluateInto(Int32Array.from(found.codes), cos, sin);
    expect(Array.from(found.cos)).toEqual(Array.from(cos));
    expect(Array.from(found.sin)).toEqual(Array.from(sin));

    await page.close();
  }, 120_000);
});
