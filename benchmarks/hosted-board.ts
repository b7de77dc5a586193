// hosted-board: exhaustive 16-bit sweeps at 3,000,000 baud against the app server's own hosted
// simulated board (/api/sim-board), the server in a process of its own as `npm start` runs it,
// driven as the link benchmark drives `npm run mock`'s board. The bound is the same: the reply
// bytes the run put on the wire ÷ (baud / 10). The hosting (upgrade, authentication, the app's
// event loop) must not be the bottleneck.
import { signInCookie } from '../tests/support/listening-app';
import { startApp } from '../tests/e2e/harness';
import { sweepOnce } from './link';
import type { BenchResult } from './report';
import { median } from './timing';

const BAUD = 3_000_000;
const TARGET_RATIO = 1.1;
const RUNS = 3;

/** An API token of the seeded demo engineer, made through the API as a person would. */
async function engineerToken(url: string): Promise<string> {
  const cookie = await signInCookie(url, 'engineer@anglebench.test', 'anglebench');
  const { token: csrf } = (await (await fetch(`${url}/api/auth/csrf`, { headers: { cookie } })).json()) as { token: string };
  const res = await fetch(`${url}/api/tokens`, { method: 'POST', headers: { cookie, 'x-csrf-token': csrf, 'content-type': 'application/json' }, body: JSON.stringify({ name: 'hosted-board benchmark' }) });
  if (!res.ok) throw new Error(`could not make an API token: ${res.status} ${await res.text()}`);
  return ((await res.json()) as { token: string }).token;
}

export async function hostedBoardBench(): Promise<BenchResult[]> {
  const app = await startApp({ DEMO_PASSWORD: 'anglebench' });
  try {
    const token = await engineerToken(app.url);
    const url = `${app.url.replace(/^http/, 'ws')}/api/sim-board?baud=${BAUD}`;
    const connect = { headers: { authorization: `Bearer ${token}` } };
    await sweepOnce(url, BAUD, connect); // warm both processes' JIT
    const runs = [];
    for (let i = 0; i < RUNS; i++) runs.push(await sweepOnce(url, BAUD, connect));
    const ms = median(runs.map((r) => r.ms));
    const rxBytes = median(runs.map((r) => r.rxBytes));
    const boundMs = (rxBytes * 1000) / (BAUD / 10);
    const ratio = ms / boundMs;
    console.log(`  hosted board at ${BAUD.toLocaleString('en-US')} baud: runs ${runs.map((r) => r.ms.toFixed(0)).join(', ')} ms; ${rxBytes.toLocaleString('en-US')} B received; bound ${boundMs.toFixed(0)} ms; silences > 2 ms between chunks ${runs.map((r) => r.stallMs.toFixed(0)).join(', ')} ms`);
    return [
      {
        name: `hosted-board@${BAUD}`,
        value: ms / 1000,
        unit: 's per 65,536-code sweep',
        ratio,
        ratioOf: 'wall time ÷ line bound (reply bytes ÷ baud/10)',
        target: `ratio ≤ ${TARGET_RATIO}`,
        met: ratio <= TARGET_RATIO,
      },
    ];
  } finally {
    await app.stop();
  }
}
