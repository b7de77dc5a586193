// The configuration of a vectoring-mode CORDIC core ((x, y) in, atan2 and magnitude out). The keys
// are part of the product's interface, like the rotation model's: validated here with zod, defaults
// filled here, every key documented in docs/model.md ("Vectoring cores").
import { z } from 'zod';
import { ModelConfigError } from '../numeric/errors';

// Bounds keep every intermediate value of the model an exact integer in a double (below 2^53):
// - x/y: the inputs carry inBits + guardBits bits; the iterations grow a vector by at most
//   A_n·√2 < 2.33 < 4 (the CORDIC growth times the diagonal), so |x|, |y| < 2^(inBits + guardBits + 1)
//   ≤ 2^41 with the bounds below;
// - the gain-compensating multiply: |x| · C < 2^(inBits + guardBits + 1 + gainBits), so the three
//   widths are limited together (MAX_PRODUCT_BITS, checked in superRefine);
// - z: |z| stays below a turn plus Σ atan 2^−i < 2^(32 + 8 + 1).
const MAX_IN_BITS = 24;
const MAX_GUARD_BITS = 16;
const MAX_Z_GUARD_BITS = 8;
// 31, not 32: answers land in Int32Array columns, which cannot hold a 32-bit unsigned binary angle.
const MAX_ANGLE_BITS = 31;
const MAX_MAG_BITS = 32;
const MAX_GAIN_BITS = 32;
const MAX_ITERATIONS = 40;
/** inBits + guardBits + gainBits: the product then stays below 2^52, leaving room for the rounding add. */
export const MAX_PRODUCT_BITS = 51;

const int = (min: number, max: number) => z.number().int().min(min).max(max);

/** The zod schema of a vectoring core's configuration; parsing fills defaults. Unknown keys are refused. */
export const vectorConfigSchema = z
  .strictObject({
    inBits: int(2, MAX_IN_BITS).default(16),
    // Default inBits − 2: inputs span [−2, 2), so a unit vector fits with room for a little more.
    inFrac: int(0, MAX_IN_BITS - 1).optional(),
    iterations: int(1, MAX_ITERATIONS).default(16),
    guardBits: int(0, MAX_GUARD_BITS).default(2),
    zGuardBits: int(0, MAX_Z_GUARD_BITS).default(2),
    shiftRounding: z.enum(['floor', 'nearest']).default('floor'),
    outputRounding: z.enum(['truncate', 'nearest']).default('nearest'),
    prerotation: z.enum(['none', 'half-turn', 'quadrant']).default('half-turn'),
    gainCompensation: z.enum(['none', 'multiply']).default('none'),
    gainBits: int(2, MAX_GAIN_BITS).default(16),
    gainRounding: z.enum(['truncate', 'nearest']).default('nearest'),
    // Defaults inBits + 2 and inFrac: the uncompensated magnitude of the largest input is
    // A_n·√2 < 2.33 < 4 times the input's full scale, two more integer bits.
    magBits: int(2, MAX_MAG_BITS).optional(),
    magFrac: int(0, MAX_MAG_BITS - 1).optional(),
    angleFormat: z.enum(['turn', 'rad']).default('turn'),
    angleBits: int(2, MAX_ANGLE_BITS).default(16),
    // Only meaningful for `rad`; the default (angleBits − 3) covers [−4, 4) rad ⊇ [−π, π].
    angleFrac: int(0, MAX_ANGLE_BITS).optional(),
    zeroVector: z.enum(['zero', 'iterate']).default('zero'),
  })
  .transform((c) => {
    const inFrac = c.inFrac ?? Math.max(0, c.inBits - 2);
    const magBits = c.magBits ?? Math.min(MAX_MAG_BITS, c.inBits + 2);
    return {
      inBits: c.inBits,
      inFrac,
      iterations: c.iterations,
      guardBits: c.guardBits,
      zGuardBits: c.zGuardBits,
      shiftRounding: c.shiftRounding,
      outputRounding: c.outputRounding,
      prerotation: c.prerotation,
      gainCompensation: c.gainCompensation,
      gainBits: c.gainBits,
      gainRounding: c.gainRounding,
      magBits,
      magFrac: c.magFrac ?? Math.min(inFrac, magBits - 1),
      angleFormat: c.angleFormat,
      angleBits: c.angleBits,
      angleFrac: c.angleFormat === 'rad' ? (c.angleFrac ?? Math.max(0, c.angleBits - 3)) : 0,
      zeroVector: c.zeroVector,
    };
  })
  .superRefine((c, ctx) => {
    const fail = (key: string, message: string) => ctx.addIssue({ code: 'custom', path: [key], message });
    if (c.inFrac >= c.inBits) fail('inFrac', `must be below inBits (${c.inBits})`);
    if (c.magFrac >= c.magBits) fail('magFrac', `must be below magBits (${c.magBits})`);
    if (c.angleFormat === 'rad' && c.angleFrac > c.angleBits) fail('angleFrac', `must be at most angleBits (${c.angleBits})`);
    if (c.gainCompensation === 'multiply' && c.inBits + c.guardBits + c.gainBits > MAX_PRODUCT_BITS) {
      fail('gainBits', `inBits + guardBits + gainBits must be at most ${MAX_PRODUCT_BITS} (the product must stay exact), got ${c.inBits + c.guardBits + c.gainBits}`);
    }
  });

/** A complete vectoring configuration, every key present (see docs/model.md, "Vectoring cores"). */
export type VectorConfig = z.output<typeof vectorConfigSchema>;
/** What a caller may pass: any subset of the keys. */
export type VectorConfigInput = z.input<typeof vectorConfigSchema>;

/** The default vectoring core: 16-bit x/y with 14 fraction bits, 16 iterations, 16-bit binary angles. */
export const DEFAULT_VECTOR_CONFIG: Readonly<VectorConfig> = Object.freeze(vectorConfigSchema.parse({}));

/**
 * Validates a vectoring configuration and fills its defaults.
 * @throws ModelConfigError naming the first key at fault.
 */
export function parseVectorConfig(input: unknown): VectorConfig {
  const r = vectorConfigSchema.safeParse(input);
  if (r.success) return r.data;
  const issue = r.error.issues[0];
  if (issue.code === 'unrecognized_keys') {
    throw new ModelConfigError(issue.keys[0] ?? 'config', 'is not a vectoring configuration key');
  }
  const key = issue.path.length > 0 ? issue.path.map(String).join('.') : 'config';
  throw new ModelConfigError(key, issue.message);
}

/** The x/y input codes the format can hold: −2^(inBits−1) .. 2^(inBits−1) − 1. */
export function inputRange(c: Pick<VectorConfig, 'inBits'>): { min: number; max: number } {
  return { min: -(2 ** (c.inBits - 1)), max: 2 ** (c.inBits - 1) - 1 };
}
