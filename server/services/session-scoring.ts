// Scoring of an uploaded bench session on the server: the packed samples are decoded, scored with
// the shared ScoreAccumulator under the core's own model configuration, and judged against the
// core's limits. Nothing the client computed is trusted.
import { SAMPLE_BYTES, SamplePackError, sampleCountOf, unpackSamples, unpackSamplesInto, type UnpackedSamples } from '../../shared/link-engine/sample-pack';
import { HttpError } from '../http-error';
import { ENVELOPE_BINS, type EnvelopeBounds } from './error-envelope';
import { modelConfigSchema, limitsSchema } from '../schemas/core';
import { planCodes, planSchema, PROFILE_BINS, SpectralError, toneFigures, type ToneFigures } from '../../shared/numeric';
import { ScoreAccumulator, type ScoreSummary } from '../../shared/numeric/score';
import type { z } from 'zod';

type Limits = z.infer<typeof limitsSchema>;
export type LimitKey = keyof Limits;

export type DecodedSamples = UnpackedSamples;

const SCORE_BATCH = 65_536;

/** Unpack uploaded samples. @throws HttpError 400 when the length is not a whole number of samples. */
export function decodeSamples(bytes: Uint8Array, angleFormat: 'turn' | 'rad'): DecodedSamples {
  try {
    return unpackSamples(bytes, angleFormat);
  } catch (err) {
    if (err instanceof SamplePackError) throw new HttpError(400, 'bad_samples', `samples: ${err.message}`);
    throw err;
  }
}

/** What scoring a session keeps: the statistics, the list's error profile, the compare's envelope. */
export interface SessionScore {
  stats: ScoreSummary;
  profile: number[];
  envelope: EnvelopeBounds;
}

/**
 * Score decoded samples with the core's model, with the 64-bin error profile the session list draws.
 * @throws HttpError 400 for codes the model refuses.
 */
export function scoreSamples(modelConfig: unknown, samples: DecodedSamples): SessionScore {
  const { codes, cos, sin } = samples;
  return scoreInBatches(modelConfig, codes.length, (start, n) => ({ codes: codes.subarray(start, start + n), cos: cos.subarray(start, start + n), sin: sin.subarray(start, start + n) }));
}

/**
 * Score packed samples as they are stored, unpacking one batch at a time into the same small
 * columns: an upload never holds all its samples unpacked (16 bytes a sample beside its 12 packed),
 * and the statistics are the same to the last bit as scoreSamples of the whole unpacked.
 * @throws HttpError 400 for a length that is not whole samples, or codes the model refuses.
 */
export function scorePackedSamples(modelConfig: unknown, bytes: Uint8Array, angleFormat: 'turn' | 'rad'): SessionScore & { count: number } {
  return new PackedScoring(modelConfig, angleFormat).finish(bytes);
}

/**
 * scorePackedSamples fed while the bytes arrive: `feed` scores each whole batch as soon as it is
 * in, `finish` the rest. The batches and their order are scorePackedSamples', so the statistics
 * are the same to the last bit however the bytes came.
 */
export class PackedScoring {
  private readonly acc: ScoreAccumulator;
  private batch: DecodedSamples | null = null;
  /** Samples scored so far, a whole number of batches until `finish`. */
  private scored = 0;

  constructor(
    modelConfig: unknown,
    private readonly angleFormat: 'turn' | 'rad',
  ) {
    this.acc = accumulatorFor(modelConfig);
  }

  /** Score the whole batches among the first `size` bytes of `bytes` not scored yet. @throws HttpError 400 as scorePackedSamples. */
  feed(bytes: Uint8Array, size: number): void {
    const available = Math.floor(size / SAMPLE_BYTES);
    while (available - this.scored >= SCORE_BATCH) this.score(bytes, SCORE_BATCH);
  }

