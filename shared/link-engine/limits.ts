import { z } from 'zod';

const lsb = z.number().min(0).max(1e6);

/**
 * A core's acceptance limits, as the server stores them and the runner and the server judge
 * them; a missing key is not checked. Errors are in output LSB, SFDR in dB, coverage in percent.
 */
export const limitsSchema = z.strictObject({
  maxAbsErrorLsb: lsb.optional(),
  maxRmsErrorLsb: lsb.optional(),
  maxAbsBiasLsb: lsb.optional(),
  minSfdrDb: z.number().min(0).max(300).optional(),
  maxModelMismatches: z.number().int().min(0).optional(),
  maxLinkErrors: z.number().int().min(0).optional(),
  minCoveragePct: z.number().min(0).max(100).optional(),
  maxUnstableCodes: z.number().int().min(0).optional(),
  // Vectoring cores (docs/model.md, "Vectoring cores"): angle errors in angle-code LSB, wrapped at
  // half a turn; magnitude errors in magnitude-code LSB or ppm of the exact magnitude.
  maxAngleErrorLsb: lsb.optional(),
  maxAngleRmsLsb: lsb.optional(),
  maxMagnitudeErrorLsb: lsb.optional(),
  maxMagnitudeErrorPpm: z.number().min(0).max(1e9).optional(),
  minPlaneCoveragePct: z.number().min(0).max(100).optional(),
});
export type Limits = z.infer<typeof limitsSchema>;
export type LimitKey = keyof Limits;

/** What a core computes: cos/sin of an angle (`rotation`, every core before vectoring) or atan2 and magnitude of a vector (`vectoring`). */
export const CORE_MODES = ['rotation', 'vectoring'] as const;
export type CoreMode = (typeof CORE_MODES)[number];

/** What a limit is called, its unit, which way it bounds, and what it measures, in one line. */
export interface LimitMeaning {
  name: string;
  unit: string;
  /** True when the measured value must stay at or below the limit; false: at or above. */
  atMost: boolean;
  explain: string;
  /** The cores that may set it. */
  modes: readonly CoreMode[];
}

const ROTATION = ['rotation'] as const;
const VECTORING = ['vectoring'] as const;
const BOTH = CORE_MODES;

/** Every limit in the order pages and reports list them, with the words they all use. */
export const LIMIT_MEANINGS: Readonly<Record<LimitKey, LimitMeaning>> = {
  maxAbsErrorLsb: { name: 'Largest |error|', unit: 'LSB', atMost: true, modes: ROTATION, explain: 'Largest |error| of any cos or sin code against the exact value, in LSB.' },
  maxRmsErrorLsb: { name: 'RMS error', unit: 'LSB', atMost: true, modes: ROTATION, explain: 'Root-mean-square error of all cos and sin codes against the exact values, in LSB.' },
  maxAbsBiasLsb: { name: 'Mean error (bias)', unit: 'LSB', atMost: true, modes: ROTATION, explain: 'Mean error of the cos codes or of the sin codes, whichever is further from zero, in LSB.' },
  minSfdrDb: { name: 'SFDR', unit: 'dB', atMost: false, modes: ROTATION, explain: 'Spurious-free dynamic range of a complete coherent-tone run, in dB; other runs leave it unchecked.' },
  maxModelMismatches: { name: 'Model mismatches', unit: 'results', atMost: true, modes: BOTH, explain: 'Results whose output codes differ from the bit-accurate model’s answer.' },
  maxLinkErrors: { name: 'Link errors', unit: 'frames', atMost: true, modes: BOTH, explain: 'Frames that failed their check on the link during the run, as the bench or runner counted them.' },
  minCoveragePct: { name: 'Code coverage', unit: '%', atMost: false, modes: ROTATION, explain: 'Share of the core’s angle codes the session asked about, in percent.' },
  maxUnstableCodes: { name: 'Unstable codes', unit: 'codes', atMost: true, modes: ROTATION, explain: 'Codes whose answers differed between passes of a soak; a single-pass session leaves it unchecked.' },
  maxAngleErrorLsb: { name: 'Largest |angle error|', unit: 'LSB', atMost: true, modes: VECTORING, explain: 'Largest |error| of any angle code against the exact atan2, wrapped at half a turn, in angle LSB; the zero vector is left out.' },
  maxAngleRmsLsb: { name: 'RMS angle error', unit: 'LSB', atMost: true, modes: VECTORING, explain: 'Root-mean-square error of the angle codes against the exact atan2, in angle LSB.' },
  maxMagnitudeErrorLsb: { name: 'Largest |magnitude error|', unit: 'LSB', atMost: true, modes: VECTORING, explain: 'Largest |error| of any magnitude code against the exact magnitude (with the core’s nominal gain), in magnitude LSB.' },
  maxMagnitudeErrorPpm: { name: 'Largest relative magnitude error', unit: 'ppm', atMost: true, modes: VECTORING, explain: 'Largest |magnitude error| relative to the exact magnitude, in parts per million; the zero vector is left out.' },
  minPlaneCoveragePct: { name: 'Plane coverage', unit: '%', atMost: false, modes: VECTORING, explain: 'Share of the 16 × 16 cells of the x–y input square holding at least one answered vector, in percent.' },
};

/** The limits of a rotation core, in the order pages and reports list them (every limit before vectoring cores). */
export const LIMIT_KEYS = (Object.keys(LIMIT_MEANINGS) as LimitKey[]).filter((k) => LIMIT_MEANINGS[k].modes.includes('rotation'));
/** The limits of a vectoring core, in the order pages and reports list them. */
export const VECTOR_LIMIT_KEYS = (Object.keys(LIMIT_MEANINGS) as LimitKey[]).filter((k) => LIMIT_MEANINGS[k].modes.includes('vectoring'));

/** The limits a core of `mode` may set. */
export const limitKeysOf = (mode: CoreMode): readonly LimitKey[] => (mode === 'vectoring' ? VECTOR_LIMIT_KEYS : LIMIT_KEYS);

/** The first limit set in `limits` that a core of `mode` cannot set, or null when all apply. */
export function limitOutsideMode(mode: CoreMode, limits: Partial<Record<string, unknown>>): LimitKey | null {
  const allowed = limitKeysOf(mode);
  const key = (Object.keys(limits) as LimitKey[]).find((k) => limits[k] !== undefined && !allowed.includes(k));
  return key ?? null;
}
