// link-vector: a 256 × 256 grid of vectors (every 256th code of each 16-bit axis) that the
// simulated vectoring board (its own process, `--mode vectoring`) expands itself from VEC_GRID
// requests, over a real WebSocket, driven as `anglebench run` drives it: NodeSocketLink +
// LinkEngine.runVectors. The bound is docs/protocol.md section 8 "Throughput": the reply bytes the
// run put on the wire ÷ (baud / 10).
import { NodeSocketLink } from '../cli/transport/ws-link';
import { LinkEngine, type EngineClock } from '../shared/link-engine/link-engine';
import { startBoardProcess } from './board-process';
import type { BenchResult } from './report';
import { median } from './timing';

const BAUD = 3_000_000;
const TARGET_RATIO = 1.05;
const RUNS = 3;
const GRID = { kind: 'grid', x0: -32768, dx: 256, nx: 256, y0: -32768, dy: 256, ny: 256 } as const;
const VECTORS = GRID.nx * GRID.ny;

const clock: EngineClock = {
  now: () => performance.now(),
  after: (ms, fn) => {
    const t = setTimeout(fn, ms);
    return () => clearTimeout(t);
  },
};

/** One grid on a fresh connection: wall time of the run and the reply bytes it took. */
async function gridOnce(url: string): Promise<{ ms: number; rxBytes: number }> {
  const link = await NodeSocketLink.open(url, 5000);
  try {
    const engine = new LinkEngine({ link, clock, baud: BAUD });
    await engine.hello();
    const modes = await engine.modes();
    if (!modes.vectoring) throw new Error('the board serves no vectoring core');
    const rxBefore = engine.figures.bytesReceived;
    const t0 = performance.now();
    const result = await engine.runVectors(GRID).done;
    const ms = performance.now() - t0;
    const answered = result.answered.reduce((n, a) => n + a, 0);
    if (result.status !== 'complete' || answered !== VECTORS) throw new Error(`grid ended ${result.status} with ${answered} of ${VECTORS} answered`);
    return { ms, rxBytes: result.figures.bytesReceived - rxBefore };
  } finally {
    await link.close();
  }
}

export async function linkVectorBench(): Promise<BenchResult[]> {
  const board = await startBoardProcess(BAUD, ['--mode', 'vectoring']);
  try {
    // One grid first to warm both processes' JIT.
    await gridOnce(board.url);
    const runs: { ms: number; rxBytes: number }[] = [];
    for (let i = 0; i < RUNS; i++) runs.push(await gridOnce(board.url));
    const ms = median(runs.map((r) => r.ms));
    const rxBytes = median(runs.map((r) => r.rxBytes));
    const boundMs = (rxBytes * 1000) / (BAUD / 10);
    const ratio = ms / boundMs;
    console.log(`  ${BAUD.toLocaleString('en-US')} baud: runs ${runs.map((r) => r.ms.toFixed(0)).join(', ')} ms; ${rxBytes.toLocaleString('en-US')} B received; bound ${boundMs.toFixed(0)} ms`);
    return [
      {
        name: `link-vector@${BAUD}`,
        value: ms / 1000,
        unit: 's per 65,536-vector grid',
        ratio,
        ratioOf: 'wall time ÷ line bound (reply bytes ÷ baud/10)',
        target: `ratio ≤ ${TARGET_RATIO}`,
        met: ratio <= TARGET_RATIO,
      },
    ];
  } finally {
    await board.stop();
  }
}