  /** Score the rest of `bytes` (all the samples, the first ones as fed before). @throws HttpError 400 as scorePackedSamples. */
  finish(bytes: Uint8Array): SessionScore & { count: number } {
    let count: number;
    try {
      count = sampleCountOf(bytes);
    } catch (err) {
      if (err instanceof SamplePackError) throw new HttpError(400, 'bad_samples', `samples: ${err.message}`);
      throw err;
    }
    if (count < this.scored) throw new Error(`finish: ${count} samples, but ${this.scored} were fed`);
    while (this.scored < count) this.score(bytes, Math.min(SCORE_BATCH, count - this.scored));
    return { ...summaryOf(this.acc), count };
  }

  private score(bytes: Uint8Array, n: number): void {
    // One batch's columns, reused: sized for a whole batch unless the first is also the last.
    this.batch ??= columns(n === SCORE_BATCH ? SCORE_BATCH : n);
    const full = this.batch;
    unpackSamplesInto(bytes, this.angleFormat, this.scored, n, full);
    const batch = n === full.codes.length ? full : { codes: full.codes.subarray(0, n), cos: full.cos.subarray(0, n), sin: full.sin.subarray(0, n) };
    addBatch(this.acc, batch, this.scored);
    this.scored += n;
  }
}

const columns = (n: number): DecodedSamples => ({ codes: new Float64Array(n), cos: new Int32Array(n), sin: new Int32Array(n) });

/** @throws HttpError 400 for a configuration the scorer refuses. */
function accumulatorFor(modelConfig: unknown): ScoreAccumulator {
  const config = modelConfigSchema.parse(modelConfig);
  try {
    // The compare view's error envelope is kept too, so comparing never scores the samples again.
    return new ScoreAccumulator(config, { profileBins: PROFILE_BINS, envelopeBins: ENVELOPE_BINS });
  } catch (err) {
    throw new HttpError(400, 'bad_samples', `samples: ${(err as Error).message}`);
  }
}

/** @throws HttpError 400 for codes the model refuses. */
function addBatch(acc: ScoreAccumulator, { codes, cos, sin }: DecodedSamples, start: number): void {
  try {
    acc.add(codes, cos, sin, start);
  } catch (err) {
    throw new HttpError(400, 'bad_samples', `samples: ${(err as Error).message}`);
  }
}

function summaryOf(acc: ScoreAccumulator): SessionScore {
  try {
    return { stats: acc.summary(), profile: acc.profile()!, envelope: acc.envelope()! };
  } catch (err) {
    throw new HttpError(400, 'bad_samples', `samples: ${(err as Error).message}`);
  }
}

function scoreInBatches(modelConfig: unknown, count: number, batchAt: (start: number, n: number) => DecodedSamples): SessionScore {
  const acc = accumulatorFor(modelConfig);
  // In batches: the scorer's per-answer scratch stays a few MiB (cache-sized, no GC churn) where
  // one batch of a million answers allocated ~60 MiB per upload. Its sums run in answer order
  // across batches, so the statistics are the same to the last bit.
  for (let start = 0; start < count; start += SCORE_BATCH) addBatch(acc, batchAt(start, Math.min(SCORE_BATCH, count - start)), start);
  return summaryOf(acc);
}

/** Whether a plan is a coherent tone, the one kind whose spectrum needs every sample unpacked. */
export function isTonePlan(planInput: unknown): boolean {
  const plan = planSchema.safeParse(planInput);
  return plan.success && plan.data.kind === 'tone';
}

/** One limit's outcome; `measured` and `pass` are null when the server cannot measure it. */
export interface LimitOutcome {
  limit: number;
  measured: number | null;
  pass: boolean | null;
}
export type Verdict = Partial<Record<LimitKey, LimitOutcome>>;

/** What the server knows besides the score: the reported link figures, the tone's spectrum. */
export interface JudgeContext {
  checkFailures?: number;
  /** The worse channel's SFDR of a coherent-tone session, dBc. */
  sfdrDb?: number;
  /** A soak session's unstable codes (shared/soak); single-pass sessions have none to judge. */
  unstableCodes?: number;
}

/** Spectral figures of each channel of a tone session. */
export interface SessionSpectrum {
  cycles: number;
  cos: ToneFigures;
  sin: ToneFigures;
}

