/// <reference lib="webworker" />
// Scores a stored session off the main thread: unpack, score in chunks with the shared
// ScoreAccumulator (exact math and the bit-accurate model), and reduce to chart columns. The
// result is transferred back; the page never holds the full sample arrays.
import { unpackSamples } from '../../../../shared/link-engine/sample-pack';
import { exactSinCosInto, ScoreAccumulator } from '../../../../shared/numeric';
import { PlotBuilder } from './plot-builder';
import type { StoredScoreReply, StoredScoreRequest } from './stored-score-protocol';

const CHUNK = 65_536;
const scope = self as unknown as DedicatedWorkerGlobalScope;
const post = (m: StoredScoreReply, transfer: Transferable[] = []) => scope.postMessage(m, transfer);

scope.onmessage = (e: MessageEvent<StoredScoreRequest>) => {
  try {
    const acc = new ScoreAccumulator(e.data.config);
    const config = acc.config;
    const s = unpackSamples(new Uint8Array(e.data.bytes), config.angleFormat);
    const n = s.codes.length;
    const plots = new PlotBuilder(config, n);
    const exactCos = new Float64Array(CHUNK);
    const exactSin = new Float64Array(CHUNK);
    const errCos = new Float64Array(CHUNK);
    const errSin = new Float64Array(CHUNK);
    const lsbPerUnit = 2 ** config.outFrac;
    for (let at = 0; at < n; at += CHUNK) {
      const end = Math.min(n, at + CHUNK);
      const codes = s.codes.subarray(at, end);
      const cos = s.cos.subarray(at, end);
      const sin = s.sin.subarray(at, end);
      acc.add(codes, cos, sin, at);
      exactSinCosInto(config, codes, exactCos, exactSin);
      for (let k = 0; k < codes.length; k++) {
        errCos[k] = cos[k] - exactCos[k] * lsbPerUnit;
        errSin[k] = sin[k] - exactSin[k] * lsbPerUnit;
      }
      plots.add(codes, cos, sin, errCos.subarray(0, codes.length), errSin.subarray(0, codes.length));
      post({ type: 'progress', done: end, total: n });
    }
    const charts = plots.build();
    const transfer = Object.values(charts).flatMap((cols) => (cols as Float64Array[]).map((c) => c.buffer));
    post({ type: 'done', summary: acc.summary(), charts }, [...new Set(transfer)]);
  } catch (err) {
    post({ type: 'error', message: (err as Error).message });
  }
};
