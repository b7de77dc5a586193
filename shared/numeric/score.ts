// Scoring of a core's answers against exact math and against the reference model. Results may
// arrive in any order and in pieces (RESULTS frames, worker batches); accumulators merge.
import { createCordicModel, type CordicModel } from './cordic-model';
import { CodeCoverage, type CoverageSummary } from './coverage';
import { ErrorHistogram, ErrorMoments, DEFAULT_HISTOGRAM, type HistogramOptions } from './error-stats';
import { ScoringError } from './errors';
import { exactSinCosInto } from './exact-reference';
import { phaseErrorsInto } from './phase-error';
import { angleCodeRange, angleCodeToDegrees, assertOutputCode, outputCodeRange } from './formats';
import type { ModelConfig, ModelConfigInput } from './model-config';

/** Error statistics of one channel (or both together), in LSB and in output units. */
export interface ChannelSummary {
  count: number;
  maxAbsLsb: number;
  /** Angle code (and its angle in degrees) where the largest |error| occurred; null when empty. */
  maxAbsCode: number | null;
  maxAbsDegrees: number | null;
  meanLsb: number;
  rmsLsb: number;
  maxAbs: number;
  mean: number;
  rms: number;
}

/** One answer that differs from the model. */
export interface Mismatch {
  index: number;
  code: number;
  cos: number;
  sin: number;
  modelCos: number;
  modelSin: number;
}

/** Everything scoring says about a set of answers; plain data, safe to save as JSON. */
export interface ScoreSummary {
  count: number;
  cos: ChannelSummary;
  sin: ChannelSummary;
  overall: ChannelSummary;
  /** sqrt(cos² + sin²) − 1 in output units. */
  magnitude: { maxAbs: number; maxAbsCode: number | null; mean: number; rms: number };
  /** atan2(sin, cos) − exact angle, wrapped to [−π, π), in radians. */
  phase: { maxAbsRad: number; maxAbsCode: number | null; meanRad: number; rmsRad: number };
  histogram: { limitLsb: number; binsPerLsb: number; edgesLsb: number[]; cos: number[]; sin: number[]; below: number; above: number };
  mismatches: { count: number; maxAbsDiffLsb: number; first: Mismatch[] };
  coverage: CoverageSummary;
}

/** Options of a score accumulator. */
export interface ScoreOptions {
  histogram?: HistogramOptions;
  /** How many mismatches to keep, lowest request index first (default 10). */
  keepMismatches?: number;
  /** Also keep the largest |error| per this many equal bins of the code range (see profile()). */
  profileBins?: number;
  /** Also keep the lowest and highest signed error (cos and sin together) per this many bins (see envelope()). */
  envelopeBins?: number;
}

/** Marks a profile bin no answer fell in. */
export const PROFILE_EMPTY = -1;

/** Streaming, mergeable scorer for one core configuration. */
export class ScoreAccumulator {
  readonly model: CordicModel;
  readonly config: Readonly<ModelConfig>;
  private readonly cosErr = new ErrorMoments();
  private readonly sinErr = new ErrorMoments();
  private readonly magErr = new ErrorMoments();
  private readonly phaseErr = new ErrorMoments();
  private readonly cosHist: ErrorHistogram;
  private readonly sinHist: ErrorHistogram;
  private readonly coverage: CodeCoverage;
  private readonly keep: number;
  private readonly profileMax: Float64Array | null;
  private readonly profileMin: number;
  private readonly profileScale: number;
  private readonly envelopeLo: Float64Array | null;
  private readonly envelopeHi: Float64Array | null;
  private readonly codeCount: number;
  private readonly outMin: number;
  private readonly outMax: number;
  private mismatchCount = 0;
  private maxDiff = 0;
  private first: Mismatch[] = [];
  private nextIndex = 0;
  // Scratch buffers, grown on demand, so scoring a batch allocates nothing per sample.
  private exactCos = new Float64Array(0);
  private exactSin = new Float64Array(0);
  private modelCos = new Int32Array(0);
  private modelSin = new Int32Array(0);
  private errCos = new Float64Array(0);
  private errSin = new Float64Array(0);
  private errMag = new Float64Array(0);
  private errPhase = new Float64Array(0);

  constructor(config: ModelConfigInput | ModelConfig = {}, options: ScoreOptions = {}) {
    this.model = createCordicModel(config);
    this.config = this.model.config;
    this.cosHist = new ErrorHistogram(options.histogram ?? DEFAULT_HISTOGRAM);
    this.sinHist = new ErrorHistogram(options.histogram ?? DEFAULT_HISTOGRAM);
    this.coverage = new CodeCoverage(this.config);
    this.keep = options.keepMismatches ?? 10;
    const bins = options.profileBins ?? 0;
    const range = angleCodeRange(this.config);
    this.profileMax = bins > 0 ? new Float64Array(bins).fill(PROFILE_EMPTY) : null;
    this.profileMin = range.min;
    this.profileScale = bins / (range.max - range.min + 1);
    const envelopeBins = options.envelopeBins ?? 0;
    this.envelopeLo = envelopeBins > 0 ? new Float64Array(envelopeBins).fill(Infinity) : null;
    this.envelopeHi = envelopeBins > 0 ? new Float64Array(envelopeBins).fill(-Infinity) : null;
    this.codeCount = range.count;
    ({ min: this.outMin, max: this.outMax } = outputCodeRange(this.config));
  }

