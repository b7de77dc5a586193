// page: the Bench page in headless Chromium while the simulated board (its own process, 12,000,000
// baud, about 300,000 results/s) answers a 6,000,000-code sweep for 20 s. Counted in the page:
// requestAnimationFrame callbacks (frames the page could draw), during the run and, beside it,
// on the same page idle; and the page's JS heap through CDP, after a forced GC, at the start of
// the run, half-way and at the end.
import { writeFileSync } from 'node:fs';
import { chromium, type Browser, type CDPSession, type Page } from 'playwright-core';
import { startBoardProcess } from './board-process';
import { startPageApp } from './page-app';
import type { BenchResult } from './report';

const BAUD = 12_000_000;
/** Results/s the line can carry: a RESULTS frame of 62 answers is 257 bytes at 10 bits a byte (protocol.md, "7. Throughput"). */
export const LINE_BOUND = BAUD / 10 / (257 / 62);
const SWEEP_CODES = 6_000_000;
const RUN_MS = 20_000;
const IDLE_MS = 3_000;
/** Issue #18's targets at 12,000,000 baud: frames/s while running, and results ÷ the line bound. */
const MIN_FPS = 55;
const MIN_RESULTS_SHARE = 0.95;
/** Heap bound: what the heap may still grow over the run's second half, after GC. */
const MAX_LATE_GROWTH_MB = 4;

declare global {
  interface Window {
    benchFrames?: number;
  }
}

export async function signIn(page: Page, url: string) {
  await page.goto(`${url}/bench`);
  await page.waitForURL(/\/sign-in/);
  await page.getByLabel('E-mail').fill('engineer@anglebench.test');
  await page.getByLabel('Password').fill('anglebench');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/bench$/);
}

export async function connect(page: Page, boardUrl: string) {
  await page.getByLabel('Board address').fill(boardUrl);
  await page.getByRole('button', { name: 'Connect' }).click();
  await page.getByTestId('device-info').filter({ hasText: 'simulated board' }).waitFor({ timeout: 15_000 });
}

export const frames = (page: Page) => page.evaluate(() => window.benchFrames ?? 0);
export const answered = async (page: Page) => Number(((await page.getByTestId('run-progress').textContent()) ?? '0').split('/')[0].replace(/[^0-9]/g, '') || 0);

/** CPU seconds so far of the page's main thread and of its renderer process (the worker's included). */
export async function cpuOf(cdp: CDPSession): Promise<{ thread: number; process: number }> {
  const { metrics } = await cdp.send('Performance.getMetrics');
  const of = (name: string) => metrics.find((m) => m.name === name)?.value ?? NaN;
  return { thread: of('ThreadTime'), process: of('ProcessTime') };
}

/** Frames per second over `ms` of wall time, counted inside the page. */
export async function fpsOver(page: Page, ms: number): Promise<number> {
  const f0 = await frames(page);
  const t0 = performance.now();
  await page.waitForTimeout(ms);
  return ((await frames(page)) - f0) / ((performance.now() - t0) / 1000);
}

/** One sweep run on the connected page: frames/s over `ms` (two halves), heap after GC, results/s. */
async function measureRun(page: Page, heapMb: () => Promise<number>, ms: number, cdp: CDPSession, label: string, browser: Browser) {
  await page.getByLabel('What to ask').selectOption('sweep');
  await page.getByLabel('Start').fill('0');
  await page.getByLabel('Step, codes').fill('1');
  await page.getByLabel('Count').fill(String(SWEEP_CODES));
  const heapStart = await heapMb();
  await page.getByRole('button', { name: 'Run', exact: true }).click();
  await page.getByTestId('run-state').filter({ hasText: 'Running' }).waitFor({ timeout: 10_000 });
  const done0 = await answered(page);
  const cpu0 = await cpuOf(cdp);
  const t0 = performance.now();
  // BENCH_PAGE_PROFILE=/tmp/page: the page's main thread profiled over the first half of each
  // run, into /tmp/page-<label>.cpuprofile.
  const profileTo = process.env.BENCH_PAGE_PROFILE && `${process.env.BENCH_PAGE_PROFILE}-${label}.cpuprofile`;
  if (profileTo) await cdp.send('Profiler.enable').then(() => cdp.send('Profiler.start'));
  // BENCH_PAGE_TRACE=/tmp/page: a Chromium performance trace (layout, paint, scripts, messages)
  // over the same first half, into /tmp/page-<label>.trace.json.
  const traceTo = process.env.BENCH_PAGE_TRACE && `${process.env.BENCH_PAGE_TRACE}-${label}.trace.json`;
  if (traceTo) await browser.startTracing(page, { path: traceTo, categories: ['devtools.timeline', 'disabled-by-default-devtools.timeline', 'v8.execute', 'blink'] });
  const fpsFirst = await fpsOver(page, ms / 2);
  if (traceTo) await browser.stopTracing();
  if (profileTo) writeFileSync(profileTo, JSON.stringify((await cdp.send('Profiler.stop')).profile));
  const heapMid = await heapMb();
  const fpsSecond = await fpsOver(page, ms / 2);
  const heapEnd = await heapMb();
  const done1 = await answered(page);
  const wallS = (performance.now() - t0) / 1000;
  const rate = (done1 - done0) / wallS;
  // CPU time rather than wall time: on a shared machine it says what the page itself spent.
  const cpu1 = await cpuOf(cdp);
  const perResult = (s: number) => (done1 > done0 ? (s * 1e6) / (done1 - done0) : NaN);
  console.log(
    `  ${label}: page main thread ${(cpu1.thread - cpu0.thread).toFixed(1)} s of CPU (${perResult(cpu1.thread - cpu0.thread).toFixed(2)} µs a result), renderer process ${(cpu1.process - cpu0.process).toFixed(1)} s, over ${wallS.toFixed(1)} s`,
  );
  const state = await page.getByTestId('run-state').textContent();
  if (state !== 'Running') throw new Error(`the run was "${state}" at the end of the window, not running: the figures would cover an idle page`);
  await page.getByRole('button', { name: 'Abort' }).click();
  await page.getByTestId('run-state').filter({ hasText: 'Aborted' }).waitFor({ timeout: 60_000 }); // generous: a starved page answers late
  return { fps: (fpsFirst + fpsSecond) / 2, fpsFirst, fpsSecond, heapStart, heapMid, heapEnd, rate };
}

