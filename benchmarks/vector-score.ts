// vector-score: the vectoring core's hot paths over 1,048,576 random pairs of the default core —
// the bit-accurate model alone (answerInto, the simulated board's and the scorer's inner loop), and
// the whole scorer (model, exact atan2 and hypot, statistics, coverage). Beside them, in the same
// process and interleaved, the rotation model over as many codes: the vectoring model does the
// same iteration, so the ratio says whether it costs what it should.
import { createCordicModel } from '../shared/numeric';
import { createVectorModel, planVectors, VectorScoreAccumulator } from '../shared/vectoring';
import type { BenchResult } from './report';
import { cpuMs } from './timing';

const PAIRS = 1 << 20;
/** Best of this many: on a shared machine the fastest pass is the one least disturbed. */
const PASSES = 7;
/** Pairs per scorer batch, about what a worker hands over at once. */
const BATCH = 1 << 14;

export function vectorScoreBench(): Promise<BenchResult[]> {
  const model = createVectorModel({});
  const { xs, ys } = planVectors({ kind: 'random', seed: 20, count: PAIRS }, model.config);
  const angles = new Int32Array(PAIRS);
  const mags = new Int32Array(PAIRS);
  const rotation = createCordicModel({});
  const codes = Float64Array.from({ length: PAIRS }, (_, i) => i & 0xffff);
  const cos = new Int32Array(PAIRS);
  const sin = new Int32Array(PAIRS);
  const score = () => {
    const s = new VectorScoreAccumulator(model.config);
    for (let at = 0; at < PAIRS; at += BATCH) s.add(xs.subarray(at, at + BATCH), ys.subarray(at, at + BATCH), angles.subarray(at, at + BATCH), mags.subarray(at, at + BATCH), at);
    return s.summary();
  };
  model.answerInto(xs, ys, angles, mags);
  // The figures are only worth something if the scorer did the whole job.
  const check = score();
  if (check.count !== PAIRS || check.mismatches.count !== 0) throw new Error(`scored ${check.count} answers with ${check.mismatches.count} mismatches`);
  const t = { model: [] as number[], score: [] as number[], rotation: [] as number[] };
  for (let pass = 0; pass < PASSES; pass++) {
    t.model.push(cpuMs(() => model.answerInto(xs, ys, angles, mags)));
    t.rotation.push(cpuMs(() => rotation.evaluateInto(codes, cos, sin)));
    t.score.push(cpuMs(score));
  }
  const best = (v: number[]) => Math.min(...v);
  const rate = (ms: number) => (PAIRS * 1000) / ms;
  console.log(`  CPU time, best of ${PASSES} over ${PAIRS.toLocaleString('en-US')}: vectoring model ${best(t.model).toFixed(1)} ms, rotation model ${best(t.rotation).toFixed(1)} ms, scorer ${best(t.score).toFixed(1)} ms`);
  return Promise.resolve([
    {
      name: 'vector-model',
      value: rate(best(t.model)),
      unit: 'pairs per CPU-second',
      ratio: best(t.model) / best(t.rotation),
      ratioOf: 'vectoring model CPU time ÷ rotation model CPU time, as many inputs',
      target: null,
      met: null,
    },
    {
      name: 'vector-score',
      value: rate(best(t.score)),
      unit: 'pairs per CPU-second',
      ratio: best(t.score) / best(t.model),
      ratioOf: 'scorer CPU time ÷ the model alone',
      target: null,
      met: null,
    },
  ]);
}
