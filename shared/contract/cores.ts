// The cores API: the cores under test, their link profile, model configuration and limits.
import { z } from 'zod';
import { limitsSchema } from '../link-engine/limits';
import { modelConfigSchema } from '../numeric/model-config';
import { isoDate, named } from './common';

/** How the bench talks to the core: the UART rate and the frame check (docs/protocol.md). */
export const linkProfileSchema = z.strictObject({
  baud: z.number().int().min(9_600).max(12_000_000).default(3_000_000),
  crc: z.enum(['CRC-8/SMBUS', 'CRC-8/MAXIM-DOW', 'CRC-8/DVB-S2', 'CRC-8/AUTOSAR']).default('CRC-8/SMBUS'),
});
export type LinkProfile = z.output<typeof linkProfileSchema>;
export type LinkProfileInput = z.input<typeof linkProfileSchema>;

const slug = z.string().regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'use lower-case letters, digits and single hyphens').max(64);

/** POST /api/cores: what is left out is the `reference-16` default. */
export const coreCreateBody = z.strictObject({
  name: z.string().trim().min(1).max(120),
  slug,
  linkProfile: linkProfileSchema.default(linkProfileSchema.parse({})),
  modelConfig: modelConfigSchema.default(modelConfigSchema.parse({})),
  limits: limitsSchema.default({}),
});
/** PATCH /api/cores/:id */
export const corePatchBody = z
  .strictObject({
    name: z.string().trim().min(1).max(120),
    slug,
    linkProfile: linkProfileSchema,
    modelConfig: modelConfigSchema,
    limits: limitsSchema,
    baselineSessionId: z.number().int().positive().nullable(),
  })
  .partial();

/** A core's row; its JSON columns are stored as their schemas parse them. */
export const coreRecord = z.object({
  id: z.number().int(),
  name: z.string(),
  slug: z.string(),
  linkProfile: linkProfileSchema,
  modelConfig: modelConfigSchema,
  limits: limitsSchema,
  baselineSessionId: z.number().int().nullable(),
  createdAt: isoDate,
  updatedAt: isoDate,
});
export type CoreRecord = z.output<typeof coreRecord>;

/** GET /api/cores */
export const coreListReply = z.object({ cores: z.array(coreRecord) });
/** POST /api/cores, PATCH /api/cores/:id */
export const coreReply = z.object({ core: coreRecord });
/** GET /api/cores/:id: with who hears of its regressions and whether the caller does. */
export const coreDetailReply = z.object({ core: coreRecord, watchers: z.array(named), watching: z.boolean() });
export type CoreDetailReply = z.output<typeof coreDetailReply>;
