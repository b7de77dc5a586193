// Scoring of a vectoring core's answers against the exact reference and the bit-accurate model.
// Answers may arrive in any order and in pieces; accumulators merge. The statistics and histograms
// are the rotation scorer's (shared/numeric/error-stats.ts); the worst case is located by a key
// that packs the input pair into one integer, so ErrorMoments' "lowest key wins a tie" still holds.
import { DEFAULT_HISTOGRAM, ErrorHistogram, ErrorMoments, type HistogramOptions } from '../numeric/error-stats';
import { ScoringError } from '../numeric/errors';
import { inputRange, type VectorConfig, type VectorConfigInput } from './vector-config';
import { DEFAULT_VECTOR_COVERAGE, VectorCoverage, type VectorCoverageOptions, type VectorCoverageSummary } from './vector-coverage';
import { exactVectorInto } from './vector-exact';
import { angleOutputRange, createVectorModel, magnitudeRange, type VectorModel } from './vector-model';
import { VectorInputError } from './errors';

/** Error statistics of one quantity; `worst` is the input pair of the largest |error|. */
export interface VectorErrorSummary {
  count: number;
  mean: number;
  rms: number;
  maxAbs: number;
  worst: { x: number; y: number } | null;
}

/** One answer that differs from the model. */
export interface VectorMismatch {
  index: number;
  x: number;
  y: number;
  angle: number;
  magnitude: number;
  modelAngle: number;
  modelMagnitude: number;
}

/** Everything scoring says about a set of answers; plain data, safe to save as JSON. */
export interface VectorScoreSummary {
  count: number;
  /** Answer angle − exact angle in angle LSB, wrapped to [−½, ½) turn; the zero vector is left out (its angle is undefined). */
  angleLsb: VectorErrorSummary;
  /** Answer magnitude − exact magnitude in magnitude LSB. */
  magnitudeLsb: VectorErrorSummary;
  /** The magnitude error in parts per million of the exact magnitude; the zero vector is left out. */
  magnitudePpm: VectorErrorSummary;
  histogram: { limitLsb: number; binsPerLsb: number; edgesLsb: number[]; angle: number[]; magnitude: number[]; below: number; above: number };
  /** Answers that differ from the model; maxAbsDiffLsb is the largest difference of either output (angles wrapped). */
  mismatches: { count: number; maxAbsDiffLsb: number; first: VectorMismatch[] };
  coverage: VectorCoverageSummary;
}

/** Options of a vectoring score accumulator. */
export interface VectorScoreOptions {
  histogram?: HistogramOptions;
  /** How many mismatches to keep, lowest request index first (default 10). */
  keepMismatches?: number;
  coverage?: VectorCoverageOptions;
}

/** Wraps an angle difference into [−period/2, period/2). */
export function wrapAngleError(e: number, period: number): number {
  return e - period * Math.floor(e / period + 0.5);
}

/** Streaming, mergeable scorer for one vectoring configuration. */
export class VectorScoreAccumulator {
  readonly model: VectorModel;
  readonly config: Readonly<VectorConfig>;
  private readonly angleErr = new ErrorMoments();
  private readonly magErr = new ErrorMoments();
  private readonly ppmErr = new ErrorMoments();
  private readonly angleHist: ErrorHistogram;
  private readonly magHist: ErrorHistogram;
  private readonly coverage: VectorCoverage;
  private readonly keep: number;
  /** One turn in angle LSB: 2^angleBits, or 2π · 2^angleFrac for radians. */
  private readonly period: number;
  private readonly inMin: number;
  private readonly inSpan: number;
  private mismatchCount = 0;
  private maxDiff = 0;
  private first: VectorMismatch[] = [];
  private nextIndex = 0;
  // Scratch, grown on demand, so a batch allocates nothing per answer.
  private exactAngle = new Float64Array(0);
  private exactMag = new Float64Array(0);
  private modelAngle = new Int32Array(0);
  private modelMag = new Int32Array(0);
  private errAngle = new Float64Array(0);
  private errMag = new Float64Array(0);
  private errPpm = new Float64Array(0);
  private keyAll = new Float64Array(0);
  private keyAngle = new Float64Array(0);
  private keyPpm = new Float64Array(0);