  /**
   * Scores a batch of answers. `firstIndex` is the request index of codes[0] (RESULTS frames carry
   * it); by default batches are numbered in arrival order.
   * @throws AngleCodeError / OutputCodeError for values the formats cannot hold.
   */
  add(codes: ArrayLike<number>, cos: ArrayLike<number>, sin: ArrayLike<number>, firstIndex = this.nextIndex): this {
    const n = codes.length;
    if (cos.length !== n || sin.length !== n) throw new ScoringError(`codes, cos and sin differ in length (${n}, ${cos.length}, ${sin.length})`);
    if (this.exactCos.length < n) this.grow(n);
    const c = this.config;
    const { exactCos, exactSin, modelCos, modelSin, errCos, errSin, errMag, errPhase } = this;
    this.model.evaluateInto(codes, modelCos, modelSin); // validates the codes
    exactSinCosInto(c, codes, exactCos, exactSin);
    const scale = 2 ** c.outFrac;
    // Range checked inline; assertOutputCode only runs to build the error message.
    const { outMin, outMax } = this;
    // Per-answer errors first, then each statistic in its own short loop: V8 optimises small
    // loops fully, where one loop doing everything outgrows its inlining budget.
    for (let k = 0; k < n; k++) {
      const oc = cos[k];
      const os = sin[k];
      if (!(Number.isInteger(oc) && oc >= outMin && oc <= outMax)) assertOutputCode(c, oc);
      if (!(Number.isInteger(os) && os >= outMin && os <= outMax)) assertOutputCode(c, os);
      errCos[k] = oc - exactCos[k] * scale;
      errSin[k] = os - exactSin[k] * scale;
      const vc = oc / scale;
      const vs = os / scale;
      errMag[k] = Math.sqrt(vc * vc + vs * vs) - 1;
      if (oc !== modelCos[k] || os !== modelSin[k]) this.mismatch(firstIndex + k, codes[k], oc, os, modelCos[k], modelSin[k]);
    }
    phaseErrorsInto(c, codes, cos, sin, exactCos, exactSin, errPhase, n);
    this.cosErr.addAll(errCos, codes, n);
    this.sinErr.addAll(errSin, codes, n);
    this.magErr.addAll(errMag, codes, n);
    this.phaseErr.addAll(errPhase, codes, n);
    this.cosHist.addAll(errCos, n);
    this.sinHist.addAll(errSin, n);
    if (this.profileMax) this.addProfile(codes, n);
    if (this.envelopeLo) this.addEnvelope(codes, n);
    this.coverage.addAll(codes, n);
    this.nextIndex = Math.max(this.nextIndex, firstIndex + n);
    return this;
  }

  private grow(n: number): void {
    this.exactCos = new Float64Array(n);
    this.exactSin = new Float64Array(n);
    this.modelCos = new Int32Array(n);
    this.modelSin = new Int32Array(n);
    this.errCos = new Float64Array(n);
    this.errSin = new Float64Array(n);
    this.errMag = new Float64Array(n);
    this.errPhase = new Float64Array(n);
  }

  private mismatch(index: number, code: number, cos: number, sin: number, modelCos: number, modelSin: number): void {
    this.mismatchCount++;
    this.maxDiff = Math.max(this.maxDiff, Math.abs(cos - modelCos), Math.abs(sin - modelSin));
    this.keepMismatch({ index, code, cos, sin, modelCos, modelSin });
  }

  private addProfile(codes: ArrayLike<number>, n: number): void {
    const max = this.profileMax!;
    for (let k = 0; k < n; k++) {
      const bin = Math.min(max.length - 1, Math.floor((codes[k] - this.profileMin) * this.profileScale));
      const worst = Math.max(Math.abs(this.errCos[k]), Math.abs(this.errSin[k]));
      if (worst > max[bin]) max[bin] = worst;
    }
  }

  // The bin rule of server/services/error-envelope.ts (codeBinner), so a stored envelope equals one
  // computed from the samples later.
  private addEnvelope(codes: ArrayLike<number>, n: number): void {
    const lo = this.envelopeLo!;
    const hi = this.envelopeHi!;
    const bins = lo.length;
    const { profileMin: min, codeCount: count, errCos, errSin } = this;
    for (let k = 0; k < n; k++) {
      const b = Math.min(bins - 1, Math.max(0, Math.floor(((codes[k] - min) / count) * bins)));
      const eCos = errCos[k];
      const eSin = errSin[k];
      const low = eCos < eSin ? eCos : eSin;
      const high = eCos < eSin ? eSin : eCos;
      if (low < lo[b]) lo[b] = low;
      if (high > hi[b]) hi[b] = high;
    }
  }

