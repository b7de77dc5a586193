import { describe, expect, it } from 'vitest';
import { appAndBrowser, signInAs } from './harness';

// The sign-off path on the demo data, page by page as a reviewer walks it: the seeded regression
// (build ref16-r3, one output bit stuck), its comparison with reference-16's baseline, the
// rejection, and the mail it sends, read by an admin on the Team page.
const env = appAndBrowser();

describe('a reviewer signs off the seeded regression', () => {
  it('opens it, compares it with the baseline, sees the differing codes and the failing limit, and rejects the build; the admin reads the mail', async () => {
    const page = await env.browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signInAs(page, env.app, 'reviewer', '/sessions?regression=true');
    const rows = page.getByRole('row').filter({ hasText: 'ref16-r3' });
    await expect.poll(() => rows.count()).toBe(1);
    expect(await rows.first().getByText('Regression').isVisible()).toBe(true);
    await rows.first().getByRole('link', { name: /^#\d+$/ }).click();
    await page.waitForURL(/\/sessions\/\d+$/);
    const regressionId = Number(new URL(page.url()).pathname.split('/').pop());

    await page.getByRole('link', { name: 'Compare with baseline' }).click();
    await page.waitForURL(/\/compare\?ids=\d+,\d+$/);
    const [baselineId, comparedId] = new URL(page.url()).searchParams.get('ids')!.split(',').map(Number);
    expect(comparedId).toBe(regressionId);
    expect(baselineId).not.toBe(regressionId);

    // Stuck-at-1 on bit 0 changes every code whose LSB was 0 in cos or sin: most of them.
    const count = page.getByTestId(`diff-count-${regressionId}`);
    await expect.poll(() => count.textContent(), { timeout: 20_000 }).toMatch(/^\d[\d,]*$/);
    const differing = Number((await count.textContent())!.replace(/,/g, ''));
    expect(differing).toBeGreaterThan(30_000);
    expect(differing).toBeLessThan(65_536);
    expect(await page.getByTestId(`diff-summary-${regressionId}`).textContent()).toMatch(/largest difference is 1 LSB/);
    const verdicts = page.getByRole('region', { name: /verdicts against the limits/i });
    const mismatchRows = verdicts.getByRole('row').filter({ hasText: 'Model mismatches' });
    expect(await mismatchRows.nth(0).textContent()).toMatch(/pass/i);
    expect(await mismatchRows.nth(1).textContent()).toMatch(/fail/i);

    // Back to the session, on to its build, and reject it with a note.
    await page.goto(`${env.app.url}/sessions/${regressionId}`);
    await page.getByRole('link', { name: 'ref16-r3' }).first().click();
    await page.waitForURL(/\/builds\/\d+$/);
    const note = 'Half the codes are one LSB off after the tool upgrade: rejected until the netlist is rebuilt.';
    await page.getByLabel('Note for the author').fill(note);
    await page.getByRole('button', { name: 'Reject' }).click();
    await expect.poll(() => page.getByTestId('build-status').first().textContent()).toMatch(/rejected/i);
    await expect.poll(() => page.getByRole('list', { name: 'Review trail' }).textContent()).toContain(note);

    // The build's author (the demo engineer) was mailed; the admin reads it in the outbox.
    const admin = await env.browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signInAs(admin, env.app, 'admin', '/team');
    const message = admin.getByRole('list', { name: 'Messages' }).getByRole('button', { name: /ref16-r3.*rejected/i });
    await expect.poll(() => message.count()).toBe(1);
    await message.click();
    expect(await admin.getByTestId('mail-to').textContent()).toContain('engineer@anglebench.test');
    expect(await admin.getByTestId('mail-text').textContent()).toContain(note);
  });
});
