// scale: how ingest and compare grow with the session's size — 2^16, 2^18, 2^20 and 2^22 answers
// of one 22-bit core (evenly spaced codes, in code order; 2^22 is its exhaustive run), uploaded as
// the runner uploads (POST /api/sessions, bearer token) to the app server in a child process of
// its own (server-process.ts), then compared with a second session 1 LSB off on every 97th answer
// (GET /api/compare). Figures: the time per sample at each size, its growth from 2^16 to 2^22
// (target ≤ 1.5: no worse than linear beyond the fixed cost of a request), and the server's peak
// memory growth during a 2^22 upload ÷ the samples' bytes (target ≤ 3; Linux's VmHWM, reset
// before each upload).
import { uploadSession } from '../cli/run-server';
import { createCordicModel } from '../shared/numeric';
import { packSamples } from '../shared/link-engine/sample-pack';
import type { BenchResult } from './report';
import { SCALE_CORE_CONFIG } from './server-process-protocol';
import { startServerChild } from './server-child';
import { median, timeMs } from './timing';

const SIZES = [16, 18, 20, 22].map((k) => 2 ** k);
const RUNS = 3;
const MAX_GROWTH = 1.5;
const MAX_MEMORY_RATIO = 3;
const SAMPLE_BYTES = 12;

function sessionsOf(n: number): { a: Uint8Array; b: Uint8Array; differing: number } {
  const stride = 2 ** SCALE_CORE_CONFIG.angleBits / n;
  const codes = new Float64Array(n);
  for (let i = 0; i < n; i++) codes[i] = i * stride;
  const cos = new Int32Array(n);
  const sin = new Int32Array(n);
  createCordicModel(SCALE_CORE_CONFIG).evaluateInto(codes, cos, sin);
  const ones = new Uint8Array(n).fill(1);
  const a = packSamples(codes, cos, sin, ones);
  for (let i = 0; i < n; i += 97) cos[i] = Math.min(cos[i] + 1, 32767);
  return { a, b: packSamples(codes, cos, sin, ones), differing: Math.ceil(n / 97) };
}

export async function scaleBench(): Promise<BenchResult[]> {
  const child = await startServerChild('sqlite');
  const { ready } = child;
  const server = { url: ready.url, token: ready.token };
  const session = { coreSlug: ready.coreSlug, build: null, board: null, plan: { kind: 'exhaustive' }, startedAt: new Date().toISOString(), transport: { kind: 'websocket', device: 'bench', baud: 12_000_000 } };
  const upload = async (samples: Uint8Array) => {
    const { id } = await uploadSession(fetch, server, { session, samples, archive: new Uint8Array(0) });
    if (id === null) throw new Error('the upload returned no session id');
    return id;
  };
  const ingestNs: number[] = [];
  const compareNs: number[] = [];
  const growth: number[] = [];
  let bareGrowth = NaN;
  try {
    // One untimed upload first: the child's code starts cold, and 2^16's figure is the divisor.
    await upload(sessionsOf(SIZES[0]).a);
    for (const n of SIZES) {
      const s = sessionsOf(n);
      const times: number[] = [];
      let idA = 0;
      for (let r = 0; r < RUNS; r++) {
        const mark = n === SIZES.at(-1) ? await child.ask('mark') : null;
        times.push(await timeMs(async () => (idA = await upload(s.a))));
        if (mark) growth.push((await child.ask('peak')).peak - mark.rss);
      }
      const idB = await upload(s.b);
      const cmp: number[] = [];
      for (let r = 0; r < RUNS; r++) {
        cmp.push(await timeMs(async () => {
          const res = await fetch(`${server.url}/api/compare?ids=${idA},${idB}`, { headers: { authorization: `Bearer ${server.token}` } });
          if (res.status !== 200) throw new Error(`GET /api/compare answered ${res.status}: ${await res.text()}`);
          const differing = ((await res.json()) as { pairs: { differing: number }[] }).pairs[0].differing;
          if (differing !== s.differing) throw new Error(`compare at ${n} found ${differing} differing codes, ${s.differing} expected`);
        }));
      }
      ingestNs.push((median(times) * 1e6) / n);
      compareNs.push((median(cmp) * 1e6) / n);
      console.log(`  ${n.toLocaleString('en-US')} samples: uploads ${times.map((t) => t.toFixed(0)).join(', ')} ms; compares ${cmp.map((t) => t.toFixed(0)).join(', ')} ms`);
    }
    // Beside it, in the same process after the uploads: the bare driver writing the same bytes.
    bareGrowth = (await child.ask('bare', SIZES.at(-1)! * SAMPLE_BYTES)).growth;
  } finally {
    await child.stop();
  }
  const largest = SIZES.at(-1)!;
  const bytes = largest * SAMPLE_BYTES;
  const worstGrowth = Math.max(...growth);
  console.log(`  server peak RSS growth per ${largest.toLocaleString('en-US')}-sample upload: ${growth.map((g) => (g / 2 ** 20).toFixed(0)).join(', ')} MiB (samples ${(bytes / 2 ** 20).toFixed(0)} MiB); the bare sqlite3 INSERT of the same bytes as one blob: ${(bareGrowth / 2 ** 20).toFixed(0)} MiB (${(bareGrowth / bytes).toFixed(2)} × the bytes)`);
  const perSample = (what: 'ingest' | 'compare', ns: number[]): BenchResult[] => [
    ...SIZES.map((n, i) => ({
      name: `scale-${what}-per-sample@${n}`,
      value: ns[i],
      unit: `ns per sample (${what === 'ingest' ? 'POST /api/sessions' : 'GET /api/compare of two sessions'})`,
      ratio: ns[i] / ns[0],
      ratioOf: `÷ the same at ${SIZES[0].toLocaleString('en-US')} samples`,
      target: null,
      met: null,
    })),
    {
      name: `scale-${what}-growth`,
      value: ns.at(-1)! / ns[0],
      unit: `time per sample at ${largest.toLocaleString('en-US')} ÷ at ${SIZES[0].toLocaleString('en-US')}`,
      ratio: ns.at(-1)! / ns[0],
      ratioOf: 'the same',
      target: `≤ ${MAX_GROWTH}`,
      met: ns.at(-1)! / ns[0] <= MAX_GROWTH,
    },
  ];
  return [
    ...perSample('ingest', ingestNs),
    ...perSample('compare', compareNs),
    {
      name: 'scale-ingest-memory',
      value: worstGrowth / 2 ** 20,
      unit: `MiB of server peak RSS growth during a ${largest.toLocaleString('en-US')}-sample upload (worst of ${RUNS})`,
      ratio: worstGrowth / bytes,
      ratioOf: "peak RSS growth ÷ the samples' bytes",
      target: `ratio ≤ ${MAX_MEMORY_RATIO}`,
      met: worstGrowth / bytes <= MAX_MEMORY_RATIO,
    },
    {
      name: 'scale-ingest-memory-bare',
      value: bareGrowth / 2 ** 20,
      unit: `MiB of peak RSS growth of the bare sqlite3 driver inserting the same ${(bytes / 2 ** 20).toFixed(0)} MiB as one blob (in the server's process)`,
      ratio: bareGrowth / bytes,
      ratioOf: "peak RSS growth ÷ the samples' bytes",
      target: null,
      met: null,
    },
  ];
}
