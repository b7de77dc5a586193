// What a user does on the Bench page, as steps the browser tests share.
import type { Page } from 'playwright-core';
import { expect } from 'vitest';

/** Connect through "Simulated board" to the board at `url` and wait for its INFO. */
export async function connectBoard(page: Page, url: string): Promise<void> {
  await page.getByLabel('Simulated board (on this server)').check();
  await page.getByLabel('Board address').fill(url);
  await page.getByRole('button', { name: 'Connect' }).click();
  await expect.poll(() => page.getByTestId('device-info').textContent(), { timeout: 15_000 }).toContain('simulated board');
}

/** The run's "done / total" as numbers (0 / 0 before a run has reported). */
export async function progressOf(page: Page): Promise<{ done: number; total: number }> {
  const text = (await page.getByTestId('run-progress').textContent()) ?? '';
  const m = /^([\d,]+) \/ ([\d,]+)$/.exec(text.trim());
  if (!m) throw new Error(`run progress reads "${text}"`);
  return { done: Number(m[1].replace(/,/g, '')), total: Number(m[2].replace(/,/g, '')) };
}

/** The run's state in words: Running, Paused, Complete, Aborted, Failed. */
export const runState = (page: Page) => page.getByTestId('run-state').textContent();

/** A button of the Plan panel (the traffic pane has a Pause of its own, for its display). */
export const runButton = (page: Page, name: 'Run' | 'Pause' | 'Resume' | 'Abort') => page.getByRole('region', { name: 'Plan' }).getByRole('button', { name, exact: true });
