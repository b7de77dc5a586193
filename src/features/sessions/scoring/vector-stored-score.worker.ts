/// <reference lib="webworker" />
// Scores a stored vectoring session off the main thread, as stored-score.worker.ts does for
// rotation: unpack, score in chunks with shared/vectoring's accumulator, reduce to the same chart
// data the Bench page draws (vector-plot-data.ts).
import { unpackVectorSamples } from '../../../../shared/link-engine/vector-sample-pack';
import { VectorScoreAccumulator } from '../../../../shared/vectoring';
import { VectorPlotData, vectorErrorsInto } from '../../../components/charts/vector-plot-data';
import type { VectorStoredScoreReply, VectorStoredScoreRequest } from './vector-stored-score-protocol';

const CHUNK = 65_536;
const scope = self as unknown as DedicatedWorkerGlobalScope;
const post = (m: VectorStoredScoreReply) => scope.postMessage(m);

scope.onmessage = (e: MessageEvent<VectorStoredScoreRequest>) => {
  try {
    const acc = new VectorScoreAccumulator(e.data.config);
    const config = acc.config;
    const s = unpackVectorSamples(new Uint8Array(e.data.bytes));
    const n = s.xs.length;
    const plot = new VectorPlotData(config);
    const scratch = { angle: new Float64Array(CHUNK), magnitude: new Float64Array(CHUNK) };
    const angleErr = new Float32Array(CHUNK);
    const magErr = new Float32Array(CHUNK);
    for (let at = 0; at < n; at += CHUNK) {
      const end = Math.min(n, at + CHUNK);
      const cols = [s.xs, s.ys, s.angles, s.magnitudes].map((c) => c.subarray(at, end));
      acc.add(cols[0], cols[1], cols[2], cols[3], at);
      vectorErrorsInto(config, cols[0], cols[1], cols[2], cols[3], scratch, angleErr, magErr);
      plot.add(cols[0], cols[1], angleErr.subarray(0, end - at), magErr.subarray(0, end - at));
      post({ type: 'progress', done: end, total: n });
    }
    post({ type: 'done', summary: acc.summary(), charts: plot.charts() });
  } catch (err) {
    post({ type: 'error', message: (err as Error).message });
  }
};
