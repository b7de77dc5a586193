// The cores API: the cores under test, their link profile, model configuration and limits.
import { z } from 'zod';
import { CORE_MODES, limitOutsideMode, limitsSchema, type CoreMode } from '../link-engine/limits';
import { modelConfigSchema } from '../numeric/model-config';
import { vectorConfigSchema } from '../vectoring/vector-config';
import { isoDate, named } from './common';

/** How the bench talks to the core: the UART rate and the frame check (docs/protocol.md). */
export const linkProfileSchema = z.strictObject({
  baud: z.number().int().min(9_600).max(12_000_000).default(3_000_000),
  crc: z.enum(['CRC-8/SMBUS', 'CRC-8/MAXIM-DOW', 'CRC-8/DVB-S2', 'CRC-8/AUTOSAR']).default('CRC-8/SMBUS'),
});
export type LinkProfile = z.output<typeof linkProfileSchema>;
export type LinkProfileInput = z.input<typeof linkProfileSchema>;

const slug = z.string().regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'use lower-case letters, digits and single hyphens').max(64);

/** What a core computes: `rotation` (cos/sin of an angle, the default) or `vectoring` (atan2 and magnitude of a vector). */
export const coreModeSchema = z.enum(CORE_MODES);

type Issue = { path: (string | number)[]; message: string };
/**
 * What is wrong with giving a core of `mode` these configuration and limit keys: a rotation core
 * has `modelConfig` and no `vectorConfig`, a vectoring core the other way round, and each sets
 * only its own mode's limits (shared/link-engine/limits.ts). The server checks a PATCH the same way.
 */
export function modeIssues(mode: CoreMode, body: { modelConfig?: unknown; vectorConfig?: unknown; limits?: Partial<Record<string, unknown>> }): Issue[] {
  const issues: Issue[] = [];
  if (mode === 'rotation' && body.vectorConfig !== undefined) {
    issues.push({ path: ['vectorConfig'], message: 'a rotation core has no vectoring configuration (a vectoring core is created with mode "vectoring")' });
  }
  if (mode === 'vectoring' && body.modelConfig !== undefined) {
    issues.push({ path: ['modelConfig'], message: 'a vectoring core has no rotation model configuration: give its configuration as vectorConfig' });
  }
  const limit = body.limits ? limitOutsideMode(mode, body.limits) : null;
  if (limit) issues.push({ path: ['limits', limit], message: `a limit of ${mode === 'rotation' ? 'vectoring' : 'rotation'} cores; a ${mode} core cannot set it` });
  return issues;
}

/**
 * POST /api/cores: what is left out is the `reference-16` default (a rotation core), or for
 * `mode: "vectoring"` the default vectoring configuration (docs/model.md, "Vectoring cores").
 */
export const coreCreateBody = z
  .strictObject({
    name: z.string().trim().min(1).max(120),
    slug,
    mode: coreModeSchema.default('rotation'),
    linkProfile: linkProfileSchema.default(linkProfileSchema.parse({})),
    modelConfig: modelConfigSchema.optional(),
    vectorConfig: vectorConfigSchema.optional(),
    limits: limitsSchema.default({}),
  })
  .superRefine((b, ctx) => {
    for (const issue of modeIssues(b.mode, b)) ctx.addIssue({ code: 'custom', ...issue });
  })
  .transform((b) =>
    b.mode === 'vectoring'
      ? { ...b, modelConfig: null, vectorConfig: b.vectorConfig ?? vectorConfigSchema.parse({}) }
      : { ...b, modelConfig: b.modelConfig ?? modelConfigSchema.parse({}), vectorConfig: null },
  );
/** PATCH /api/cores/:id: `mode` may be sent but not changed; the configuration is the core's mode's own. */
export const corePatchBody = z
  .strictObject({
    name: z.string().trim().min(1).max(120),
    slug,
    mode: coreModeSchema,
    linkProfile: linkProfileSchema,
    modelConfig: modelConfigSchema,
    vectorConfig: vectorConfigSchema,
    limits: limitsSchema,
    baselineSessionId: z.number().int().positive().nullable(),
  })
  .partial();
export type CorePatchBody = z.output<typeof corePatchBody>;

/** A core's row; its JSON columns are stored as their schemas parse them. */
export const coreRecord = z.object({
  id: z.number().int(),
  name: z.string(),
  slug: z.string(),
  /** Absent in replies of servers before vectoring cores: rotation. */
  mode: coreModeSchema.default('rotation'),
  linkProfile: linkProfileSchema,
  /** A rotation core's model configuration; null for a vectoring core. */
  modelConfig: modelConfigSchema.nullable(),
  /** A vectoring core's configuration (shared/vectoring); null for a rotation core. */
  vectorConfig: vectorConfigSchema.nullable().default(null),
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
