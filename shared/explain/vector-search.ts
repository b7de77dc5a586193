// The explain search for vectoring cores (docs/explain.md "Vectoring cores"): which configuration
// deviation or defect reproduces the board's angle and magnitude answers bit-exactly. The staged
// screening and the ranking are the engine's (stages.ts), as for rotating cores.
import { angleOutputRange, inputRange, parseVectorConfig, type VectorConfig } from '../vectoring';
import { Remoteness } from './catalogue';
import { pickScreenBy } from './screen';
import { ExplainInputError, pickAnswers, runSearch, type ExplainOptions, type ExplanationOf, type HypothesisOf, type HypothesisRef, type Level, type Tried } from './stages';
import { vectorDefectCandidates, vectorDeviationCandidates, type VectorCandidate } from './vector-catalogue';
import type { VectorFault } from './vector-fault';
import { createVectorFaultyModel } from './vector-faulty-model';
import { vectorFaultLabel } from './vector-labels';

/** The board's answers: input (x[k], y[k]) was answered with angle[k], magnitude[k]. */
export interface VectorExplainSamples {
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  angle: ArrayLike<number>;
  magnitude: ArrayLike<number>;
}

export type VectorHypothesisRef = HypothesisRef<VectorConfig, VectorFault>;
export type VectorHypothesis = HypothesisOf<VectorConfig, VectorFault>;

/** A vectoring core's explanation: the rotation's shape, its configurations VectorConfigs. */
export interface VectorExplanation extends ExplanationOf<VectorConfig, VectorFault> {
  mode: 'vectoring';
}

/** Inputs and the board's angle (a) and magnitude (b) at one screening level. */
interface VectorLevel extends Level {
  xs: Int32Array;
  ys: Int32Array;
}

function vectorLevel(xs: Int32Array, ys: Int32Array, angle: Int32Array, magnitude: Int32Array, pick: Int32Array | null): VectorLevel {
  const l = pickAnswers(angle, magnitude, pick) as VectorLevel;
  l.xs = pick ? Int32Array.from(pick, (i) => xs[i]) : xs;
  l.ys = pick ? Int32Array.from(pick, (i) => ys[i]) : ys;
  return l;
}

// Directions where the pre-rotation and the first iterations decide differently: the axes and the diagonals.
const DIRECTION_BOUNDARIES = Array.from({ length: 9 }, (_, k) => ((k - 4) * Math.PI) / 4);
/** The largest inputs screened besides the spread (saturation and high magnitude bits show there). */
const LARGEST = 8;

/**
 * Explains a vectoring board's answers against its declared configuration: ranks the declared
 * model, every configuration deviation and every defect by how many answers each reproduces
 * exactly (angle and magnitude both).
 * @throws ExplainInputError for samples it cannot take; ExplainStopped when asked to stop
 */
export function explainVectors(declaredInput: VectorConfig, samples: VectorExplainSamples, options: ExplainOptions = {}): VectorExplanation {
  const declared = parseVectorConfig(declaredInput);
  const n = samples.x.length;
  if (n === 0) throw new ExplainInputError('no answered samples to explain');
  if (samples.y.length !== n || samples.angle.length !== n || samples.magnitude.length !== n) {
    throw new ExplainInputError(`the columns differ in length: ${n} x, ${samples.y.length} y, ${samples.angle.length} angles, ${samples.magnitude.length} magnitudes`);
  }
  const { min, max } = inputRange(declared);
  const ang = angleOutputRange(declared);
  const xs = new Int32Array(n);
  const ys = new Int32Array(n);
  const angle = new Int32Array(n);
  const magnitude = new Int32Array(n);
  const direction = new Float64Array(n);
  const size = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const x = samples.x[k];
    const y = samples.y[k];
    if (!(Number.isInteger(x) && Number.isInteger(y) && x >= min && x <= max && y >= min && y <= max)) throw new ExplainInputError(`sample ${k}: input (${x}, ${y}) is not a pair of integers ${min}..${max} for this core`);
    const a = samples.angle[k];
    if (!(Number.isInteger(a) && a >= ang.min && a <= ang.max)) throw new ExplainInputError(`sample ${k}: angle code ${a} is not an integer ${ang.min}..${ang.max} for this core`);
    if (!Number.isInteger(samples.magnitude[k])) throw new ExplainInputError(`sample ${k}: the magnitude must be an integer code`);
    xs[k] = x;
    ys[k] = y;
    angle[k] = a;
    magnitude[k] = samples.magnitude[k];
    direction[k] = Math.atan2(y, x);
    size[k] = x * x + y * y;
  }

  // The zero vector (its own answer) and the largest inputs join the spread over the directions.
  const extra: number[] = [];
  const zero = xs.findIndex((x, k) => x === 0 && ys[k] === 0);
  if (zero >= 0) extra.push(zero);
  extra.push(...Int32Array.from({ length: n }, (_, i) => i).sort((a, b) => size[b] - size[a]).slice(0, LARGEST));
  const { small, large } = pickScreenBy(direction, DIRECTION_BOUNDARIES, extra);
  const full = vectorLevel(xs, ys, angle, magnitude, null);

  const deviations = vectorDeviationCandidates(declared);
  const defects = vectorDefectCandidates(declared, Remoteness.Defect);
  const stages = [
    () => [{ config: declared, fault: null, remoteness: Remoteness.Declared }],
    () => deviations,
    () => defects,
    (tried: readonly Tried<VectorConfig, VectorFault>[]) => {
      // Defects on the best configuration deviation, when one beats the declared model.
      const base = tried.find((t) => t.remoteness === Remoteness.Declared)!;
      const best = tried.filter((t) => t.remoteness === Remoteness.Deviation && t.fault === null).sort((a, b) => b.exact - a.exact || a.order - b.order)[0];
      return best && best.exact > base.exact ? vectorDefectCandidates(best.config, Remoteness.DefectOnDeviation) : [];
    },
  ] as ((tried: readonly Tried<VectorConfig, VectorFault>[]) => VectorCandidate[])[];

  const explanation = runSearch(
    {
      declared,
      full,
      small: vectorLevel(xs, ys, angle, magnitude, small),
      large: vectorLevel(xs, ys, angle, magnitude, large),
      runnerOf: (c) => {
        const m = createVectorFaultyModel(c.config, c.fault);
        return (l) => m.answerInto(l.xs, l.ys, l.outA, l.outB);
      },
      label: (config, fault) => vectorFaultLabel(config, declared, fault),
      stages,
      total: 1 + deviations.length + 2 * defects.length,
      // A binary angle's difference goes the short way round; radians saturate at ±π.
      periodA: declared.angleFormat === 'turn' ? 2 ** declared.angleBits : 0,
      restOrder: direction,
      inputWord: 'input',
    },
    options,
  );
  return { mode: 'vectoring', ...explanation };
}

/** A stored explanation of either kind of core; `mode` tells them apart (absent: rotation). */
export type AnyExplanation = import('./search').Explanation | VectorExplanation;
