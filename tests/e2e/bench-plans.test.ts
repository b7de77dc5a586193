// The one-angle, random and edge plans on the Bench page: angles typed in degrees, radians, turns
// and raw codes reach the board as the codes they stand for; bad entries are refused by their
// field with a message that says what is wrong, and nothing is sent.
import Decimal from 'decimal.js';
import type { Page } from 'playwright-core';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { Kind, type Message } from '../../shared/link';
import { connectBoard, progressOf, runButton, runState } from './bench-steps';
import { appAndBrowser, signInAs } from './harness';
import { startTappedBoard, type TappedBoard } from './tapped-board';

const ctx = appAndBrowser({ BRIDGE_ORIGINS: 'ws://127.0.0.1:*' });
let board: TappedBoard;
let page: Page;

beforeEach(async () => {
  board = await startTappedBoard();
  page = await ctx.browser.newPage({ viewport: { width: 1280, height: 800 } });
  await signInAs(page, ctx.app, 'engineer', '/bench');
  await connectBoard(page, board.url);
});
afterEach(async () => {
  await page.close();
  await board.close();
});

/** The codes of the requests that asked for angles (ONE and LIST), in order. */
const askedCodes = (from: number) =>
  board.requests.slice(from).flatMap(({ message: m }: { message: Message }) => (m.kind === Kind.One ? [m.angleCode] : m.kind === Kind.List ? m.angleCodes : []));

async function runToEnd(count: number) {
  await runButton(page, 'Run').click();
  await expect.poll(() => runState(page), { timeout: 20_000 }).toBe('Complete');
  expect(await progressOf(page)).toEqual({ done: count, total: count });
}

/**
 * The 16-bit turn code nearest `angle` (in `perTurn` units to the turn), wrapped into 0..65535:
 * worked out with decimal.js at 40 digits, π from Decimal.acos(-1), not with the app's own code.
 */
function turnCode(angle: string, perTurn: Decimal): number {
  const x = new Decimal(angle).div(perTurn).times(65536);
  const nearest = x.isNegative() ? x.negated().plus(0.5).floor().negated() : x.plus(0.5).floor(); // half away from zero
  return nearest.mod(65536).plus(65536).mod(65536).toNumber();
}
Decimal.set({ precision: 40 });
const TURN = { deg: new Decimal(360), rad: Decimal.acos(-1).times(2), turn: new Decimal(1) };

describe('the plans of the Bench page', () => {
  it('asks for the code an angle stands for, typed in degrees, radians, turns or as a code', async () => {
    const cases: [unit: 'deg' | 'rad' | 'turn' | 'code', typed: string, code: number][] = [
      ['deg', '30', turnCode('30', TURN.deg)], // 5461.33… → 5461
      ['deg', '-90', turnCode('-90', TURN.deg)], // a quarter turn back: 49152
      ['rad', '1', turnCode('1', TURN.rad)], // 65536 / 2π = 10430.378… → 10430
      ['rad', '3.14159265358979', turnCode('3.14159265358979', TURN.rad)], // half a turn: 32768
      ['turn', '0.125', turnCode('0.125', TURN.turn)], // 8192
      ['turn', '1.75', turnCode('1.75', TURN.turn)], // wraps: 49152
      ['code', '12345', 12345],
    ];
    expect(cases.map(([, , c]) => c)).toEqual([5461, 49152, 10430, 32768, 8192, 49152, 12345]);
    await page.getByLabel('What to ask').selectOption('one');
    for (const [unit, typed, code] of cases) {
      const from = board.requests.length;
      await page.getByLabel('Angles in').selectOption(unit);
      await page.getByLabel('Angle', { exact: true }).fill(typed);
      await runToEnd(1);
      expect(askedCodes(from), `${typed} ${unit}`).toEqual([code]);
      expect(await page.getByTestId('stat-mismatches').textContent()).toBe('0');
    }
  });

  it('asks for the seeded random codes and the edge set', async () => {
    await page.getByLabel('What to ask').selectOption('random');
    await page.getByLabel('Seed', { exact: true }).fill('42');
    await page.getByLabel('Count', { exact: true }).fill('8');
    let from = board.requests.length;
    await runToEnd(8);
    // Pinned in tests/unit/numeric/plans.test.ts: a saved session keeps only seed and count.
    expect(askedCodes(from)).toEqual([5927, 41183, 53601, 31597, 25512, 63643, 50252, 21492]);

    await page.getByLabel('What to ask').selectOption('edges');
    from = board.requests.length;
    // Each eighth of the 16-bit circle (k · 8192) with the codes either side, wrapping at 0, and
    // the format's ends with their inner neighbours (0, 1, 65534, 65535).
    const edges = [...new Set([...Array.from({ length: 8 }, (_, k) => [k * 8192 - 1, k * 8192, k * 8192 + 1]).flat(), 0, 1, 65534, 65535].map((c) => (c + 65536) % 65536))].sort((a, b) => a - b);
    expect(edges).toHaveLength(25);
    await runToEnd(edges.length);
    expect([...askedCodes(from)].sort((a, b) => a - b)).toEqual(edges);
    await page.screenshot({ path: '/tmp/bench-plans-edges.png', fullPage: true });
  });

  it('refuses bad entries by their field, saying what is wrong, and sends nothing', async () => {
    const range = 'is not an integer 0..65535 (turn, 16 bits)';
    const entries: [kind: string, field: string, unit: string | null, typed: string, message: string][] = [
      ['one', 'angle', 'deg', 'abc', '“abc” is not a number'],
      ['one', 'angle', 'deg', '  ', 'Type an angle'],
      ['one', 'angle', 'rad', '1e999', '“1e999” is too large'],
      ['one', 'angle', 'turn', '0x10', '“0x10” is not a number'],
      ['one', 'angle', 'turn', 'Infinity', '“Infinity” is not a number'],
      ['one', 'angle', 'code', '70000', `angle code 70000 ${range}`],
      ['one', 'angle', 'code', '-1', `angle code -1 ${range}`],
      ['one', 'angle', 'code', '2.5', `angle code 2.5 ${range}`],
      ['random', 'seed', null, '-1', 'A whole number from 0 to 4,294,967,295'],
      ['random', 'seed', null, '7x', 'A whole number from 0 to 4,294,967,295'],
      ['random', 'count', null, '0', 'A whole number from 1 to 4,294,967,296'],
      ['random', 'count', null, '1.5', 'A whole number from 1 to 4,294,967,296'],
    ];
    const sent = board.requests.length;
    for (const [kind, field, unit, typed, message] of entries) {
      await page.getByLabel('What to ask').selectOption(kind);
      if (unit) await page.getByLabel('Angles in').selectOption(unit);
      // The field by its name: its label grows by the message once one is shown.
      const input = page.locator(`[name="${field}"]`);
      await input.fill(typed);
      await runButton(page, 'Run').click();
      const label = page.locator('label', { has: input });
      await expect.poll(() => label.locator('.text-fail').textContent(), { timeout: 5000 }).toBe(message);
      expect(await page.getByRole('region', { name: 'Plan' }).getByRole('alert').count(), `${typed}: no message away from the field`).toBe(0);
      if (field === 'angle' && unit === 'code') await page.screenshot({ path: '/tmp/bench-plans-bad-code.png', fullPage: true });
      await input.fill(kind === 'one' ? '0' : '1');
    }
    // Nothing went to the board and no run began.
    expect(board.requests.length).toBe(sent);
    expect(await page.getByTestId('run-progress').count()).toBe(0);
  });
});
