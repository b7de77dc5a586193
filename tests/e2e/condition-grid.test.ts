// The condition grid in a real browser, over the demo lab's thermal sweep of ref16-r2 (seeded by
// server/db/seed-thermal.ts): 25 and 55 °C pass at every supply, 85 °C is unstable at 0.90 V only.
import { describe, expect, it } from 'vitest';
import { appAndBrowser, signInAs } from './harness';

const ctx = appAndBrowser();

describe('the condition grid', () => {
  it('shows the thermal sweep’s verdicts and follows a cell to its sessions', async () => {
    const page = await ctx.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInAs(page, ctx.app, 'reviewer', '/conditions');
    const choices = page.getByRole('form', { name: 'Grid choices' });
    await expect.poll(() => choices.getByLabel('Build').locator('option').count()).toBeGreaterThan(1);
    await choices.getByLabel('Build').selectOption({ label: 'Reference rotator, 16-bit — ref16-r2' });
    const grid = page.getByRole('table', { name: 'Condition grid' });
    await grid.waitFor();
    const cells = grid.getByRole('link');
    await expect.poll(() => cells.count()).toBe(9);
    const names = await cells.evaluateAll((links) => links.map((a) => a.getAttribute('aria-label')));
    expect(names.filter((n) => n?.startsWith('UNSTABLE'))).toEqual(['UNSTABLE at Temperature (°C) 85, Core supply (V) 0.9: 1 session']);
    expect(names.filter((n) => n?.startsWith('PASS'))).toHaveLength(8);
    // The line plot of one figure against temperature, a line per supply.
    await page.getByRole('combobox', { name: /^Figure/ }).selectOption({ label: 'Unstable codes' });
    await expect.poll(() => page.getByRole('img', { name: 'Unstable codes against Temperature (°C)' }).locator('polyline').count()).toBe(3);
    await page.screenshot({ path: '/tmp/soak-condition-grid.png', fullPage: true });

    await grid.getByRole('link', { name: /^UNSTABLE at/ }).click();
    await page.waitForURL((u) => u.pathname === '/sessions' && u.searchParams.get('temperatureMin') === '85' && u.searchParams.get('vccintMax') === '0.9');
    const rows = page.locator('table tbody tr');
    await expect.poll(() => rows.count()).toBe(1);
    await page.screenshot({ path: '/tmp/soak-cell-sessions.png', fullPage: true });

    // The session itself: its conditions, the soak's timeline and the unstable codes against angle.
    await rows.first().getByRole('link').first().click();
    await page.waitForURL(/\/sessions\/\d+$/);
    const conditions = page.getByLabel('Recorded conditions').getByRole('definition');
    await expect.poll(() => page.getByLabel('Recorded conditions').innerText()).toMatch(/Temperature\s+85 °C[\s\S]*Core supply\s+0\.9 V[\s\S]*chamber\s+TC-2/);
    expect(await conditions.count()).toBe(4);
    expect(await page.getByTestId('soak-summary').innerText()).toMatch(/^5 passes of 1,024 codes .* \d+ unstable codes\./);
    await expect.poll(() => page.getByRole('img', { name: 'Soak timeline: pass against mismatches, unstable codes and link errors' }).locator('polyline').count()).toBe(3);
    expect(await page.getByRole('img', { name: /^Unstable codes against angle: \d+ codes$/ }).locator('circle').count()).toBeGreaterThan(5);
    await page.screenshot({ path: '/tmp/soak-session.png', fullPage: true });
    await page.close();
  });
});
