// scale-page: the Bench page through a whole exhaustive run of a 22-bit core (4,194,304 codes)
// from the simulated board at 12,000,000 baud (its own process), then saved to the server as a
// person saves it. Counted in the page: requestAnimationFrame callbacks over the run, and the JS
// heap through CDP (sampled without GC during the run for its peak, after a forced GC at the half
// and the end for what stays). The save is timed from the click to the session's own page.
import { chromium } from 'playwright-core';
import { startBoardProcess } from './board-process';
import { answered, connect, cpuOf, fpsOver, frames, LINE_BOUND, signIn } from './page';
import { startPageApp } from './page-app';
import type { BenchResult } from './report';

const ANGLE_BITS = 22;
const CODES = 2 ** ANGLE_BITS;
const MIN_FPS = 30;
/** What the heap may still grow over the run's second half, after GC: bounded, not growing with the results. */
const MAX_LATE_GROWTH_MB = 4;
const RUN_TIMEOUT_MS = 180_000;
const SAVE_TIMEOUT_MS = 180_000;
const CORE = { name: 'Scale check, 22-bit', slug: 'scale-check-22', modelConfig: { angleBits: ANGLE_BITS } };

export async function scalePageBench(): Promise<BenchResult[]> {
  const app = await startPageApp();
  const board = await startBoardProcess(12_000_000, ['--core', JSON.stringify(CORE.modelConfig)]);
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--enable-precise-memory-info'],
  });
  try {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signIn(page, app.url);
    // The core the session is saved against: the board's, so the server scores the same codes.
    const made = await page.evaluate(async (core) => {
      const { token } = (await (await fetch('/api/auth/csrf')).json()) as { token: string };
      const res = await fetch('/api/cores', { method: 'POST', headers: { 'content-type': 'application/json', 'x-csrf-token': token }, body: JSON.stringify(core) });
      return { status: res.status, text: await res.text() };
    }, CORE);
    if (made.status !== 201 && made.status !== 200) throw new Error(`creating the 22-bit core: ${made.status} ${made.text}`);
    await page.reload();
    await connect(page, board.url);
    const cdp = await page.context().newCDPSession(page);
    await cdp.send('Performance.enable');
    const mb = (b: number) => b / 2 ** 20;
    const heapNow = async () => mb((await cdp.send('Runtime.getHeapUsage')).usedSize);
    const heapAfterGc = async () => {
      await cdp.send('HeapProfiler.collectGarbage');
      return heapNow();
    };
    await page.evaluate('window.benchFrames = 0; (function tick() { window.benchFrames++; requestAnimationFrame(tick); })();');
    const idleFps = await fpsOver(page, 3000);

    await page.getByLabel('What to ask').selectOption('exhaustive');
    const heapStart = await heapAfterGc();
    const f0 = await frames(page);
    const cpu0 = await cpuOf(cdp);
    const t0 = performance.now();
    await page.getByRole('button', { name: 'Run', exact: true }).click();
    let heapPeak = heapStart;
    let heapMid: number | null = null;
    let state = '';
    // The line bound puts the run at about 15 s; the half-way heap is taken near 7 s.
    for (;;) {
      await page.waitForTimeout(500);
      heapPeak = Math.max(heapPeak, await heapNow());
      state = (await page.getByTestId('run-state').textContent()) ?? '';
      if (state !== 'Running') break;
      if (heapMid === null && (await answered(page)) >= CODES / 2) heapMid = await heapAfterGc();
      if (performance.now() - t0 > RUN_TIMEOUT_MS) throw new Error(`the ${CODES.toLocaleString('en-US')}-code run did not finish in ${RUN_TIMEOUT_MS / 1000} s`);
    }
    const wallS = (performance.now() - t0) / 1000;
    const fps = ((await frames(page)) - f0) / wallS;
    const cpu1 = await cpuOf(cdp);
    if (state !== 'Complete') throw new Error(`the run ended "${state}": ${await page.getByRole('alert').allTextContents()}`);
    const done = await answered(page);
    const heapEnd = await heapAfterGc();
    const rate = done / wallS;
    console.log(`  ${done.toLocaleString('en-US')} codes in ${wallS.toFixed(1)} s (${Math.round(rate).toLocaleString('en-US')} results/s, from the click to Complete); idle ${idleFps.toFixed(1)} fps, running ${fps.toFixed(1)} fps`);
    console.log(`  page main thread ${(cpu1.thread - cpu0.thread).toFixed(1)} s of CPU, renderer process ${(cpu1.process - cpu0.process).toFixed(1)} s`);
    console.log(`  JS heap: ${heapStart.toFixed(1)} MB before (after GC), peak ${heapPeak.toFixed(1)} MB, ${heapMid?.toFixed(1) ?? '—'} MB half-way and ${heapEnd.toFixed(1)} MB at the end (after GC)`);

    // Save it as a person does, against the 22-bit core.
    await page.getByRole('button', { name: 'Save session' }).click();
    const form = page.getByRole('form', { name: 'Save session' });
    await form.getByLabel('Core').selectOption({ label: `${CORE.name} (${CORE.slug})` });
    await form.getByLabel('Notes').fill('scale check: every code of a 22-bit core');
    const s0 = performance.now();
    await form.getByRole('button', { name: 'Save', exact: true }).click();
    const outcome = await Promise.race([
      page.waitForURL(/\/sessions\/\d+$/, { timeout: SAVE_TIMEOUT_MS }).then(() => null),
      form.getByRole('alert').waitFor({ timeout: SAVE_TIMEOUT_MS }).then(async () => (await form.getByRole('alert').textContent()) ?? 'an error'),
    ]);
    const saveMs = performance.now() - s0;
    console.log(outcome === null ? `  saved in ${(saveMs / 1000).toFixed(1)} s as ${page.url()}` : `  the save failed after ${(saveMs / 1000).toFixed(1)} s: ${outcome}`);

    const at = `@${CODES}`;
    return [
      { name: `scale-page-fps${at}`, value: fps, unit: 'frames/s over a 22-bit exhaustive run', ratio: fps / idleFps, ratioOf: 'frames/s running ÷ the same page idle', target: `≥ ${MIN_FPS} frames/s`, met: fps >= MIN_FPS },
      {
        name: `scale-page-heap${at}`,
        value: heapPeak,
        unit: 'MB of JS heap at its peak during the run (no forced GC)',
        ratio: heapEnd / heapStart,
        ratioOf: 'heap after GC at the end ÷ before the run',
        target: `≤ ${MAX_LATE_GROWTH_MB} MB growth over the second half (after GC)`,
        met: heapMid !== null && heapEnd - heapMid <= MAX_LATE_GROWTH_MB,
      },
      { name: `scale-page-results-rate${at}`, value: rate, unit: 'results/s, click to Complete', ratio: rate / LINE_BOUND, ratioOf: 'results/s ÷ the line bound at 12,000,000 baud', target: null, met: null },
      { name: `scale-page-save${at}`, value: saveMs, unit: 'ms from Save to the session page', ratio: null, ratioOf: outcome === null ? 'saved' : `not saved: ${outcome}`, target: 'saved', met: outcome === null },
    ];
  } finally {
    await browser.close();
    await app.stop();
    await board.stop();
  }
}