export async function pageBench(): Promise<BenchResult[]> {
  const app = await startPageApp();
  const board = await startBoardProcess(BAUD);
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--enable-precise-memory-info'],
  });
  try {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    await signIn(page, app.url);
    await connect(page, board.url);
    const cdp = await page.context().newCDPSession(page);
    await cdp.send('Performance.enable');
    const heapMb = async () => {
      await cdp.send('HeapProfiler.collectGarbage');
      return (await cdp.send('Runtime.getHeapUsage')).usedSize / 2 ** 20;
    };
    // A string, not a function: tsx would wrap a named inner function in a helper the page lacks.
    await page.evaluate('window.benchFrames = 0; (function tick() { window.benchFrames++; requestAnimationFrame(tick); })();');
    const idleFps = await fpsOver(page, IDLE_MS);

    const main = await measureRun(page, heapMb, RUN_MS, cdp, 'traffic-shown', browser);
    // Diagnosis beside it: the same run with the traffic pane paused (no xterm rows redrawn).
    // A fresh connection first, so nothing the aborted run left in the socket's buffers is counted.
    await page.getByRole('button', { name: 'Disconnect' }).click();
    await connect(page, board.url);
    await page.getByRole('region', { name: 'Line traffic' }).getByRole('button', { name: 'Freeze traffic view', exact: true }).click();
    const quiet = await measureRun(page, heapMb, RUN_MS / 2, cdp, 'traffic-paused', browser);
    const fps = main.fps;
    const { heapStart, heapMid, heapEnd, rate } = main;
    console.log(`  idle ${idleFps.toFixed(1)} fps; running ${main.fpsFirst.toFixed(1)} / ${main.fpsSecond.toFixed(1)} fps (first / second half); ${Math.round(rate).toLocaleString('en-US')} results/s reached the page`);
    console.log(`  JS heap after GC: ${heapStart.toFixed(1)} MB before the run, ${heapMid.toFixed(1)} MB at ${RUN_MS / 2000} s, ${heapEnd.toFixed(1)} MB at ${RUN_MS / 1000} s`);
    console.log(`  traffic pane paused: ${quiet.fps.toFixed(1)} fps, ${Math.round(quiet.rate).toLocaleString('en-US')} results/s`);
    return [
      { name: 'page-fps', value: fps, unit: 'frames/s while running', ratio: fps / idleFps, ratioOf: 'frames/s running ÷ the same page idle', target: `≥ ${MIN_FPS} frames/s`, met: fps >= MIN_FPS },
      {
        name: 'page-heap-growth',
        value: heapEnd - heapStart,
        unit: `MB of JS heap over ${RUN_MS / 1000} s (after GC)`,
        ratio: heapEnd / heapStart,
        ratioOf: 'heap at the end ÷ heap before the run',
        target: `≤ ${MAX_LATE_GROWTH_MB} MB growth over the second half`,
        met: heapEnd - heapMid <= MAX_LATE_GROWTH_MB,
      },
      { name: 'page-fps-traffic-paused', value: quiet.fps, unit: 'frames/s while running, traffic pane paused', ratio: quiet.fps / idleFps, ratioOf: 'frames/s running ÷ the same page idle', target: null, met: null },
      {
        name: 'page-results-rate',
        value: rate,
        unit: 'results/s reaching the page',
        ratio: rate / LINE_BOUND,
        ratioOf: 'results/s ÷ the line bound at 12,000,000 baud',
        target: `ratio ≥ ${MIN_RESULTS_SHARE}`,
        met: rate / LINE_BOUND >= MIN_RESULTS_SHARE,
      },
    ];
  } finally {
    await browser.close();
    await app.stop();
    await board.stop();
  }
}