  constructor(config: VectorConfigInput | VectorConfig = {}, options: VectorScoreOptions = {}) {
    this.model = createVectorModel(config);
    this.config = this.model.config;
    this.angleHist = new ErrorHistogram(options.histogram ?? DEFAULT_HISTOGRAM);
    this.magHist = new ErrorHistogram(options.histogram ?? DEFAULT_HISTOGRAM);
    this.coverage = new VectorCoverage(this.config, options.coverage ?? DEFAULT_VECTOR_COVERAGE);
    this.keep = options.keepMismatches ?? 10;
    this.period = this.config.angleFormat === 'turn' ? 2 ** this.config.angleBits : 2 * Math.PI * 2 ** this.config.angleFrac;
    const r = inputRange(this.config);
    this.inMin = r.min;
    this.inSpan = r.max - r.min + 1;
  }

  /**
   * Scores a batch of answers to the pairs (xs[k], ys[k]). `firstIndex` is the request index of
   * the first; by default batches are numbered in arrival order.
   * @throws VectorInputError for inputs or answers the formats cannot hold; ScoringError for unequal lengths.
   */
  add(xs: ArrayLike<number>, ys: ArrayLike<number>, angles: ArrayLike<number>, magnitudes: ArrayLike<number>, firstIndex = this.nextIndex): this {
    const n = xs.length;
    if (ys.length !== n || angles.length !== n || magnitudes.length !== n) {
      throw new ScoringError(`x, y, angles and magnitudes differ in length (${n}, ${ys.length}, ${angles.length}, ${magnitudes.length})`);
    }
    if (this.exactAngle.length < n) this.grow(n);
    const { exactAngle, exactMag, modelAngle, modelMag, errAngle, errMag, errPpm, keyAll, keyAngle, keyPpm, period, inMin, inSpan } = this;
    this.model.answerInto(xs, ys, modelAngle, modelMag); // validates the inputs
    exactVectorInto(this.config, xs, ys, exactAngle, exactMag);
    const ar = angleOutputRange(this.config);
    const mr = magnitudeRange(this.config);
    // Every answer is checked before any is counted, so a refused batch leaves the score as it was.
    for (let k = 0; k < n; k++) {
      const a = angles[k];
      const m = magnitudes[k];
      if (!(Number.isInteger(a) && a >= ar.min && a <= ar.max)) throw new VectorInputError(`answers[${k}]: angle ${a} is not an integer ${ar.min}..${ar.max}`);
      if (!(Number.isInteger(m) && m >= mr.min && m <= mr.max)) throw new VectorInputError(`answers[${k}]: magnitude ${m} is not an integer ${mr.min}..${mr.max}`);
    }
    let nAngle = 0;
    let nPpm = 0;
    for (let k = 0; k < n; k++) {
      const a = angles[k];
      const m = magnitudes[k];
      const key = (xs[k] - inMin) * inSpan + (ys[k] - inMin);
      keyAll[k] = key;
      errMag[k] = m - exactMag[k];
      // The zero vector has no angle and no relative error; the arrays are packed without it.
      if (xs[k] !== 0 || ys[k] !== 0) {
        errAngle[nAngle] = wrapAngleError(a - exactAngle[k], period);
        keyAngle[nAngle++] = key;
        errPpm[nPpm] = (errMag[k] / exactMag[k]) * 1e6;
        keyPpm[nPpm++] = key;
      }
      if (a !== modelAngle[k] || m !== modelMag[k]) this.mismatch(firstIndex + k, xs[k], ys[k], a, m, modelAngle[k], modelMag[k]);
    }
    this.angleErr.addAll(errAngle, keyAngle, nAngle);
    this.magErr.addAll(errMag, keyAll, n);
    this.ppmErr.addAll(errPpm, keyPpm, nPpm);
    this.angleHist.addAll(errAngle, nAngle);
    this.magHist.addAll(errMag, n);
    this.coverage.addAll(xs, ys, n);
    this.nextIndex = Math.max(this.nextIndex, firstIndex + n);
    return this;
  }

