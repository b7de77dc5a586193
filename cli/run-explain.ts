// `run --explain`: after the run, search for the configuration or RTL defect that reproduces the
// board's answers bit for bit (shared/explain), for the printed report and the JSON summary.
import { explain, explainVectors, type AnyExplanation, type Explanation, type VectorExplanation } from '../shared/explain';
import type { ModelConfig } from '../shared/numeric';
import type { VectorConfig } from '../shared/vectoring';
import type { AnsweredRun } from './run-score';

/** The explanation of the answered results of a run (unanswered codes are left out). */
export function explainRun(model: ModelConfig, run: AnsweredRun): Explanation {
  const n = run.codes.length;
  let answered = 0;
  for (let i = 0; i < n; i++) if (run.answered[i]) answered++;
  const angle = new Float64Array(answered);
  const cos = new Int32Array(answered);
  const sin = new Int32Array(answered);
  for (let i = 0, k = 0; i < n; i++) {
    if (!run.answered[i]) continue;
    [angle[k], cos[k], sin[k]] = [run.codes[i], run.cos[i], run.sin[i]];
    k++;
  }
  return explain(model, { angle, cos, sin });
}

/** The explanation of a vectoring run's answered vectors. */
export function explainVectorRun(model: VectorConfig, run: { xs: ArrayLike<number>; ys: ArrayLike<number>; angle: ArrayLike<number>; magnitude: ArrayLike<number>; answered: Uint8Array }): VectorExplanation {
  const keep: number[] = [];
  for (let i = 0; i < run.answered.length; i++) if (run.answered[i]) keep.push(i);
  const pick = (c: ArrayLike<number>) => Int32Array.from(keep, (i) => c[i]);
  return explainVectors(model, { x: pick(run.xs), y: pick(run.ys), angle: pick(run.angle), magnitude: pick(run.magnitude) });
}

const SHOWN = 3;

/** The lines `run` prints: the search's summary, then the best few hypotheses with their counts. */
export function explanationText(e: AnyExplanation): string {
  const out = [`explanation: ${e.summary}`];
  if (e.outcome !== 'matches-model') {
    e.hypotheses.slice(0, SHOWN).forEach((h, i) => {
      const rest = h.exact === e.answered ? '' : `, largest difference left ${h.maxDiffLsb} LSB`;
      out.push(`  ${i + 1}. ${h.label}: reproduces ${h.exact.toLocaleString('en-US')} of ${e.answered.toLocaleString('en-US')} answers exactly${rest}`);
      if (h.equivalent.length) out.push(`     same answers as: ${h.equivalent.map((q) => q.label).join('; ')}`);
    });
  }
  return out.join('\n') + '\n';
}
