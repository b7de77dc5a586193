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
});
export type Limits = z.infer<typeof limitsSchema>;
export type LimitKey = keyof Limits;
