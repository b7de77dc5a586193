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
});
export type Limits = z.infer<typeof limitsSchema>;
export type LimitKey = keyof Limits;

/** What a limit is called, its unit, which way it bounds, and what it measures, in one line. */
export interface LimitMeaning {
  name: string;
  unit: string;
  /** True when the measured value must stay at or below the limit; false: at or above. */
  atMost: boolean;
  explain: string;
}

/** Every limit in the order pages and reports list them, with the words they all use. */
export const LIMIT_MEANINGS: Readonly<Record<LimitKey, LimitMeaning>> = {
  maxAbsErrorLsb: { name: 'Largest |error|', unit: 'LSB', atMost: true, explain: 'Largest |error| of any cos or sin code against the exact value, in LSB.' },
  maxRmsErrorLsb: { name: 'RMS error', unit: 'LSB', atMost: true, explain: 'Root-mean-square error of all cos and sin codes against the exact values, in LSB.' },
  maxAbsBiasLsb: { name: 'Mean error (bias)', unit: 'LSB', atMost: true, explain: 'Mean error of the cos codes or of the sin codes, whichever is further from zero, in LSB.' },
  minSfdrDb: { name: 'SFDR', unit: 'dB', atMost: false, explain: 'Spurious-free dynamic range of a complete coherent-tone run, in dB; other runs leave it unchecked.' },
  maxModelMismatches: { name: 'Model mismatches', unit: 'results', atMost: true, explain: 'Results whose cos or sin code differs from the bit-accurate model’s answer.' },
  maxLinkErrors: { name: 'Link errors', unit: 'frames', atMost: true, explain: 'Frames that failed their check on the link during the run, as the bench or runner counted them.' },
  minCoveragePct: { name: 'Code coverage', unit: '%', atMost: false, explain: 'Share of the core’s angle codes the session asked about, in percent.' },
  maxUnstableCodes: { name: 'Unstable codes', unit: 'codes', atMost: true, explain: 'Codes whose answers differed between passes of a soak; a single-pass session leaves it unchecked.' },
};

export const LIMIT_KEYS = Object.keys(LIMIT_MEANINGS) as LimitKey[];
