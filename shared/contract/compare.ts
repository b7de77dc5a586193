// The compare API: sessions side by side, the first against each other of its core bit for bit.
import { z } from 'zod';
import { buildBrief, isoDate } from './common';
import { coreModeSchema } from './cores';
import { verdict } from './sessions';

/** GET /api/compare?ids=1,2,…: two to six distinct session ids. */
export const compareQuery = z.strictObject({
  ids: z
    .string()
    .regex(/^\d+(,\d+)*$/, 'a comma-separated list of session ids')
    .transform((s) => s.split(',').map(Number))
    .pipe(z.array(z.number().int().positive()).min(2, 'at least 2 session ids').max(6, 'at most 6 session ids'))
    .refine((ids) => new Set(ids).size === ids.length, 'each session at most once'),
});
export type CompareQuery = z.infer<typeof compareQuery>;

const orNull = z.number().nullable();

/** The figures a comparison shows beside each session, read from its stored score (null: not in it). */
export const compareStats = z.object({
  count: orNull,
  maxAbsErrorLsb: orNull,
  rmsErrorLsb: orNull,
  cosMaxAbsLsb: orNull,
  sinMaxAbsLsb: orNull,
  cosBiasLsb: orNull,
  sinBiasLsb: orNull,
  magnitudeMaxAbs: orNull,
  phaseMaxAbsRad: orNull,
  modelMismatches: orNull,
  /** Rotation: share of the angle codes; vectoring: share of the x–y plane's cells (minPlaneCoveragePct's measure). */
  coveragePct: orNull,
  // A vectoring session's figures (null for a rotation session): angle errors in angle LSB, magnitude in magnitude LSB and ppm.
  angleMaxAbsLsb: orNull.default(null),
  angleRmsLsb: orNull.default(null),
  angleBiasLsb: orNull.default(null),
  magnitudeMaxAbsLsb: orNull.default(null),
  magnitudeRmsLsb: orNull.default(null),
  magnitudeMaxAbsPpm: orNull.default(null),
});
export type CompareStats = z.infer<typeof compareStats>;

export const comparedSession = z.object({
  id: z.number().int(),
  /** What its core computes; every session of one comparison has the same mode. */
  mode: coreModeSchema.default('rotation'),
  /** Only the id when the core is gone. */
  core: z.object({ id: z.number().int(), name: z.string().optional(), slug: z.string().optional() }),
  build: buildBrief.nullable(),
  startedAt: isoDate,
  sampleCount: z.number().int(),
  passed: z.boolean(),
  regression: z.boolean(),
  verdict,
  stats: compareStats,
  /** cos and sin counts together (vectoring: angle and magnitude counts together); edgesLsb holds each bin's left edge. */
  histogram: z.object({ binsPerLsb: z.number(), edgesLsb: z.array(z.number()), counts: z.array(z.number()), below: z.number(), above: z.number() }).nullable(),
  /**
   * Lowest and highest signed error (LSB) per bin of the code range, null where empty; for a
   * vectoring session, of the angle error per half degree of the input vector's direction.
   */
  errorEnvelope: z.object({ degrees: z.array(z.number()), lo: z.array(orNull), hi: z.array(orNull) }),
});
export type ComparedSession = z.infer<typeof comparedSession>;

const codes = z.object({ cos: z.number(), sin: z.number() });
export const differingCode = z.object({ code: z.number(), degrees: z.number(), a: codes, b: codes });
export type DifferingCode = z.infer<typeof differingCode>;

const answer = z.object({ angle: z.number(), magnitude: z.number() });
/** A vector both vectoring sessions answered, differently; `degrees` is its direction, [0, 360). */
export const differingVector = z.object({ x: z.number(), y: z.number(), degrees: z.number(), a: answer, b: answer });
export type DifferingVector = z.infer<typeof differingVector>;

/** The first session (`a`) against another (`b`), bit for bit on the codes both answered. */
export const comparedPair = z.object({
  a: z.number().int(),
  b: z.number().int(),
  /** False for a session of another core: its codes mean other angles, so it is not diffed. */
  sameCore: z.boolean(),
  /** Distinct angle codes both sessions answered. */
  common: z.number().int(),
  /** Of those, the codes whose cos or sin codes differ. */
  differing: z.number().int(),
  /** The largest |Δcos| or |Δsin| over the common codes, in output LSBs (0 when none differ). */
  maxAbsDiffLsb: z.number(),
  firstDiffering: z.array(differingCode),
  /** Per bin of the first session's envelope: differing codes and their largest |Δ|. */
  byBin: z.object({ differing: z.array(z.number()), maxAbsDiffLsb: z.array(z.number()) }),
  /**
   * Vectoring sessions (else null): `common` and `differing` count (x, y) vectors, `maxAbsDiffLsb`
   * is the larger of the angle and magnitude differences, `firstDiffering` above is empty and the
   * differing vectors are here, in (x, y) order.
   */
  vector: z
    .object({
      maxAbsAngleDiffLsb: z.number(),
      maxAbsMagnitudeDiffLsb: z.number(),
      firstDiffering: z.array(differingVector),
    })
    .nullable()
    .default(null),
});
export type ComparedPair = z.infer<typeof comparedPair>;

/** GET /api/compare */
export const compareReply = z.object({ sessions: z.array(comparedSession), pairs: z.array(comparedPair) });
export type CompareReply = z.infer<typeof compareReply>;
