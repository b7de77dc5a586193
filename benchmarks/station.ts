// station: exhaustive 16-bit sweeps at 3,000,000 baud through a station and the server's relay,
// every party its own process as in a lab: the simulated board (`npm run mock`), the station
// (`bridge --server`, dialling out), the production server relaying, and here the runner's side
// (`run --device station:NAME`: openDevice + LinkEngine). Beside each, the same sweep straight to
// the board, and the line bound: the reply bytes the run put on the wire ÷ (baud / 10).
import { openDevice } from '../cli/device';
import { NodeSocketLink } from '../cli/transport/ws-link';
import type { ByteLink } from '../shared/link-engine/byte-link';
import { LinkEngine, type EngineClock } from '../shared/link-engine/link-engine';
import { demoApiToken, startApp, startStationProcess, type StationProcess } from '../tests/e2e/harness';
import { startBoardProcess } from './board-process';
import type { BenchResult } from './report';
import { median } from './timing';

const BAUD = 3_000_000;
const TARGET_RATIO = 1.1;
const RUNS = 3;
const CODES = 1 << 16;
const NAME = 'Bench relay bay';

const clock: EngineClock = {
  now: () => performance.now(),
  after: (ms, fn) => {
    const t = setTimeout(fn, ms);
    return () => clearTimeout(t);
  },
};

/** One sweep on a fresh link: wall time and the reply bytes it took. */
async function sweepOnce(open: () => Promise<ByteLink>): Promise<{ ms: number; rxBytes: number }> {
  const link = await open();
  try {
    const engine = new LinkEngine({ link, clock, baud: BAUD });
    await engine.hello();
    const rxBefore = engine.figures.bytesReceived;
    const t0 = performance.now();
    const result = await engine.run({ kind: 'sweep', start: 0, step: 1, count: CODES }).done;
    const ms = performance.now() - t0;
    const answered = result.answered.reduce((n, a) => n + a, 0);
    if (result.status !== 'complete' || answered !== CODES) throw new Error(`sweep ended ${result.status} with ${answered} of ${CODES} answered`);
    return { ms, rxBytes: result.figures.bytesReceived - rxBefore };
  } finally {
    await link.close();
  }
}

function result(name: string, runs: { ms: number; rxBytes: number }[], targeted: boolean): BenchResult {
  const ms = median(runs.map((r) => r.ms));
  const boundMs = (median(runs.map((r) => r.rxBytes)) * 1000) / (BAUD / 10);
  const ratio = ms / boundMs;
  console.log(`  ${name}: runs ${runs.map((r) => r.ms.toFixed(0)).join(', ')} ms; bound ${boundMs.toFixed(0)} ms`);
  return {
    name,
    value: ms / 1000,
    unit: 's per 65,536-code sweep',
    ratio,
    ratioOf: 'wall time ÷ line bound (reply bytes ÷ baud/10)',
    target: targeted ? `ratio ≤ ${TARGET_RATIO}` : null,
    met: targeted ? ratio <= TARGET_RATIO : null,
  };
}

export async function stationBench(): Promise<BenchResult[]> {
  const board = await startBoardProcess(BAUD);
  const app = await startApp();
  let station: StationProcess | null = null;
  try {
    const token = await demoApiToken(app, 'engineer', 'station benchmark');
    // Straight to the board first (the station holds the board's one connection once online).
    const direct = () => NodeSocketLink.open(board.url);
    await sweepOnce(direct); // warm the JIT of both processes
    const directRuns = [];
    for (let i = 0; i < RUNS; i++) directRuns.push(await sweepOnce(direct));

    station = startStationProcess(app.url, token, board.url, NAME, BAUD);
    await station.online;
    const relayed = () => openDevice(`station:${NAME}`, BAUD, { server: { url: app.url, token } });
    await sweepOnce(relayed);
    const relayedRuns = [];
    for (let i = 0; i < RUNS; i++) relayedRuns.push(await sweepOnce(relayed));
    const relayedMs = median(relayedRuns.map((r) => r.ms));
    const directMs = median(directRuns.map((r) => r.ms));
    // On a busy machine both drift from the bound together: this says what the relay itself adds.
    console.log(`  relayed ÷ direct: ${(relayedMs / directMs).toFixed(3)}`);
    return [result(`station@${BAUD}`, relayedRuns, true), result(`station-direct@${BAUD}`, directRuns, false)];
  } finally {
    await station?.stop();
    await app.stop();
    await board.stop();
  }
}
