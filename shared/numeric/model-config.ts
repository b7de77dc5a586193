// The reference model's configuration: the keys are part of the product's interface (server,
// runner, simulated board), so they are validated in one place with zod and defaults filled here.
import { z } from 'zod';
import { ModelConfigError } from './errors';

// Bounds keep every intermediate value of the model an exact integer in a double (below 2^53):
// |z| < 2^(32 + 8) and |x|, |y| < 2^(23 + 16 + 1).
const MAX_ANGLE_BITS = 32;
const MAX_OUT_BITS = 24;
const MAX_GUARD_BITS = 16;
const MAX_Z_GUARD_BITS = 8;
const MAX_ITERATIONS = 40;

const int = (min: number, max: number) => z.number().int().min(min).max(max);

/** The zod schema of a model configuration; parsing fills defaults. Unknown keys are refused. */
export const modelConfigSchema = z
  .strictObject({
    angleFormat: z.enum(['turn', 'rad']).default('turn'),
    angleBits: int(2, MAX_ANGLE_BITS).default(16),
    // Only meaningful for `rad`; the default (angleBits − 4) covers [−8, 8) rad ⊇ [−2π, 2π].
    angleFrac: int(0, MAX_ANGLE_BITS).optional(),
    outBits: int(2, MAX_OUT_BITS).default(16),
    outFrac: int(0, MAX_OUT_BITS - 1).default(14),
    iterations: int(1, MAX_ITERATIONS).default(16),
    guardBits: int(0, MAX_GUARD_BITS).default(2),
    zGuardBits: int(0, MAX_Z_GUARD_BITS).default(2),
    shiftRounding: z.enum(['floor', 'nearest']).default('floor'),
    outputRounding: z.enum(['truncate', 'nearest']).default('nearest'),
    fold: z.boolean().default(true),
  })
  .superRefine((c, ctx) => {
    if (c.outFrac >= c.outBits) {
      ctx.addIssue({ code: 'custom', path: ['outFrac'], message: `must be below outBits (${c.outBits})` });
    }
    if (c.angleFormat === 'rad' && c.angleFrac !== undefined && c.angleFrac > c.angleBits) {
      ctx.addIssue({ code: 'custom', path: ['angleFrac'], message: `must be at most angleBits (${c.angleBits})` });
    }
  })
  .transform((c) => ({
    angleFormat: c.angleFormat,
    angleBits: c.angleBits,
    angleFrac: c.angleFormat === 'rad' ? (c.angleFrac ?? Math.max(0, c.angleBits - 4)) : 0,
    outBits: c.outBits,
    outFrac: c.outFrac,
    iterations: c.iterations,
    guardBits: c.guardBits,
    zGuardBits: c.zGuardBits,
    shiftRounding: c.shiftRounding,
    outputRounding: c.outputRounding,
    fold: c.fold,
  }));

/** A complete model configuration, every key present (see docs/model.md). */
export type ModelConfig = z.output<typeof modelConfigSchema>;
/** What a caller may pass: any subset of the keys. */
export type ModelConfigInput = z.input<typeof modelConfigSchema>;

/** The default core: 16-bit binary angles, 16-bit outputs with 14 fraction bits, 16 iterations. */
export const DEFAULT_MODEL_CONFIG: Readonly<ModelConfig> = Object.freeze(modelConfigSchema.parse({}));

/**
 * Validates a configuration and fills its defaults.
 * @throws ModelConfigError naming the first key at fault.
 */
export function parseModelConfig(input: unknown): ModelConfig {
  const r = modelConfigSchema.safeParse(input);
  if (r.success) return r.data;
  const issue = r.error.issues[0];
  if (issue.code === 'unrecognized_keys') {
    throw new ModelConfigError(issue.keys[0] ?? 'config', 'is not a model configuration key');
  }
  const key = issue.path.length > 0 ? issue.path.map(String).join('.') : 'config';
  throw new ModelConfigError(key, issue.message);
}
