// The explain search for rotating cores (docs/explain.md): which configuration deviation or
// catalogue defect reproduces the board's answers bit-exactly. The staged screening and the
// ranking are the engine's (stages.ts); here are the rotation core's levels, hypotheses and words.
import { angleCodeRange, parseModelConfig, type ModelConfig } from '../numeric';
import { deviationCandidates, defectCandidates, estimateAngleOffset, Remoteness, type Candidate } from './catalogue';
import type { Fault } from './fault';
import { createFaultyModel } from './faulty-model';
import { faultLabel } from './labels';
import { pickScreen } from './screen';
import { ExplainInputError, pickAnswers, runSearch, type ExplainOptions, type ExplanationOf, type HypothesisOf, type HypothesisRef as RefOf, type Level, type Tried } from './stages';

export { ExplainInputError, ExplainStopped, MAX_HYPOTHESES, PARTLY_SHARE, type ExplainOptions } from './stages';

/** The board's answers: angle code k was answered with cos[k], sin[k]. */
export interface ExplainSamples {
  angle: ArrayLike<number>;
  cos: ArrayLike<number>;
  sin: ArrayLike<number>;
}

export type HypothesisRef = RefOf<ModelConfig, Fault>;
export type Hypothesis = HypothesisOf<ModelConfig, Fault>;

/**
 * A rotating core's explanation. It carries no `mode` (explanations stored before vectoring cores
 * had one read as they are); a vectoring core's says `mode: 'vectoring'` (vector-search.ts).
 */
export interface Explanation extends ExplanationOf<ModelConfig, Fault> {
  mode?: undefined;
}

/** Angle codes and the board's cos (a) and sin (b) at one screening level. */
interface AngleLevel extends Level {
  codes: Float64Array;
}

function angleLevel(codes: Float64Array, cos: Int32Array, sin: Int32Array, pick: Int32Array | null): AngleLevel {
  const l = pickAnswers(cos, sin, pick) as AngleLevel;
  l.codes = pick ? Float64Array.from(pick, (i) => codes[i]) : codes.slice();
  return l;
}

/**
 * Explains a board's answers against its declared configuration: ranks the declared model, every
 * configuration deviation and every catalogue defect by how many answers each reproduces exactly.
 * @throws ExplainInputError for samples it cannot take; ExplainStopped when asked to stop
 */
export function explain(declaredInput: ModelConfig, samples: ExplainSamples, options: ExplainOptions = {}): Explanation {
  const declared = parseModelConfig(declaredInput);
  const n = samples.angle.length;
  if (n === 0) throw new ExplainInputError('no answered samples to explain');
  if (samples.cos.length !== n || samples.sin.length !== n) throw new ExplainInputError(`the columns differ in length: ${n} angles, ${samples.cos.length} cos, ${samples.sin.length} sin`);
  const { min, max } = angleCodeRange(declared);
  const codes = new Float64Array(n);
  const cos = new Int32Array(n);
  const sin = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    const a = samples.angle[k];
    if (!(Number.isInteger(a) && a >= min && a <= max)) throw new ExplainInputError(`sample ${k}: angle code ${a} is not an integer ${min}..${max} for this core`);
    if (!Number.isInteger(samples.cos[k]) || !Number.isInteger(samples.sin[k])) throw new ExplainInputError(`sample ${k}: cos and sin must be integer codes`);
    codes[k] = a;
    cos[k] = samples.cos[k];
    sin[k] = samples.sin[k];
  }

  const full = angleLevel(codes, cos, sin, null);
  const { small, large } = pickScreen(declared, codes);
  const l1 = angleLevel(codes, cos, sin, small);
  const l2 = angleLevel(codes, cos, sin, large);
  const offset = estimateAngleOffset(declared, l2.codes, l2.a, l2.b);

  const stages = [
    () => [{ config: declared, fault: null, remoteness: Remoteness.Declared }],
    () => deviationCandidates(declared),
    () => defectCandidates(declared, Remoteness.Defect, offset),
    (tried: readonly Tried<ModelConfig, Fault>[]) => {
      // Defects on the best configuration deviation, when one beats the declared model.
      const base = tried.find((t) => t.remoteness === Remoteness.Declared)!;
      const best = tried.filter((t) => t.remoteness === Remoteness.Deviation && t.fault === null).sort((a, b) => b.exact - a.exact || a.order - b.order)[0];
      return best && best.exact > base.exact ? defectCandidates(best.config, Remoteness.DefectOnDeviation, offset) : [];
    },
  ] as ((tried: readonly Tried<ModelConfig, Fault>[]) => Candidate[])[];
  const defectsPerCore = defectCandidates(declared, Remoteness.Defect, offset).length;
  return runSearch(
    {
      declared,
      full,
      small: l1,
      large: l2,
      runnerOf: (c) => {
        const m = createFaultyModel(c.config, c.fault);
        return (l) => m.evaluateInto(l.codes, l.outA, l.outB);
      },
      label: (config, fault) => faultLabel(config, declared, fault),
      stages,
      total: 1 + deviationCandidates(declared).length + 2 * defectsPerCore,
      periodA: 0,
      restOrder: full.codes,
      inputWord: 'code',
    },
    options,
  );
}
