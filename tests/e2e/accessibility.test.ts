// The WCAG 2.1 AA audit (axe-core) of every page, as the people who use them see them: signed in
// as an engineer (the Team page as an admin), the sign-in and invitation pages signed out. A
// serious or critical violation fails, with each element at fault printed.
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { describeViolations, landmarkViolations, seriousViolations } from './axe-audit';
import { appAndBrowser, signInAs, type DemoRole } from './harness';
import { pageGet, pagePost } from './page-fetch';
import { connectBoard, runButton, runState } from './bench-steps';

const ctx = appAndBrowser();
const ids = { session: 0, sameCore: [] as number[], vectoring: [] as number[], build: 0, core: 0, board: 0 };
let invitationPath = '';

// axe-core goes in as an inline script, which the app's CSP forbids: the audit's contexts bypass it.
const contexts: BrowserContext[] = [];
async function newPage(): Promise<Page> {
  const context = await ctx.browser.newContext({ bypassCSP: true, viewport: { width: 1280, height: 800 } });
  contexts.push(context);
  return context.newPage();
}
async function signedIn(who: DemoRole, path: string): Promise<Page> {
  const page = await newPage();
  await signInAs(page, ctx.app, who, path);
  return page;
}

beforeAll(async () => {
  const page = await signedIn('engineer', '/');
  const sessions = (await pageGet<{ items: { id: number; coreId: number; sampleCount: number; core: { mode: string } }[] }>(page, '/api/sessions?pageSize=50')).items.filter((s) => s.sampleCount > 0);
  ids.session = sessions[0].id;
  // Two of one core, so the compare page diffs them bit for bit (its list of differing codes scrolls).
  ids.sameCore = sessions.filter((s) => s.coreId === sessions[0].coreId).slice(0, 2).map((s) => s.id);
  ids.build = (await pageGet<{ builds: { id: number }[] }>(page, '/api/builds')).builds[0].id;
  ids.core = (await pageGet<{ cores: { id: number }[] }>(page, '/api/cores')).cores[0].id;
  ids.board = (await pageGet<{ boards: { id: number }[] }>(page, '/api/boards')).boards[0].id;
  expect(ids.sameCore).toHaveLength(2);
  // The demo's vectoring core: its first two sessions, the defective build's grid against the mended one's (differing vectors listed).
  ids.vectoring = sessions.filter((s) => s.core.mode === 'vectoring').map((s) => s.id).sort((a, b) => a - b).slice(0, 2);
  expect(ids.vectoring).toHaveLength(2);

  // An invitation's page is reached through the link the admin's invitation mails.
  const admin = await signedIn('admin', '/');
  const invited = await pagePost(admin, '/api/invitations', { email: 'audit.visitor@anglebench.test', role: 'reviewer' });
  expect(invited.status).toBe(201);
  const outbox = await pageGet<{ messages: { to: string; text: string }[] }>(admin, '/api/outbox');
  const text = outbox.messages.find((m) => m.to.includes('audit.visitor@anglebench.test'))!.text;
  invitationPath = new URL(/https?:\/\/\S+\/invite\/\S+/.exec(text)![0]).pathname;
});
afterAll(async () => {
  await Promise.all(contexts.map((c) => c.close()));
});

/** Open `path` on `page`, wait until it has drawn what it reads, and audit it. */
async function audit(page: Page, path: string, ready: (page: Page) => Promise<unknown>, shot: string) {
  await page.goto(`${ctx.app.url}${path}`);
  await ready(page);
  await page.waitForLoadState('networkidle');
  await auditAsShown(page, path, shot);
}

/** Audit what `page` shows now (a state reached by using the page, not by opening it). */
async function auditAsShown(page: Page, path: string, shot: string) {
  await page.screenshot({ path: `/tmp/a11y-${shot}.png`, fullPage: true });
  const found = [...(await seriousViolations(page)), ...(await landmarkViolations(page))];
  if (found.length) console.log(`${path}:\n${describeViolations(found)}`);
  expect(describeViolations(found), `serious or critical WCAG 2.1 AA violations, or repeated landmarks, on ${path}`).toBe('');
}

const heading = (name: string | RegExp) => (page: Page) => page.getByRole('heading', { level: 1, name }).waitFor();

describe('every page passes the WCAG 2.1 AA audit (no serious or critical violation)', () => {
  const engineerPages: [string, () => string, (page: Page) => Promise<unknown>][] = [
    ['overview', () => '/', heading('Bench overview')],
    ['bench', () => '/bench', heading('Bench')],
    ['sessions', () => '/sessions', (p) => p.getByTestId('session-row').first().waitFor()],
    ['session', () => `/sessions/${ids.session}`, (p) => p.getByRole('table', { name: 'Verdict per limit' }).waitFor()],
    ['compare', () => `/compare?ids=${ids.sameCore.join(',')}`, (p) => p.getByTestId(`diff-summary-${ids.sameCore[1]}`).waitFor()],
    ['vectoring session', () => `/sessions/${ids.vectoring[0]}`, (p) => p.getByTestId('chart-error-map').locator('canvas[aria-label*="cells answered"]').waitFor({ timeout: 30_000 })],
    ['vectoring compare', () => `/compare?ids=${ids.vectoring.join(',')}`, (p) => p.getByRole('region', { name: /^First differing vectors/ }).waitFor()],
    ['builds', () => '/builds', heading('Builds')],
    ['build', () => `/builds/${ids.build}`, heading(/^Build /)],
    ['cores', () => '/cores', heading('Cores')],
    ['core', () => `/cores/${ids.core}`, (p) => p.getByRole('heading', { level: 1 }).waitFor()],
    ['boards', () => '/boards', heading('Boards')],
    ['board', () => `/boards/${ids.board}`, (p) => p.getByRole('heading', { level: 1 }).waitFor()],
    ['account', () => '/account', heading('Your account')],
    ['report', () => `/sessions/${ids.session}/report`, (p) => p.locator('#report-title').waitFor()],
  ];
  for (const [name, path, ready] of engineerPages) {
    it(`${name}, signed in as an engineer`, async () => {
      const page = await signedIn('engineer', '/');
      await audit(page, path(), ready, name);
    });
  }

  it('bench with a soak done (its figures, timeline and unstable codes), signed in as an engineer', async () => {
    const page = await signedIn('engineer', '/bench');
    // The server's own simulated board, healthy: 3 passes of a 256-code sweep.
    await connectBoard(page, `${ctx.app.url.replace(/^http/, 'ws')}/api/sim-board`);
    await page.getByLabel('What to ask').selectOption('sweep');
    await page.getByLabel('Count').fill('256');
    await page.getByLabel('Repeat (soak)').fill('3');
    await runButton(page, 'Run').click();
    await expect.poll(() => runState(page), { timeout: 30_000 }).toBe('Complete');
    await expect.poll(() => page.getByTestId('soak-where').textContent()).toBe('3 of 3 passes done');
    await auditAsShown(page, '/bench (soak)', 'bench-soak');
  });

  it('team, signed in as an admin', async () => {
    const page = await signedIn('admin', '/');
    await audit(page, '/team', heading('Team'), 'team');
  });

  it('sign-in, signed out', async () => {
    await audit(await newPage(), '/sign-in', heading('Sign in'), 'sign-in');
  });

  it('an invitation, signed out', async () => {
    await audit(await newPage(), invitationPath, heading('Join your team’s bench'), 'invitation');
  });
});
