// A soak from the Bench page against a seeded flaky simulated board: the page's unstable codes
// must be exactly the codes whose answers the board itself varied between passes, with every
// answer it gave; saved with conditions, the session page shows the books and the exports carry
// the conditions.
import fs from 'node:fs';
import type { Page } from 'playwright-core';
import { afterEach, describe, expect, it } from 'vitest';
import { Kind } from '../../shared/link';
import { parseBoardArgs } from '../../mock-device/options';
import type { CoreFlip } from '../../mock-device/flaky-core';
import { connectBoard, progressOf, runButton, runState } from './bench-steps';
import { appAndBrowser, signInAs } from './harness';
import { startTappedBoard, type TappedBoard } from './tapped-board';

const ctx = appAndBrowser({ BRIDGE_ORIGINS: 'ws://127.0.0.1:*' });
let board: TappedBoard;
/** What the board flipped, each with the pass (0-based) it flipped in. */
let flips: (CoreFlip & { pass: number })[];

/** Passes begun: the page asks each pass as SWEEP segments, the first starting at code 0. */
const passesBegun = () => board.requests.filter((r) => r.kind === Kind.Sweep && (r.message as { start: number }).start === 0).length;

/** A board as `npm run mock -- --core-fault flaky:RATE --seed 5 [--baud B]` starts it, its flips recorded. */
async function flakyBoard(rate: string, baud?: string) {
  const { settings } = parseBoardArgs(['--core-fault', `flaky:${rate}`, '--seed', '5', ...(baud ? ['--baud', baud] : [])]);
  flips = [];
  // The tap records a request before the board acts on it, so the pass count is current here.
  board = await startTappedBoard({ ...settings, onCoreFlip: (f) => flips.push({ ...f, pass: passesBegun() - 1 }) });
}
afterEach(async () => {
  await board?.close();
});

/** Every 16th code of the 16-bit core, 4,096 codes a pass. */
async function sweepPlan(page: Page, soak: string) {
  await page.getByLabel('What to ask').selectOption('sweep');
  await page.getByLabel('Angles in').selectOption('code');
  await page.getByLabel('Start').fill('0');
  await page.getByLabel('Step, codes').fill('16');
  await page.getByLabel('Count').fill('4096');
  await page.getByLabel('Repeat (soak)').fill(soak);
}

/**
 * From the board's own flips: each code whose answers differed over `passes` passes, with every
 * answer in order of first appearance and its count, as the page writes them ("(cos, sin)×n").
 */
function expectedUnstable(passes: number) {
  const byCode = new Map<number, (CoreFlip & { pass: number })[]>();
  for (const f of flips.filter((x) => x.pass < passes)) byCode.set(f.code, [...(byCode.get(f.code) ?? []), f]);
  const out: { code: number; firstPass: number; answers: string }[] = [];
  for (const [code, fs] of [...byCode].sort((a, b) => a[0] - b[0])) {
    const seq = Array.from({ length: passes }, (_, p) => {
      const f = fs.find((x) => x.pass === p);
      return f ? `(${f.answer.cos}, ${f.answer.sin})` : `(${fs[0].healthy.cos}, ${fs[0].healthy.sin})`;
    });
    const counts = new Map<string, number>();
    for (const a of seq) counts.set(a, (counts.get(a) ?? 0) + 1);
    if (counts.size > 1) out.push({ code, firstPass: seq.findIndex((a) => a !== seq[0]) + 1, answers: [...counts].map(([a, k]) => `${a}×${k}`).join('  ') });
  }
  return out;
}

/** The rows of a table of unstable codes: code, first pass, answers. */
const tableRows = (page: Page, name: string) =>
  page.getByRole('table', { name }).locator('tbody tr').evaluateAll((rows) => rows.map((r) => Array.from(r.querySelectorAll('td'), (td) => (td.textContent ?? '').trim())));

/** Answers the page has: the booked passes' and the pass under way's. */
async function answersOnPage(page: Page) {
  const figures = (await page.getByTestId('soak-figures').count()) ? await page.getByTestId('soak-figures').innerText() : '';
  const booked = Number(/Answers\s+([\d,]+) of/.exec(figures)?.[1].replace(/,/g, '') ?? 0);
  return booked + (await progressOf(page)).done;
}