  private keepMismatch(m: Mismatch): void {
    if (this.first.length >= this.keep && m.index >= this.first[this.first.length - 1].index) return;
    let at = this.first.length;
    while (at > 0 && this.first[at - 1].index > m.index) at--;
    this.first.splice(at, 0, m);
    if (this.first.length > this.keep) this.first.pop();
  }

  /** Folds another accumulator of the same configuration into this one. */
  merge(o: ScoreAccumulator): this {
    if (JSON.stringify(o.config) !== JSON.stringify(this.config)) throw new ScoringError('cannot merge scores of different model configurations');
    this.cosErr.merge(o.cosErr);
    this.sinErr.merge(o.sinErr);
    this.magErr.merge(o.magErr);
    this.phaseErr.merge(o.phaseErr);
    this.cosHist.merge(o.cosHist);
    this.sinHist.merge(o.sinHist);
    this.coverage.merge(o.coverage);
    if (this.profileMax && o.profileMax && o.profileMax.length === this.profileMax.length) {
      for (let b = 0; b < this.profileMax.length; b++) this.profileMax[b] = Math.max(this.profileMax[b], o.profileMax[b]);
    }
    if (this.envelopeLo && o.envelopeLo && o.envelopeLo.length === this.envelopeLo.length) {
      for (let b = 0; b < this.envelopeLo.length; b++) {
        this.envelopeLo[b] = Math.min(this.envelopeLo[b], o.envelopeLo[b]);
        this.envelopeHi![b] = Math.max(this.envelopeHi![b], o.envelopeHi![b]);
      }
    }
    this.mismatchCount += o.mismatchCount;
    this.maxDiff = Math.max(this.maxDiff, o.maxDiff);
    for (const m of o.first) this.keepMismatch(m);
    this.nextIndex = Math.max(this.nextIndex, o.nextIndex);
    return this;
  }

  /**
   * Error against angle, coarsely: per bin of the code range the largest |error| (cos or sin, in
   * LSB), PROFILE_EMPTY where no answer fell; null unless `profileBins` was given.
   */
  profile(): number[] | null {
    return this.profileMax ? Array.from(this.profileMax) : null;
  }

  /**
   * Per bin of the code range the lowest and highest signed error (cos or sin, in LSB), null where
   * no answer fell; null unless `envelopeBins` was given.
   */
  envelope(): { lo: (number | null)[]; hi: (number | null)[] } | null {
    if (!this.envelopeLo || !this.envelopeHi) return null;
    const finite = (v: number) => (Number.isFinite(v) ? v : null);
    return { lo: Array.from(this.envelopeLo, finite), hi: Array.from(this.envelopeHi, finite) };
  }

  /** The statistics so far, as plain data. */
  summary(): ScoreSummary {
    // Both channels together: the same sums and worst case as a pass over the cos then the sin
    // errors, with no loop of its own.
    const overall = new ErrorMoments().merge(this.cosErr).merge(this.sinErr);
    const lsb = 2 ** -this.config.outFrac;
    const channel = (m: ErrorMoments): ChannelSummary => ({
      count: m.count,
      maxAbsLsb: m.maxAbs,
      maxAbsCode: m.maxAbsCode,
      maxAbsDegrees: m.maxAbsCode === null ? null : angleCodeToDegrees(this.config, m.maxAbsCode),
      meanLsb: m.mean,
      rmsLsb: m.rms,
      maxAbs: m.maxAbs * lsb,
      mean: m.mean * lsb,
      rms: m.rms * lsb,
    });
    const h = this.cosHist.options;
    return {
      count: this.cosErr.count,
      cos: channel(this.cosErr),
      sin: channel(this.sinErr),
      overall: channel(overall),
      magnitude: { maxAbs: this.magErr.maxAbs, maxAbsCode: this.magErr.maxAbsCode, mean: this.magErr.mean, rms: this.magErr.rms },
      phase: { maxAbsRad: this.phaseErr.maxAbs, maxAbsCode: this.phaseErr.maxAbsCode, meanRad: this.phaseErr.mean, rmsRad: this.phaseErr.rms },
      histogram: {
        limitLsb: h.limitLsb,
        binsPerLsb: h.binsPerLsb,
        edgesLsb: this.cosHist.edgesLsb(),
        cos: Array.from(this.cosHist.counts),
        sin: Array.from(this.sinHist.counts),
        below: this.cosHist.below + this.sinHist.below,
        above: this.cosHist.above + this.sinHist.above,
      },
      mismatches: { count: this.mismatchCount, maxAbsDiffLsb: this.maxDiff, first: this.first.map((m) => ({ ...m })) },
      coverage: this.coverage.summary(),
    };
  }
}
