// Scoring of a core's answers against exact math and against the reference model. Results may
// arrive in any order and in pieces (RESULTS frames, worker batches); accumulators merge.
import { createCordicModel, type CordicModel } from './cordic-model';
import { CodeCoverage, type CoverageSummary } from './coverage';
import { ErrorHistogram, ErrorMoments, DEFAULT_HISTOGRAM, type HistogramOptions } from './error-stats';
import { AngleCodeError, ScoringError } from './errors';
import { exactSinCosInto } from './exact-reference';
import { phaseError, radiansPerCode } from './phase-error';
import { angleCodeRange, angleCodeToDegrees, assertAngleCode, assertOutputCode, outputCodeRange } from './formats';
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

/**
 * Batches shorter than this are gathered and scored together. A RESULTS frame carries 62 answers;
 * scored a frame at a time, the set-up of the model's, the reference's and each statistic's loop
 * cost about 10 ns an answer, a quarter of what the statistics cost.
 */
const GATHER = 2048;
/**
 * Where each error quantity's moments start in ScoreAccumulator.moments; at each: the sum, the
 * sum of squares, the largest |error| and the code where it occurred (Infinity: none yet).
 */
const MOMENTS = { cos: 0, sin: 4, magnitude: 8, phase: 12 } as const;

/** Streaming, mergeable scorer for one core configuration. */
export class ScoreAccumulator {
  readonly model: CordicModel;
  readonly config: Readonly<ModelConfig>;
  /**
   * The moments of the four error quantities (ErrorMoments' fields in typed slots, see MOMENTS),
   * which the scorer's loop adds to in place. Read from and written to ErrorMoments objects around
   * the loop, they made V8 (Node 20) deoptimise it after its first runs and, in some processes,
   * keep running it in its slower on-stack-replacement form (the pipeline 1.6 × slower).
   */
  private readonly moments = Float64Array.from({ length: 16 }, (_, i) => (i % 4 === 3 ? Infinity : 0));
  private count = 0;
  private readonly cosHist: ErrorHistogram;
  private readonly sinHist: ErrorHistogram;
  private readonly coverage: CodeCoverage;
  private readonly keep: number;
  private readonly profileMax: Float64Array | null;
  private readonly profileScale: number;
  private readonly envelopeLo: Float64Array | null;
  private readonly envelopeHi: Float64Array | null;
  private readonly codeCount: number;
  private readonly codeMin: number;
  private readonly outMin: number;
  private readonly outMax: number;
  private mismatchCount = 0;
  private maxDiff = 0;
  private first: Mismatch[] = [];
  private nextIndex = 0;
  // Short batches waiting to be scored: answers[0..gathered) with request indices from gatheredFrom.
  private readonly gatheredCodes = new Float64Array(GATHER);
  private readonly gatheredCos = new Int32Array(GATHER);
  private readonly gatheredSin = new Int32Array(GATHER);
  private gathered = 0;
  private gatheredFrom = 0;
  // Scratch buffers, grown on demand, so scoring a batch allocates nothing per sample.
  private exactCos = new Float64Array(0);
  private exactSin = new Float64Array(0);
  private modelCos = new Int32Array(0);
  private modelSin = new Int32Array(0);
  private errCos = new Float64Array(0);
  private errSin = new Float64Array(0);

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
    this.profileScale = bins / range.count;
    const envelopeBins = options.envelopeBins ?? 0;
    this.envelopeLo = envelopeBins > 0 ? new Float64Array(envelopeBins).fill(Infinity) : null;
    this.envelopeHi = envelopeBins > 0 ? new Float64Array(envelopeBins).fill(-Infinity) : null;
    this.codeCount = range.count;
    this.codeMin = range.min;
    ({ min: this.outMin, max: this.outMax } = outputCodeRange(this.config));
  }

  /**
   * Scores a batch of answers. `firstIndex` is the request index of codes[0] (RESULTS frames carry
   * it); by default batches are numbered in arrival order. Short batches are gathered and scored
   * together (the statistics are the same to the last bit: every sum runs in answer order);
   * reading the statistics scores what is gathered.
   * @throws AngleCodeError / OutputCodeError for values the formats cannot hold; the batch is
   * then refused whole and the accumulator unchanged.
   */
  add(codes: ArrayLike<number>, cos: ArrayLike<number>, sin: ArrayLike<number>, firstIndex = this.nextIndex): this {
    const n = codes.length;
    if (cos.length !== n || sin.length !== n) throw new ScoringError(`codes, cos and sin differ in length (${n}, ${cos.length}, ${sin.length})`);
    this.validate(codes, cos, sin, n);
    this.nextIndex = Math.max(this.nextIndex, firstIndex + n);
    if (n >= GATHER) {
      this.flush();
      this.score(codes, cos, sin, firstIndex, n);
      return this;
    }
    if (this.gathered > 0 && (this.gathered + n > GATHER || firstIndex !== this.gatheredFrom + this.gathered)) this.flush();
    if (this.gathered === 0) this.gatheredFrom = firstIndex;
    this.gatheredCodes.set(codes, this.gathered);
    this.gatheredCos.set(cos, this.gathered);
    this.gatheredSin.set(sin, this.gathered);
    this.gathered += n;
    return this;
  }

  /** Checks every value before any is taken, so a bad batch changes nothing. */
  private validate(codes: ArrayLike<number>, cos: ArrayLike<number>, sin: ArrayLike<number>, n: number): void {
    const { codeMin, outMin } = this;
    const codeSpan = this.codeCount - 1; // below 2^32: angles have at most 32 bits
    const outSpan = this.outMax - outMin;
    // Each value less its minimum must be a whole number 0..span: x >>> 0 changes any other x.
    // One verdict for the batch; the loop that names the culprit only runs for a bad one.
    let ok = 1;
    for (let k = 0; k < n; k++) {
      const at = codes[k] - codeMin;
      const oc = cos[k] - outMin;
      const os = sin[k] - outMin;
      ok &= +((at >>> 0) === at && at <= codeSpan && (oc >>> 0) === oc && oc <= outSpan && (os >>> 0) === os && os <= outSpan);
    }
    if (!ok) this.refuse(codes, cos, sin, n);
  }

  /** @throws AngleCodeError / OutputCodeError for the first value the formats cannot hold. */
  private refuse(codes: ArrayLike<number>, cos: ArrayLike<number>, sin: ArrayLike<number>, n: number): never {
    const c = this.config;
    for (let k = 0; k < n; k++) {
      try {
        assertAngleCode(c, codes[k]);
      } catch (err) {
        throw new AngleCodeError(`codes[${k}]: ${(err as Error).message}`);
      }
      assertOutputCode(c, cos[k]);
      assertOutputCode(c, sin[k]);
    }
    throw new ScoringError('a batch failed the range check, yet every value is in range'); // the two checks disagree: a bug
  }

  /** Scores what is gathered. */
  private flush(): void {
    const n = this.gathered;
    if (n === 0) return;
    this.gathered = 0;
    this.score(this.gatheredCodes.subarray(0, n), this.gatheredCos.subarray(0, n), this.gatheredSin.subarray(0, n), this.gatheredFrom, n);
  }

  /** Scores validated answers. */
  private score(codes: ArrayLike<number>, cos: ArrayLike<number>, sin: ArrayLike<number>, firstIndex: number, n: number): void {
    if (this.exactCos.length < n) this.grow(n);
    this.model.evaluateInto(codes, this.modelCos, this.modelSin);
    exactSinCosInto(this.config, codes, this.exactCos, this.exactSin);
    this.errorPass(codes, cos, sin, firstIndex, n);
    this.count += n;
    if (this.profileMax) this.addProfile(codes, n);
    if (this.envelopeLo) this.addEnvelope(codes, n);
    this.coverage.addAll(codes, n);
  }

  /**
   * The per-answer errors of a batch, the four moments and the two histograms, in one pass: what
   * ErrorMoments.addAll and ErrorHistogram.addAll passes over the errors give, to the last bit
   * (the same sums in the same order, the same worst-case rule, the same bins), in about half
   * the time of those six passes.
   */
  private errorPass(codes: ArrayLike<number>, cos: ArrayLike<number>, sin: ArrayLike<number>, firstIndex: number, n: number): void {
    const c = this.config;
    const { exactCos, exactSin, modelCos, modelSin, errCos, errSin } = this;
    const scale = 2 ** c.outFrac;
    const lsb = 2 ** -c.outFrac; // exactly code / scale, without a division per answer
    const radPerCode = radiansPerCode(c);
    const m = this.moments; // slots as MOMENTS lays them out
    const { cosHist, sinHist } = this;
    for (let k = 0; k < n; k++) {
      const code = codes[k];
      const oc = cos[k];
      const os = sin[k];
      const ec = exactCos[k];
      const es = exactSin[k];
      const eCos = oc - ec * scale;
      const eSin = os - es * scale;
      const vc = oc * lsb;
      const vs = os * lsb;
      const eMag = Math.sqrt(vc * vc + vs * vs) - 1;
      const ePhase = phaseError(code, oc, os, ec, es, radPerCode);
      errCos[k] = eCos;
      errSin[k] = eSin;
      cosHist.add(eCos);
      sinHist.add(eSin);
      if (oc !== modelCos[k] || os !== modelSin[k]) this.mismatch(firstIndex + k, code, oc, os, modelCos[k], modelSin[k]);
      m[0] += eCos;
      m[1] += eCos * eCos;
      let a = Math.abs(eCos);
      if (a >= m[2] && (a > m[2] || code < m[3])) {
        m[2] = a;
        m[3] = code;
      }
      m[4] += eSin;
      m[5] += eSin * eSin;
      a = Math.abs(eSin);
      if (a >= m[6] && (a > m[6] || code < m[7])) {
        m[6] = a;
        m[7] = code;
      }
      m[8] += eMag;
      m[9] += eMag * eMag;
      a = Math.abs(eMag);
      if (a >= m[10] && (a > m[10] || code < m[11])) {
        m[10] = a;
        m[11] = code;
      }
      m[12] += ePhase;
      m[13] += ePhase * ePhase;
      a = Math.abs(ePhase);
      if (a >= m[14] && (a > m[14] || code < m[15])) {
        m[14] = a;
        m[15] = code;
      }
    }
  }

  /** One quantity's moments (MOMENTS) as an ErrorMoments. */
  private momentsOf(at: number): ErrorMoments {
    const m = this.moments;
    const out = new ErrorMoments();
    out.count = this.count;
    out.sum = m[at];
    out.sumSq = m[at + 1];
    out.maxAbs = m[at + 2];
    out.maxAbsCode = m[at + 3] === Infinity ? null : m[at + 3];
    return out;
  }

  private grow(n: number): void {
    this.exactCos = new Float64Array(n);
    this.exactSin = new Float64Array(n);
    this.modelCos = new Int32Array(n);
    this.modelSin = new Int32Array(n);
    this.errCos = new Float64Array(n);
    this.errSin = new Float64Array(n);
  }

  private mismatch(index: number, code: number, cos: number, sin: number, modelCos: number, modelSin: number): void {
    this.mismatchCount++;
    this.maxDiff = Math.max(this.maxDiff, Math.abs(cos - modelCos), Math.abs(sin - modelSin));
    this.keepMismatch({ index, code, cos, sin, modelCos, modelSin });
  }

  private addProfile(codes: ArrayLike<number>, n: number): void {
    const max = this.profileMax!;
    for (let k = 0; k < n; k++) {
      const bin = Math.min(max.length - 1, Math.floor((codes[k] - this.codeMin) * this.profileScale));
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
    const { codeMin: min, codeCount: count, errCos, errSin } = this;
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
    this.flush();
    o.flush();
    for (const at of Object.values(MOMENTS)) {
      const merged = this.momentsOf(at).merge(o.momentsOf(at));
      this.moments.set([merged.sum, merged.sumSq, merged.maxAbs, merged.maxAbsCode ?? Infinity], at);
    }
    this.count += o.count;
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
    this.flush();
    return this.profileMax ? Array.from(this.profileMax) : null;
  }

  /**
   * Per bin of the code range the lowest and highest signed error (cos or sin, in LSB), null where
   * no answer fell; null unless `envelopeBins` was given.
   */
  envelope(): { lo: (number | null)[]; hi: (number | null)[] } | null {
    if (!this.envelopeLo || !this.envelopeHi) return null;
    this.flush();
    const finite = (v: number) => (Number.isFinite(v) ? v : null);
    return { lo: Array.from(this.envelopeLo, finite), hi: Array.from(this.envelopeHi, finite) };
  }

  /** The statistics so far, as plain data. */
  summary(): ScoreSummary {
    this.flush();
    // Both channels together: the same sums and worst case as a pass over the cos then the sin
    // errors, with no loop of its own.
    const cosErr = this.momentsOf(MOMENTS.cos);
    const sinErr = this.momentsOf(MOMENTS.sin);
    const magErr = this.momentsOf(MOMENTS.magnitude);
    const phaseErr = this.momentsOf(MOMENTS.phase);
    const overall = new ErrorMoments().merge(cosErr).merge(sinErr);
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
      count: this.count,
      cos: channel(cosErr),
      sin: channel(sinErr),
      overall: channel(overall),
      magnitude: { maxAbs: magErr.maxAbs, maxAbsCode: magErr.maxAbsCode, mean: magErr.mean, rms: magErr.rms },
      phase: { maxAbsRad: phaseErr.maxAbs, maxAbsCode: phaseErr.maxAbsCode, meanRad: phaseErr.mean, rmsRad: phaseErr.rms },
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