/** Click `name` on the session's page and read the file it downloads. */
async function download(page: Page, name: 'Export CSV' | 'Export JSON') {
  const started = page.waitForEvent('download');
  await page.getByRole(name === 'Export JSON' ? 'button' : 'link', { name, exact: true }).click();
  return fs.readFileSync((await (await started).path())!, 'utf8');
}

describe('a soak from the Bench page', () => {
  it('runs 3 passes, lists exactly the codes the flaky board varied, saves them with conditions, and exports the conditions', async () => {
    await flakyBoard('0.002');
    const page = await ctx.browser.newPage({ viewport: { width: 1440, height: 1000 } });
    await signInAs(page, ctx.app, 'engineer', '/bench');
    await connectBoard(page, board.url);

    // Bad entries are refused on the field, and nothing starts.
    await sweepPlan(page, '0');
    await runButton(page, 'Run').click();
    await expect.poll(() => page.getByText('A soak needs at least 1 pass, got 0').count()).toBe(1);
    await page.getByLabel('Repeat (soak)').fill('3 passes');
    await runButton(page, 'Run').click();
    await expect.poll(() => page.getByText('A soak is a number of passes (50) or a duration (90s, 30m, 2h), got "3 passes"').count()).toBe(1);
    expect(board.requests.filter((r) => r.kind === Kind.Sweep)).toEqual([]);

    await page.getByLabel('Repeat (soak)').fill('3');
    await runButton(page, 'Run').click();
    await expect.poll(() => runState(page), { timeout: 60_000 }).toBe('Complete');
    await expect.poll(() => page.getByTestId('soak-where').textContent()).toBe('3 of 3 passes done');
    expect(passesBegun()).toBe(3);
    // The bar is the last pass; the board answered every code of all three.
    expect(await progressOf(page)).toEqual({ done: 4096, total: 4096 });
    expect(board.resultsSent).toBe(3 * 4096);

    const expected = expectedUnstable(3);
    // Seed 5 at 0.2 % of 12,288 answers: a couple of dozen flips; enough to see, few enough to list.
    expect(expected.length).toBeGreaterThan(5);
    expect(await page.getByTestId('soak-unstable-count').textContent()).toBe(String(expected.length));
    const listed = expected.slice(0, 12).map((u) => [String(u.code), `pass ${u.firstPass}`, u.answers]);
    expect(await tableRows(page, 'Unstable codes so far')).toEqual(listed);
    const figures = await page.getByTestId('soak-figures').innerText();
    expect(figures).toMatch(/Passes done\s+3/);
    expect(figures).toMatch(/Answers\s+12,288 of 12,288/);
    expect(figures).toMatch(/Link errors\s+0 \(0 bad CHECK, 0 never answered\)/);
    // The timeline is drawn: a uPlot canvas with its four series named.
    const chart = page.getByTestId('chart-soak');
    expect(await chart.locator('canvas').count()).toBe(1);
    expect(await chart.locator('.u-legend').innerText()).toMatch(/model mismatches[\s\S]*unstable codes so far[\s\S]*link errors[\s\S]*re-asked/);
    await page.screenshot({ path: '/tmp/bench-soak-done.png', fullPage: true });

    // Saved with conditions: the last pass's samples and the soak's books.
    await page.getByRole('button', { name: 'Save session' }).click();
    const form = page.getByRole('form', { name: 'Save session' });
    await expect.poll(() => form.getByLabel('Core').inputValue()).not.toBe('');
    await form.getByLabel('Temperature (°C)').fill('85');
    await form.getByLabel('Supply, VCCINT (V)').fill('0.9');
    await form.getByLabel('Clock (MHz)').fill('250');
    await form.getByLabel(/^Other conditions/).fill('chamber=TC-2, airflow=off');
    await form.getByRole('button', { name: 'Save', exact: true }).click();
    await page.waitForURL(/\/sessions\/\d+$/, { timeout: 20_000 });
    await expect.poll(() => page.getByTestId('soak-summary').textContent(), { timeout: 10_000 }).toMatch(new RegExp(`^3 passes of 4,096 codes .*${expected.length} unstable codes`));
    expect(await tableRows(page, 'Unstable codes')).toEqual(listed);
    await page.screenshot({ path: '/tmp/bench-soak-session.png', fullPage: true });

    // The exports carry the conditions: CSV lines above the header, the JSON's own object.
    const csv = (await download(page, 'Export CSV')).split('\n');
    expect(csv.slice(0, 6)).toEqual([
      '# condition temperature_c=85',
      '# condition vccint_v=0.9',
      '# condition clock_mhz=250',
      '# condition chamber=TC-2',
      '# condition airflow=off',
      'index,angle_code,angle_deg,cos_code,sin_code,exact_cos,exact_sin,model_cos,model_sin,cos_err_lsb,sin_err_lsb',
    ]);
    const rows = csv.filter((l) => /^\d/.test(l)).map((l) => l.split(','));
    expect(rows).toHaveLength(4096);
    // The samples are the last pass: where the board flipped an answer in pass 3, that answer.
    const lastPassFlips = flips.filter((f) => f.pass === 2);
    expect(lastPassFlips.length).toBeGreaterThan(0);
    for (const f of lastPassFlips) expect(rows[f.code / 16].slice(1, 5).filter((_, k) => k !== 1).map(Number)).toEqual([f.code, f.answer.cos, f.answer.sin]);
    const json = JSON.parse(await download(page, 'Export JSON')) as { conditions: unknown; soakPasses: number; soak: { unstable: { count: number; codes: { code: number }[] }; timeline: unknown[] } };
    expect(json.conditions).toEqual({ temperature_c: 85, vccint_v: 0.9, clock_mhz: 250, other: { chamber: 'TC-2', airflow: 'off' } });
    expect(json.soakPasses).toBe(3);
    expect(json.soak.unstable.count).toBe(expected.length);
    expect(json.soak.unstable.codes.map((u) => u.code)).toEqual(expected.map((u) => u.code));
    expect(json.soak.timeline).toHaveLength(3);
    await page.close();
  }, 120_000);

  it('pauses and resumes across passes, and an abort ends the soak keeping its whole passes', async () => {
    // At 230,400 baud a pass of 4,096 codes takes about a second: time to act while it runs.
    await flakyBoard('0.002', '230400');
    const page = await ctx.browser.newPage({ viewport: { width: 1440, height: 1000 } });
    await signInAs(page, ctx.app, 'engineer', '/bench');
    await connectBoard(page, board.url);
    await sweepPlan(page, '50');
    await runButton(page, 'Run').click();
    await expect.poll(() => passesBegun(), { timeout: 30_000 }).toBeGreaterThanOrEqual(2);
    await expect.poll(async () => (await page.getByTestId('soak-figures').innerText()).match(/Passes done\s+(\d+)/)?.[1], { timeout: 10_000 }).toBeDefined();

    await runButton(page, 'Pause').click();
    await expect.poll(() => runState(page)).toBe('Paused');
    await expect.poll(() => board.first(Kind.Pause)).toBeDefined();
    // Held: what was on the line arrives, and then the page has every answer the board sent.
    await expect.poll(() => answersOnPage(page), { timeout: 10_000 }).toBe(board.resultsSent);
    const settled = board.resultsSent;
    const pausedIn = passesBegun();
    await page.screenshot({ path: '/tmp/bench-soak-paused.png', fullPage: true });

    await runButton(page, 'Resume').click();
    await expect.poll(() => runState(page)).toBe('Running');
    await expect.poll(() => passesBegun(), { timeout: 30_000 }).toBeGreaterThan(pausedIn);
    expect(board.requests.find((r) => r.kind === Kind.Resume)!.resultsBefore).toBe(settled);

    await runButton(page, 'Abort').click();
    await expect.poll(() => runState(page), { timeout: 10_000 }).toBe('Aborted');
    expect(board.first(Kind.Abort)).toBeDefined();
    const begun = passesBegun();
    // Every pass but the one cut short is booked; the bar and figures are the last whole pass.
    await expect.poll(() => page.getByTestId('soak-where').textContent()).toBe(`${begun - 1} of 50 passes done`);
    await expect.poll(() => progressOf(page)).toEqual({ done: 4096, total: 4096 });
    await expect.poll(() => page.getByTestId('stat-scored').textContent()).toContain('4,096');
    expect(await page.getByTestId('soak-unstable-count').textContent()).toBe(String(expectedUnstable(begun - 1).length));
    expect(await page.getByText(`from the last whole pass of a soak of ${begun - 1} passes`).count()).toBe(1);
    // The soak had ended when the page said so: nothing was asked after the abort.
    const abortAt = board.requests.findIndex((r) => r.kind === Kind.Abort);
    expect(board.requests.slice(abortAt + 1).filter((r) => r.kind === Kind.Sweep || r.kind === Kind.List)).toEqual([]);
    await page.close();
  }, 120_000);
});
