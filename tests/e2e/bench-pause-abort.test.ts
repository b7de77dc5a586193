// Pause, resume and abort of a run on the Bench page, checked against what reached the board.
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { Kind } from '../../shared/link';
import { connectBoard, progressOf, runButton, runState } from './bench-steps';
import { appAndBrowser, signInAs } from './harness';
import { startTappedBoard, type TappedBoard } from './tapped-board';

// The page reaches this test's own board, so the CSP must list it.
const ctx = appAndBrowser({ BRIDGE_ORIGINS: 'ws://127.0.0.1:*' });
let board: TappedBoard;

// Every code of the 16-bit core at 230,400 baud: about ten seconds of line, time enough to act
// while it runs. The page's own engine settings are the ones it uses for any simulated board.
beforeEach(async () => {
  board = await startTappedBoard({ baud: 230_400 });
});
afterEach(async () => {
  await board.close();
});

async function startLongRun() {
  const page = await ctx.browser.newPage({ viewport: { width: 1280, height: 800 } });
  await signInAs(page, ctx.app, 'engineer', '/bench');
  await connectBoard(page, board.url);
  await page.getByLabel('What to ask').selectOption('exhaustive');
  await runButton(page, 'Run').click();
  // Under way: some answers are in.
  await expect.poll(async () => (await progressOf(page)).done, { timeout: 15_000 }).toBeGreaterThan(0);
  expect(await runState(page)).toBe('Running');
  return page;
}

describe('a run on the Bench page', () => {
  it('pauses (the board sends nothing more), resumes, and completes with every code answered', async () => {
    const page = await startLongRun();
    // The run's Pause is the page's only one: the traffic pane's toggle freezes the view by its own name.
    expect(await page.getByRole('button', { name: 'Pause', exact: true }).count()).toBe(1);
    const freeze = page.getByRole('region', { name: 'Line traffic' }).getByRole('button', { name: 'Freeze traffic view', exact: true });
    await freeze.click();
    await expect.poll(() => freeze.getAttribute('aria-pressed')).toBe('true');
    await freeze.click();
    await expect.poll(() => freeze.getAttribute('aria-pressed')).toBe('false');
    await runButton(page, 'Pause').click();
    await expect.poll(() => runState(page)).toBe('Paused');
    await expect.poll(() => board.first(Kind.Pause)).toBeDefined();
    expect(await runButton(page, 'Resume').isEnabled()).toBe(true);
    expect(await runButton(page, 'Pause').isEnabled()).toBe(false);
    expect(await runButton(page, 'Run').isEnabled()).toBe(false);

    // What was on the line arrives; then the page shows exactly what the board sent, short of the end.
    await expect.poll(async () => (await progressOf(page)).done, { timeout: 10_000 }).toBe(board.resultsSent);
    const whilePaused = await progressOf(page);
    expect(whilePaused.done).toBeLessThan(65_536);
    expect(whilePaused.total).toBe(65_536);
    await page.screenshot({ path: '/tmp/bench-paused.png', fullPage: true });

    await runButton(page, 'Resume').click();
    await expect.poll(() => board.first(Kind.Resume)).toBeDefined();
    // Nothing left the board between the page settling and the RESUME.
    expect(board.first(Kind.Resume)!.resultsBefore).toBe(whilePaused.done);
    await expect.poll(() => runState(page), { timeout: 45_000 }).toBe('Complete');
    expect(await progressOf(page)).toEqual({ done: 65_536, total: 65_536 });
    await expect.poll(() => page.getByTestId('stat-scored').textContent()).toContain('65,536');
    expect(await page.getByTestId('stat-mismatches').textContent()).toBe('0');
    expect(board.requests.filter((r) => r.kind === Kind.Abort)).toEqual([]);
    await page.close();
  }, 120_000);

  it('aborts: the board is told, the page says so, and the same connection runs the next plan', async () => {
    const page = await startLongRun();
    await runButton(page, 'Abort').click();
    await expect.poll(() => runState(page), { timeout: 10_000 }).toBe('Aborted');
    expect(board.first(Kind.Abort)).toBeDefined();
    expect(await page.getByRole('alert').filter({ hasText: 'Aborted by the operator' }).count()).toBe(1);
    // The codes never asked are accounted for as missing, and the board sent fewer than all.
    const missing = Number((await page.getByText(/^[\d,]+ missing$/).textContent())!.replace(/\D/g, ''));
    expect(missing).toBeGreaterThan(0);
    expect(board.resultsSent).toBeLessThan(65_536);
    expect(await runButton(page, 'Abort').isEnabled()).toBe(false);
    await page.screenshot({ path: '/tmp/bench-aborted.png', fullPage: true });

    // Still connected: one angle, 90° (code 16,384 of the 16-bit turn core), answered.
    await page.getByLabel('What to ask').selectOption('one');
    await page.getByLabel('Angles in').selectOption('deg');
    await page.getByLabel('Angle', { exact: true }).fill('90');
    await runButton(page, 'Run').click();
    await expect.poll(() => runState(page), { timeout: 15_000 }).toBe('Complete');
    expect(await progressOf(page)).toEqual({ done: 1, total: 1 });
    expect(board.requests.at(-1)?.kind).toBe(Kind.One);
    await page.close();
  }, 120_000);
});
