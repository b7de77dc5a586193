// The shapes of a core's JSON columns, checked on every write.
import { z } from 'zod';

const int = (min: number, max: number) => z.number().int().min(min).max(max);

/**
 * The reference model's configuration (the keys the numeric code and the simulated board use).
 * Parsing fills the defaults — the default is the `reference-16` core — and always yields every
 * key; angleFrac only matters for `rad` angles and defaults to angleBits − 4 there.
 */
export const modelConfigSchema = z
  .strictObject({
    angleFormat: z.enum(['turn', 'rad']).default('turn'),
    angleBits: int(4, 32).default(16),
    angleFrac: int(0, 32).optional(),
    outBits: int(4, 24).default(16),
    outFrac: int(0, 23).default(14),
    iterations: int(1, 32).default(16),
    guardBits: int(0, 8).default(2),
    zGuardBits: int(0, 8).default(2),
    shiftRounding: z.enum(['floor', 'nearest']).default('floor'),
    outputRounding: z.enum(['truncate', 'nearest']).default('nearest'),
    fold: z.boolean().default(true),
  })
  .superRefine((c, ctx) => {
    if (c.outFrac >= c.outBits) ctx.addIssue({ code: 'custom', path: ['outFrac'], message: `must be below outBits (${c.outBits})` });
    if (c.angleFrac !== undefined && c.angleFrac > c.angleBits) {
      ctx.addIssue({ code: 'custom', path: ['angleFrac'], message: `must be at most angleBits (${c.angleBits})` });
    }
  })
  .transform((c) => ({ ...c, angleFrac: c.angleFormat === 'rad' ? (c.angleFrac ?? Math.max(0, c.angleBits - 4)) : 0 }));

export type CoreModelConfig = z.output<typeof modelConfigSchema>;

/** How the bench talks to the core: the UART rate and the frame check (PROTOCOL.md). */
export const linkProfileSchema = z.strictObject({
  baud: int(9_600, 12_000_000).default(3_000_000),
  crc: z.enum(['CRC-8/SMBUS', 'CRC-8/MAXIM-DOW', 'CRC-8/DVB-S2', 'CRC-8/AUTOSAR']).default('CRC-8/SMBUS'),
});

const lsb = z.number().min(0).max(1e6);

/** Acceptance limits; a missing key is not checked. Errors are in output LSB, SFDR in dB. */
export const limitsSchema = z.strictObject({
  maxAbsErrorLsb: lsb.optional(),
  maxRmsErrorLsb: lsb.optional(),
  maxAbsBiasLsb: lsb.optional(),
  minSfdrDb: z.number().min(0).max(300).optional(),
  maxModelMismatches: z.number().int().min(0).optional(),
  maxLinkErrors: z.number().int().min(0).optional(),
  minCoveragePct: z.number().min(0).max(100).optional(),
});