/**
 * The spectrum of a coherent-tone session, when every sample of the plan came back in plan order
 * (a gap would smear the tone); null for other plans or incomplete tones.
 */
export function sessionSpectrum(planInput: unknown, modelConfig: unknown, samples: DecodedSamples): SessionSpectrum | null {
  const plan = planSchema.safeParse(planInput);
  if (!plan.success || plan.data.kind !== 'tone') return null;
  const config = modelConfigSchema.parse(modelConfig);
  const codes = planCodes(plan.data, config);
  if (codes.length !== samples.codes.length || codes.some((c, i) => c !== samples.codes[i])) return null;
  try {
    return { cycles: plan.data.cycles, cos: toneFigures(samples.cos, plan.data.cycles), sin: toneFigures(samples.sin, plan.data.cycles) };
  } catch (err) {
    if (err instanceof SpectralError) return null;
    throw err;
  }
}

const MEASURES: Partial<Record<LimitKey, { max: boolean; value: (s: ScoreSummary, c: JudgeContext) => number | null }>> = {
  maxAbsErrorLsb: { max: true, value: (s) => s.overall.maxAbsLsb },
  maxRmsErrorLsb: { max: true, value: (s) => s.overall.rmsLsb },
  maxAbsBiasLsb: { max: true, value: (s) => Math.max(Math.abs(s.cos.meanLsb), Math.abs(s.sin.meanLsb)) },
  // Only a complete coherent tone has a spectrum to measure.
  minSfdrDb: { max: false, value: (_s, c) => c.sfdrDb ?? null },
  maxModelMismatches: { max: true, value: (s) => s.mismatches.count },
  // Link errors happen on the wire, not in the samples: the runner's own count is all there is.
  maxLinkErrors: { max: true, value: (_s, c) => c.checkFailures ?? null },
  minCoveragePct: { max: false, value: (s) => s.coverage.share * 100 },
  maxUnstableCodes: { max: true, value: (_s, c) => c.unstableCodes ?? null },
};

/** How one limit is measured from a summary of type S: which way it bounds, and its value (null: not measurable). */
export type Measures<S> = Partial<Record<LimitKey, { max: boolean; value: (s: S, c: JudgeContext) => number | null }>>;

/**
 * Every limit of the core that `measures` knows, against the summary. An empty session fails
 * every limit it could measure from samples: nothing answered proves nothing.
 */
export function judgeWith<S extends { count: number }>(measures: Measures<S>, limitsInput: unknown, summary: S, context: JudgeContext = {}): { verdict: Verdict; passed: boolean } {
  const limits = limitsSchema.parse(limitsInput ?? {});
  const verdict: Verdict = {};
  for (const key of Object.keys(measures) as LimitKey[]) {
    const limit = limits[key];
    const m = measures[key];
    if (limit === undefined || !m) continue;
    const measured = m.value(summary, context);
    if (measured === null) {
      verdict[key] = { limit, measured: null, pass: null };
      continue;
    }
    const empty = summary.count === 0 && key !== 'maxLinkErrors';
    verdict[key] = { limit, measured, pass: !empty && (m.max ? measured <= limit : measured >= limit) };
  }
  return { verdict, passed: Object.values(verdict).every((v) => v.pass !== false) };
}

/** A rotation core's limits against its session's summary (judgeWith). */
export function judgeSession(limitsInput: unknown, summary: ScoreSummary, context: JudgeContext = {}): { verdict: Verdict; passed: boolean } {
  return judgeWith(MEASURES, limitsInput, summary, context);
}

/** The limits the baseline passed that this session fails (empty: no regression). */
export function regressedLimits(baselineVerdict: unknown, verdict: Verdict): LimitKey[] {
  const base = (baselineVerdict ?? {}) as Partial<Record<string, { pass?: unknown }>>;
  return (Object.keys(verdict) as LimitKey[]).filter((key) => verdict[key]?.pass === false && base[key]?.pass === true);
}
