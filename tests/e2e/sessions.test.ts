import type { Browser, Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { emptyFigures } from '../../shared/link-engine/link-figures';
import { packSamples } from '../../shared/link-engine/sample-pack';
import { encodeMessage, Kind, RecordedDecoder, Recorder } from '../../shared/link';
import { createCordicModel, parseModelConfig } from '../../shared/numeric';
import { launchBrowser, startApp, type RunningApp } from './harness';

let app: RunningApp;
let browser: Browser;
// A tag of this run's own, so the checks below do not depend on the demo sessions.
const tag = `e2e-${Date.now().toString(36)}`;
let passingId: number;
let failingId: number;

async function signIn(page: Page, email: string, next = '/sessions') {
  await page.goto(`${app.url}/sign-in?next=${encodeURIComponent(next)}`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill('anglebench');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => u.pathname === next);
}

/** Every 16th 16-bit code answered as the reference-16 model does, `faulty` of them 40 LSB off in cos. */
function samples(faulty: number): number[] {
  const n = 4096;
  const codes = new Int32Array(n).map((_, i) => i * 16);
  const cos = new Int32Array(n);
  const sin = new Int32Array(n);
  createCordicModel(parseModelConfig({})).evaluateInto(codes, cos, sin);
  for (let i = 0; i < faulty; i++) cos[i * 97] += 40;
  return Array.from(packSamples(codes, cos, sin, new Uint8Array(n).fill(1)));
}

/**
 * A small capture: HELLO at 0 ms, ONE at 1 s, ONE at 20 s. The long gap gives a 1× replay, with
 * silences kept, stopped after the second frame plenty of room on a busy machine; at 16× it ends
 * in 1.25 s; skipping silences (gaps over 2 s shortened to 2 s), a 1× replay ends in 3 s.
 */
function captureBytes(): number[] {
  const p = { angleFormat: 'turn' as const, angleBits: 16, outBits: 16 };
  const times = [0, 1000, 20_000];
  let k = 0;
  const recorder = new Recorder({ label: 'e2e capture' });
  const device = new RecordedDecoder({ recorder, direction: 'to-device', nowMs: () => times[Math.min(k, times.length - 1)], onFrame: () => undefined });
  for (const m of [encodeMessage({ kind: Kind.Hello }, 1, p), encodeMessage({ kind: Kind.One, angleCode: 4096 }, 2, p), encodeMessage({ kind: Kind.One, angleCode: 8192 }, 3, p)]) {
    device.push(m);
    k++;
  }
  return Array.from(recorder.toArchive());
}

/** POST /api/sessions from the page, with its cookie and CSRF token, as the Bench page does. */
async function upload(page: Page, bytes: number[], notes: string, archive: number[] | null = null, link?: Record<string, unknown>) {
  const session = { coreSlug: 'reference-16', startedAt: new Date().toISOString(), plan: { kind: 'sweep', first: 0, step: 16, count: 4096 }, transport: { kind: 'test' }, link, notes, tags: [tag] };
  return page.evaluate(
    async ({ session, bytes, archive }) => {
      const { token } = (await (await fetch('/api/auth/csrf')).json()) as { token: string };
      const form = new FormData();
      form.set('session', JSON.stringify(session));
      form.set('samples', new Blob([new Uint8Array(bytes)]), 'samples.bin');
      if (archive) form.set('archive', new Blob([new Uint8Array(archive)]), 'capture.abrc');
      const res = await fetch('/api/sessions', { method: 'POST', body: form, headers: { 'x-csrf-token': token } });
      return { status: res.status, body: (await res.json()) as { id: number; passed: boolean } };
    },
    { session, bytes, archive },
  );
}

/** The passing session's link figures, as the Bench page sends them, plus one this page does not know. */
const figures = { ...emptyFigures(), framesSent: 4097, framesReceived: 4097, bytesSent: 36_873, bytesReceived: 1_069_317, naks: { ...emptyFigures().naks, 4: 2 }, retries: 2, resultsPerS: 1_843.25, lineShare: 0.9278, warmupMs: 250 };

const rowsOf = (page: Page) => page.getByTestId('session-row');

// Each test gets its own page (its own cookies), closed afterwards so no page keeps drawing.
const opened: Page[] = [];
async function newPage() {
  const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
  opened.push(page);
  return page;
}
afterEach(async () => {
  await Promise.all(opened.splice(0).map((p) => p.close()));
});

beforeAll(async () => {
  app = await startApp();
  browser = await launchBrowser();
  const page = await browser.newPage();
  await signIn(page, 'engineer@anglebench.test');
  const good = await upload(page, samples(0), 'healthy sweep', captureBytes(), figures);
  const bad = await upload(page, samples(10), 'ten answers off by 40 LSB');
  expect([good.status, bad.status]).toEqual([201, 201]);
  expect([good.body.passed, bad.body.passed]).toEqual([true, false]);
  passingId = good.body.id;
  failingId = bad.body.id;
  await page.close();
});
afterAll(async () => {
  await browser?.close();
  await app?.stop();
});

describe('the Sessions list and Session page for a reviewer', () => {
  it('lists sessions with their verdict in words, and filters to failing ones through the address bar', async () => {
    const page = await newPage();
    await signIn(page, 'reviewer@anglebench.test');
    await expect.poll(() => rowsOf(page).count()).toBeGreaterThanOrEqual(2);
    const words = await rowsOf(page).getByTestId('verdict').allTextContents();
    expect(words.length).toBe(await rowsOf(page).count());
    expect(new Set(words)).toEqual(new Set(['Pass', 'Fail']));
    expect(await page.getByRole('link', { name: `#${passingId}`, exact: true }).count()).toBe(1);

    await page.getByLabel('Verdict').selectOption('fail');
    await page.waitForURL(/verdict=fail/);
    await expect.poll(() => page.getByRole('link', { name: `#${passingId}`, exact: true }).count()).toBe(0);
    expect(await page.getByRole('link', { name: `#${failingId}`, exact: true }).count()).toBe(1);
    expect(new Set(await rowsOf(page).getByTestId('verdict').allTextContents())).toEqual(new Set(['Fail']));

    // The filter survives a reload, and narrows further by this run's tag to the one session.
    await page.goto(`${app.url}/sessions?verdict=fail&tag=${tag}`);
    await expect.poll(() => rowsOf(page).count()).toBe(1);
    expect(await page.getByLabel('Verdict').inputValue()).toBe('fail');
    expect(await rowsOf(page).first().textContent()).toContain(`#${failingId}`);
  });

  it('picks two sessions and takes them to the compare page', async () => {
    const page = await newPage();
    await signIn(page, 'reviewer@anglebench.test', '/sessions');
    const compare = page.getByRole('button', { name: 'Compare selected' });
    await page.getByLabel(`Pick session #${failingId} for comparison`).check();
    expect(await compare.isDisabled()).toBe(true);
    await page.getByLabel(`Pick session #${passingId} for comparison`).check();
    expect(await compare.isDisabled()).toBe(false);
    await compare.click();
    await page.waitForURL((u) => u.pathname === '/compare');
    expect(new URL(page.url()).searchParams.get('ids')).toBe(`${passingId},${failingId}`);
  });

  it('shows the verdict per limit and leaves out the engineer-only actions', async () => {
    const page = await newPage();
    await signIn(page, 'reviewer@anglebench.test');
    await page.getByRole('link', { name: `#${failingId}`, exact: true }).click();
    await page.waitForURL(new RegExp(`/sessions/${failingId}$`));
    const table = page.getByRole('table', { name: 'Verdict per limit' });
    await table.waitFor();
    expect(await page.getByTestId('verdict-maxAbsErrorLsb').textContent()).toContain('Fail');
    expect(await page.getByTestId('verdict-maxModelMismatches').textContent()).toMatch(/at most 0.*10.*Fail/);
    expect(await page.getByTestId('verdict-minSfdrDb').textContent()).toContain('Not measured');
    await page.getByRole('heading', { name: 'Notes and tags' }).waitFor();
    expect(await page.getByTestId('session-notes').textContent()).toBe('ten answers off by 40 LSB');
    expect(await page.getByRole('button', { name: 'Edit notes and tags' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Set as baseline' }).count()).toBe(0);
    // Reviewers comment; markup in a comment is shown as the text it is.
    await page.getByLabel('Your comment').fill('Seen: <b>ten</b> codes off, <img src=x onerror=alert(1)>');
    await page.getByRole('button', { name: 'Post comment' }).click();
    const thread = page.getByRole('list', { name: 'Comments on this session' });
    await expect.poll(() => thread.textContent()).toContain('Seen: <b>ten</b> codes off, <img src=x onerror=alert(1)>');
    expect(await thread.locator('b, img').count()).toBe(0);
    expect(await thread.textContent()).toContain('Mei Lindqvist');
    await thread.getByRole('button', { name: 'Delete this comment' }).click();
    await expect.poll(() => page.getByText('No comments yet.').isVisible()).toBe(true);
  });

  it('lists the link figures readably, apart from the transport settings', async () => {
    const page = await newPage();
    await signIn(page, 'reviewer@anglebench.test', `/sessions/${passingId}`);
    const list = page.getByLabel('Link figures', { exact: true });
    await list.waitFor();
    const text = await list.textContent();
    for (const line of ['Frames out / in4,097 / 4,097', 'Bytes out / in36,873 B / 1,069,317 B', 'NAKs by reason2 (paused 2)', 'Retries2', 'Results per second1,843.3 /s', 'Line use (replies)92.8 %', 'warmupMs250']) expect(text).toContain(line);
    const transport = await page.getByLabel('Transport', { exact: true }).textContent();
    expect(transport).toBe('kindtest');
    expect(await page.getByText(/"framesSent"/).count()).toBe(0);
  });
});

describe('the Session page for an engineer', () => {
  it('re-scores the stored samples in the browser and draws the XY circle with a square plotting area', async () => {
    const page = await newPage();
    await signIn(page, 'engineer@anglebench.test', `/sessions/${passingId}`);
    await expect.poll(() => page.getByTestId('browser-recheck').textContent(), { timeout: 20_000 }).toContain('the same figures as the server');
    const over = await page.getByTestId('chart-xy').locator('.u-over').boundingBox();
    expect(over!.width).toBeGreaterThan(100);
    expect(Math.abs(over!.width - over!.height)).toBeLessThanOrEqual(1);
  });

  it('browses the recorded capture, replays it at its recorded pace and stops, skips its silence, and says so in its status line', async () => {
    const page = await newPage();
    await signIn(page, 'engineer@anglebench.test', `/sessions/${passingId}`);
    await page.getByRole('button', { name: 'Open capture' }).click();
    await expect.poll(() => page.getByTestId('capture-recheck').textContent()).toContain('3 frames to the device and 0 skips, the same frames as recorded');
    const region = page.getByRole('region', { name: 'Recorded capture' });
    const status = region.getByRole('status');
    await status.getByText('3 frames in 6 records, 20.0 s of traffic').waitFor();
    const pane = page.getByTestId('capture-terminal');
    await pane.getByText('HELLO tag 1').waitFor();
    expect(await pane.textContent()).toContain('ONE tag 3: angle code 8192');

    // Every text the status line takes, kept by the page itself so none is missed between polls.
    await status.evaluate((el) => {
      const seen: string[] = [];
      (window as unknown as { statusSeen: string[] }).statusSeen = seen;
      new MutationObserver(() => seen.at(-1) !== el.textContent && seen.push(el.textContent ?? '')).observe(el, { childList: true, characterData: true, subtree: true });
    });
    const seen = () => page.evaluate(() => (window as unknown as { statusSeen: string[] }).statusSeen.slice());

    // As recorded, silences kept, the second frame comes 1 s in and the last 20 s in: stopped after the second.
    const skip = region.getByLabel('Skip silences');
    expect(await skip.isChecked()).toBe(true);
    await skip.uncheck();
    await region.getByRole('button', { name: 'Replay', exact: true }).click();
    expect(await skip.isDisabled()).toBe(true);
    await status.getByText(/^Replaying: frame 2 of 3, /).waitFor({ timeout: 20_000 });
    await region.getByRole('button', { name: 'Stop' }).click();
    await status.getByText(/^Stopped at frame 2 of 3, /).waitFor();
    const stoppedAt = await status.textContent();
    await expect.poll(() => pane.textContent()).toContain('ONE tag 2: angle code 4096');
    await page.waitForTimeout(1500);
    expect(await status.textContent()).toBe(stoppedAt);
    expect(await pane.textContent()).not.toContain('angle code 8192');

    // Sixteen times faster, it runs to the end.
    await region.getByLabel('Replay speed').selectOption('16');
    await region.getByRole('button', { name: 'Replay', exact: true }).click();
    await status.getByText('Replay finished: 3 frames, 20.0 s of traffic').waitFor({ timeout: 20_000 });
    await expect.poll(() => pane.textContent()).toContain('End of the capture.');
    expect(await pane.textContent()).toContain('angle code 8192');
    expect(await pane.textContent()).not.toContain('without traffic');

    // Skipping silences, the 19 s gap lasts 2 s: as recorded, the replay ends about 3 s in, and
    // the terminal says where the silence was left out.
    await region.getByLabel('Replay speed').selectOption('1');
    await skip.check();
    const skipStart = Date.now();
    await region.getByRole('button', { name: 'Replay', exact: true }).click();
    await status.getByText('Replay finished: 3 frames, 20.0 s of traffic').waitFor({ timeout: 20_000 });
    const skipWallMs = Date.now() - skipStart;
    expect(skipWallMs).toBeGreaterThanOrEqual(2_900);
    expect(skipWallMs).toBeLessThan(12_000);
    await expect.poll(() => pane.textContent()).toContain('End of the capture.');
    const replayed = (await pane.textContent())!;
    expect(replayed).toContain('… 19.0 s without traffic, skipped …');
    // The skip line stands between the second frame and the third.
    expect(replayed.indexOf('angle code 4096')).toBeLessThan(replayed.indexOf('19.0 s without traffic'));
    expect(replayed.indexOf('19.0 s without traffic')).toBeLessThan(replayed.indexOf('angle code 8192'));

    // The status went replaying → stopped, replaying faster → finished, then replaying with the
    // silence skipped → finished, counting up in recorded time each time.
    const texts = await seen();
    const ends = texts.flatMap((t, i) => (t.startsWith('Stopped') || t.startsWith('Replay finished') ? [i] : []));
    expect(ends.map((i) => texts[i])).toEqual([stoppedAt, 'Replay finished: 3 frames, 20.0 s of traffic', 'Replay finished: 3 frames, 20.0 s of traffic']);
    expect(ends.at(-1)).toBe(texts.length - 1);
    const runs = ends.map((end, k) => texts.slice(k === 0 ? 0 : ends[k - 1] + 1, end));
    for (const [run, prefix] of [
      [runs[0], 'Replaying: '],
      [runs[1], 'Replaying 16× faster: '],
      [runs[2], 'Replaying, skipping silences: '],
    ] as const) {
      expect(run.length).toBeGreaterThan(0);
      const steps = run.map((t) => {
        expect(t.startsWith(prefix)).toBe(true);
        const m = /frame (\d) of 3, ([\d.]+) s of 20\.0 s$/.exec(t);
        expect(m, t).not.toBeNull();
        return [Number(m![1]), Number(m![2])];
      });
      // Frames and seconds never go back, and never run past the capture.
      steps.slice(1).forEach(([f, s], i) => expect(f >= steps[i][0] && s >= steps[i][1], run.join(' | ')).toBe(true));
      expect(steps.every(([f, s]) => f <= 3 && s <= 20)).toBe(true);
    }
    // Stopped 1 s to 20 s in: two frames shown, the third not yet due.
    const stoppedS = Number(/, ([\d.]+) s of/.exec(stoppedAt!)![1]);
    expect(stoppedS).toBeGreaterThanOrEqual(1);
    expect(stoppedS).toBeLessThan(20);
  });

  it('edits the notes and keeps them after a reload', async () => {
    const page = await newPage();
    await signIn(page, 'engineer@anglebench.test', `/sessions/${passingId}`);
    await page.getByRole('button', { name: 'Edit notes and tags' }).click();
    const form = page.getByRole('form', { name: 'Edit notes and tags' });
    await form.getByLabel('Notes').fill('Re-run after the clock fix: <b>clean</b>.');
    await form.getByLabel('Tags (comma-separated)').fill(`${tag}, rerun`);
    await form.getByRole('button', { name: 'Save notes and tags' }).click();
    await expect.poll(() => page.getByTestId('session-notes').textContent()).toBe('Re-run after the clock fix: <b>clean</b>.');
    await page.reload();
    await expect.poll(() => page.getByTestId('session-notes').textContent()).toBe('Re-run after the clock fix: <b>clean</b>.');
    expect(await page.getByRole('list', { name: 'Tags' }).textContent()).toContain('rerun');
  });

  it('makes a passing session its core’s baseline', async () => {
    const page = await newPage();
    await signIn(page, 'engineer@anglebench.test', `/sessions/${passingId}`);
    // The button waits for the core (its baseline) to load.
    await expect.poll(() => page.getByRole('button', { name: 'Set as baseline' }).count()).toBe(1);
    await page.getByRole('button', { name: 'Set as baseline' }).click();
    await expect.poll(() => page.getByTestId('baseline-state').textContent()).toContain('This session is its core’s baseline');
    expect(await page.getByRole('button', { name: 'Set as baseline' }).count()).toBe(0);
    expect(await page.getByRole('link', { name: 'Compare with baseline' }).count()).toBe(0);
    // The failing session now compares against it.
    await page.goto(`${app.url}/sessions/${failingId}`);
    await expect.poll(() => page.getByRole('link', { name: 'Compare with baseline' }).getAttribute('href')).toBe(`/compare?ids=${passingId},${failingId}`);
    expect(await page.getByRole('button', { name: 'Set as baseline' }).count()).toBe(0);
  });
});