  private grow(n: number): void {
    this.exactAngle = new Float64Array(n);
    this.exactMag = new Float64Array(n);
    this.modelAngle = new Int32Array(n);
    this.modelMag = new Int32Array(n);
    this.errAngle = new Float64Array(n);
    this.errMag = new Float64Array(n);
    this.errPpm = new Float64Array(n);
    this.keyAll = new Float64Array(n);
    this.keyAngle = new Float64Array(n);
    this.keyPpm = new Float64Array(n);
  }

  private mismatch(index: number, x: number, y: number, angle: number, magnitude: number, modelAngle: number, modelMagnitude: number): void {
    this.mismatchCount++;
    // Wrapped for radians too: −π and +π are the same direction.
    const da = Math.abs(wrapAngleError(angle - modelAngle, this.period));
    this.maxDiff = Math.max(this.maxDiff, da, Math.abs(magnitude - modelMagnitude));
    this.keepMismatch({ index, x, y, angle, magnitude, modelAngle, modelMagnitude });
  }

  private keepMismatch(m: VectorMismatch): void {
    if (this.first.length >= this.keep && m.index >= this.first[this.first.length - 1].index) return;
    let at = this.first.length;
    while (at > 0 && this.first[at - 1].index > m.index) at--;
    this.first.splice(at, 0, m);
    if (this.first.length > this.keep) this.first.pop();
  }

  /** Folds another accumulator of the same configuration and options into this one. */
  merge(o: VectorScoreAccumulator): this {
    if (JSON.stringify(o.config) !== JSON.stringify(this.config)) throw new ScoringError('cannot merge scores of different vectoring configurations');
    this.angleErr.merge(o.angleErr);
    this.magErr.merge(o.magErr);
    this.ppmErr.merge(o.ppmErr);
    this.angleHist.merge(o.angleHist);
    this.magHist.merge(o.magHist);
    this.coverage.merge(o.coverage);
    this.mismatchCount += o.mismatchCount;
    this.maxDiff = Math.max(this.maxDiff, o.maxDiff);
    for (const m of o.first) this.keepMismatch(m);
    this.nextIndex = Math.max(this.nextIndex, o.nextIndex);
    return this;
  }

  /** The statistics so far, as plain data. */
  summary(): VectorScoreSummary {
    const pair = (key: number | null) => (key === null ? null : { x: this.inMin + Math.floor(key / this.inSpan), y: this.inMin + (key % this.inSpan) });
    const stats = (m: ErrorMoments): VectorErrorSummary => ({ count: m.count, mean: m.mean, rms: m.rms, maxAbs: m.maxAbs, worst: pair(m.maxAbsCode) });
    const h = this.angleHist.options;
    return {
      count: this.magErr.count,
      angleLsb: stats(this.angleErr),
      magnitudeLsb: stats(this.magErr),
      magnitudePpm: stats(this.ppmErr),
      histogram: {
        limitLsb: h.limitLsb,
        binsPerLsb: h.binsPerLsb,
        edgesLsb: this.angleHist.edgesLsb(),
        angle: Array.from(this.angleHist.counts),
        magnitude: Array.from(this.magHist.counts),
        below: this.angleHist.below + this.magHist.below,
        above: this.angleHist.above + this.magHist.above,
      },
      mismatches: { count: this.mismatchCount, maxAbsDiffLsb: this.maxDiff, first: this.first.map((m) => ({ ...m })) },
      coverage: this.coverage.summary(),
    };
  }
}
