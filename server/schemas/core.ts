// The shapes of a core's JSON columns, checked on every write.
import { z } from 'zod';

const int = (min: number, max: number) => z.number().int().min(min).max(max);

// The reference model's configuration is the numeric core's own schema (the keys the model, the
// runner and the simulated board share); parsing fills the defaults — the `reference-16` core.
// Imported from its module rather than the package index so the server depends only on
// committed numeric code.
export { modelConfigSchema, type ModelConfig as CoreModelConfig } from '../../shared/numeric/model-config';

/** How the bench talks to the core: the UART rate and the frame check (docs/protocol.md). */
export const linkProfileSchema = z.strictObject({
  baud: int(9_600, 12_000_000).default(3_000_000),
  crc: z.enum(['CRC-8/SMBUS', 'CRC-8/MAXIM-DOW', 'CRC-8/DVB-S2', 'CRC-8/AUTOSAR']).default('CRC-8/SMBUS'),
});

export { limitsSchema } from '../../shared/link-engine/limits';
