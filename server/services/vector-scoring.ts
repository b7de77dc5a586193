// Scoring of a vectoring core's session on the server: the packed 16-byte records are decoded,
// scored with shared/vectoring's VectorScoreAccumulator under the core's vectoring configuration,
// and judged against the core's vectoring limits. Besides the score: the list's 64-bin profile and
// the compare view's envelope, both of the angle error against the vector's direction.
import { SamplePackError } from '../../shared/link-engine/sample-pack';
import { VECTOR_MEASURES } from '../../shared/link-engine/vector-measures';
import { unpackVectorSamples, type VectorSamples } from '../../shared/link-engine/vector-sample-pack';
import { PROFILE_BINS } from '../../shared/numeric';
import { exactVectorInto, parseVectorConfig, VectorScoreAccumulator, wrapAngleError, type VectorConfig, type VectorScoreSummary } from '../../shared/vectoring';
import { HttpError } from '../http-error';
import { ENVELOPE_BINS, type EnvelopeBounds, type ErrorEnvelope } from './error-envelope';
import { judgeWith, type JudgeContext, type Verdict } from './session-scoring';

const SCORE_BATCH = 65_536;
const TWO_PI = 2 * Math.PI;

/** Unpack uploaded vectoring samples. @throws HttpError 400 when the length is not a whole number of records. */
export function decodeVectorSamples(bytes: Uint8Array): VectorSamples {
  try {
    return unpackVectorSamples(bytes);
  } catch (err) {
    if (err instanceof SamplePackError) throw new HttpError(400, 'bad_samples', `samples: ${err.message}`);
    throw err;
  }
}

/** Which of `bins` equal parts of the turn the direction of (x, y) falls in (the zero vector: bin 0). */
export function directionBin(x: number, y: number, bins: number): number {
  let a = Math.atan2(y, x);
  if (a < 0) a += TWO_PI;
  return Math.min(bins - 1, Math.floor((a / TWO_PI) * bins));
}

/** One turn in angle LSB: 2^angleBits, or 2π · 2^angleFrac for radians. */
const turnLsb = (c: VectorConfig) => (c.angleFormat === 'turn' ? 2 ** c.angleBits : TWO_PI * 2 ** c.angleFrac);

/**
 * Score decoded vectoring samples with the core's configuration: the summary, the 64-bin profile
 * (largest |angle error| in LSB per 1/64 turn of the input's direction, −1 where no vector fell)
 * and the envelope bounds (lowest and highest signed angle error per half degree of direction).
 * The zero vector has no direction or angle error and is left out of both, as the scorer does.
 * @throws HttpError 400 for inputs or answers the core's formats cannot hold.
 */
export function scoreVectorSamples(vectorConfig: unknown, s: VectorSamples): { stats: VectorScoreSummary; profile: number[]; envelope: EnvelopeBounds } {
  const config = parseVectorConfig(vectorConfig);
  const acc = new VectorScoreAccumulator(config);
  const n = s.xs.length;
  try {
    for (let start = 0; start < n; start += SCORE_BATCH) {
      const end = Math.min(n, start + SCORE_BATCH);
      acc.add(s.xs.subarray(start, end), s.ys.subarray(start, end), s.angles.subarray(start, end), s.magnitudes.subarray(start, end), start);
    }
  } catch (err) {
    throw new HttpError(400, 'bad_samples', `samples: ${(err as Error).message}`);
  }
  const period = turnLsb(config);
  const profile = new Array<number>(PROFILE_BINS).fill(-1);
  const lo = new Float64Array(ENVELOPE_BINS).fill(Infinity);
  const hi = new Float64Array(ENVELOPE_BINS).fill(-Infinity);
  const exactAngle = new Float64Array(Math.min(n, SCORE_BATCH));
  const exactMag = new Float64Array(exactAngle.length);
  for (let start = 0; start < n; start += SCORE_BATCH) {
    const end = Math.min(n, start + SCORE_BATCH);
    exactVectorInto(config, s.xs.subarray(start, end), s.ys.subarray(start, end), exactAngle, exactMag);
    for (let i = start; i < end; i++) {
      const x = s.xs[i];
      const y = s.ys[i];
      if (x === 0 && y === 0) continue;
      const e = wrapAngleError(s.angles[i] - exactAngle[i - start], period);
      const p = directionBin(x, y, PROFILE_BINS);
      if (Math.abs(e) > profile[p]) profile[p] = Math.abs(e);
      const b = directionBin(x, y, ENVELOPE_BINS);
      if (e < lo[b]) lo[b] = e;
      if (e > hi[b]) hi[b] = e;
    }
  }
  const finite = (v: number) => (Number.isFinite(v) ? v : null);
  return { stats: acc.summary(), profile, envelope: { lo: Array.from(lo, finite), hi: Array.from(hi, finite) } };
}

/** The envelope the compare page draws: bins of the direction, their centres in degrees. */
export function vectorEnvelopeFromBounds(bounds: EnvelopeBounds): ErrorEnvelope {
  const bins = bounds.lo.length;
  const round = (v: number | null) => (v === null ? null : Math.round(v * 1000) / 1000);
  return {
    degrees: Array.from({ length: bins }, (_, b) => Math.round(((b + 0.5) * 360 * 1000) / bins) / 1000),
    lo: bounds.lo.map(round),
    hi: bounds.hi.map(round),
  };
}

/** A vectoring core's limits against its session's summary (the runner judges by the same VECTOR_MEASURES). */
export function judgeVectorSession(limitsInput: unknown, summary: VectorScoreSummary, context: JudgeContext = {}): { verdict: Verdict; passed: boolean } {
  return judgeWith(VECTOR_MEASURES, limitsInput, summary, context);
}
