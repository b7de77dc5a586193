// link: exhaustive 16-bit sweeps against the simulated board (its own process) over a real
// WebSocket, driven the way `anglebench run` drives them: NodeSocketLink + LinkEngine. The bound
// is docs/protocol.md "7. Throughput": the reply bytes the run put on the wire ÷ (baud / 10).
import type { ClientOptions } from 'ws';
import { NodeSocketLink } from '../cli/transport/ws-link';
import { LinkEngine, type EngineClock } from '../shared/link-engine/link-engine';
import { startBoardProcess } from './board-process';
import type { BenchResult } from './report';
import { median } from './timing';

const BAUDS = [921_600, 3_000_000, 12_000_000];
const TARGET_BAUD = 3_000_000;
const TARGET_RATIO = 1.05;
const RUNS = 3;
const CODES = 1 << 16;

const clock: EngineClock = {
  now: () => performance.now(),
  after: (ms, fn) => {
    const t = setTimeout(fn, ms);
    return () => clearTimeout(t);
  },
};

/** One sweep on a fresh connection: wall time of the run and the reply bytes it took. */
export async function sweepOnce(url: string, baud: number, connect: Pick<ClientOptions, 'headers'> = {}): Promise<{ ms: number; rxBytes: number; stallMs: number }> {
  const link = await NodeSocketLink.open(url, 5000, connect);
  try {
    const engine = new LinkEngine({ link, clock, baud });
    await engine.hello();
    const rxBefore = engine.figures.bytesReceived;
    // Where the time goes: silences between chunks longer than the board's 1 ms pacer tick
    // (plus 1 ms of slack) mean the line stood idle, on the board's side or on the way.
    let lastAt = 0;
    let stallMs = 0;
    link.onBytes(() => {
      const now = performance.now();
      if (lastAt > 0 && now - lastAt > 2) stallMs += now - lastAt - 1;
      lastAt = now;
    });
    const t0 = performance.now();
    const result = await engine.run({ kind: 'sweep', start: 0, step: 1, count: CODES }).done;
    const ms = performance.now() - t0;
    const answered = result.answered.reduce((n, a) => n + a, 0);
    if (result.status !== 'complete' || answered !== CODES) throw new Error(`sweep at ${baud} baud ended ${result.status} with ${answered} of ${CODES} answered`);
    return { ms, rxBytes: result.figures.bytesReceived - rxBefore, stallMs };
  } finally {
    await link.close();
  }
}

export async function linkBench(): Promise<BenchResult[]> {
  const out: BenchResult[] = [];
  for (const baud of BAUDS) {
    const board = await startBoardProcess(baud);
    try {
      // One sweep first to warm both processes' JIT: cold code doubles the first run's time.
      await sweepOnce(board.url, baud);
      const runs: { ms: number; rxBytes: number; stallMs: number }[] = [];
      for (let i = 0; i < RUNS; i++) runs.push(await sweepOnce(board.url, baud));
      const ms = median(runs.map((r) => r.ms));
      const rxBytes = median(runs.map((r) => r.rxBytes));
      const boundMs = (rxBytes * 1000) / (baud / 10);
      const ratio = ms / boundMs;
      console.log(`  ${baud.toLocaleString('en-US')} baud: runs ${runs.map((r) => r.ms.toFixed(0)).join(', ')} ms; ${rxBytes.toLocaleString('en-US')} B received; bound ${boundMs.toFixed(0)} ms; silences > 2 ms between chunks ${runs.map((r) => r.stallMs.toFixed(0)).join(', ')} ms`);
      const targeted = baud === TARGET_BAUD;
      out.push({
        name: `link@${baud}`,
        value: ms / 1000,
        unit: 's per 65,536-code sweep',
        ratio,
        ratioOf: 'wall time ÷ line bound (reply bytes ÷ baud/10)',
        target: targeted ? `ratio ≤ ${TARGET_RATIO}` : null,
        met: targeted ? ratio <= TARGET_RATIO : null,
      });
    } finally {
      await board.stop();
    }
  }
  return out;
}
