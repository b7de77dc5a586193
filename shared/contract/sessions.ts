// The sessions API: what /api/sessions accepts.
import { z } from 'zod';
import { flag, id, jsonObject, tags, text } from './common';
import { conditionsSchema, CONDITION_RANGES, soakRecordSchema } from '../soak';

/**
 * The `session` part of an upload. The runner also sends its own `stats`, `verdict`, `passed`
 * and `sampleCount`: they are accepted so its uploads are not refused, and ignored — the server
 * scores the samples itself. `build` and `board` are the runner's labels, looked up by name.
 */
export const sessionUploadPart = z
  .strictObject({
    coreId: id.optional(),
    coreSlug: text(80).min(1).optional(),
    buildId: id.nullish(),
    boardId: id.nullish(),
    build: text(120).nullish(),
    board: text(120).nullish(),
    startedAt: z.coerce.date(),
    endedAt: z.coerce.date().nullish(),
    plan: jsonObject,
    transport: jsonObject,
    deviceInfo: jsonObject.nullish(),
    notes: text(10_000).default(''),
    tags: tags.default([]),
    link: jsonObject.optional(),
    /** Operating conditions (shared/soak/conditions.ts) and, for a soak, its books. */
    conditions: conditionsSchema.optional(),
    soak: soakRecordSchema.optional(),
    stats: z.unknown().optional(),
    verdict: z.unknown().optional(),
    passed: z.unknown().optional(),
    sampleCount: z.unknown().optional(),
  })
  .refine((s) => s.coreId !== undefined || s.coreSlug !== undefined, { path: ['coreId'], message: 'coreId or coreSlug is required' });
export type SessionUploadPart = z.infer<typeof sessionUploadPart>;

/** The `session` part of an import: where the results belong; what ran is read from the file. */
export const sessionImportPart = z
  .strictObject({
    coreId: id.optional(),
    coreSlug: text(80).min(1).optional(),
    buildId: id.nullish(),
    boardId: id.nullish(),
    startedAt: z.coerce.date().optional(),
    notes: text(10_000).default(''),
    tags: tags.default([]),
  })
  .refine((s) => s.coreId !== undefined || s.coreSlug !== undefined, { path: ['coreId'], message: 'coreId or coreSlug is required' });
export type SessionImportPart = z.infer<typeof sessionImportPart>;

/** Condition filter names of the list, each a bound of one named condition's range. */
export const CONDITION_FILTERS = {
  temperatureMin: ['temperature_c', 'min'],
  temperatureMax: ['temperature_c', 'max'],
  vccintMin: ['vccint_v', 'min'],
  vccintMax: ['vccint_v', 'max'],
  clockMin: ['clock_mhz', 'min'],
  clockMax: ['clock_mhz', 'max'],
} as const;
export type ConditionFilter = keyof typeof CONDITION_FILTERS;

function conditionRangeFilters() {
  const bound = (name: keyof typeof CONDITION_RANGES) => z.coerce.number().min(CONDITION_RANGES[name].min).max(CONDITION_RANGES[name].max).optional();
  return Object.fromEntries(Object.entries(CONDITION_FILTERS).map(([key, [name]]) => [key, bound(name)])) as Record<ConditionFilter, ReturnType<typeof bound>>;
}

/** GET /api/sessions: filters, order and page. */
export const sessionListQuery = z.strictObject({
  coreId: id.optional(),
  buildId: id.optional(),
  boardId: id.optional(),
  operatorId: id.optional(),
  passed: flag.optional(),
  regression: flag.optional(),
  tag: text(40).min(1).optional(),
  from: z.coerce.date().optional(),
  to: z.coerce.date().optional(),
  ...conditionRangeFilters(),
  sort: z.enum(['startedAt', '-startedAt', 'id', '-id']).default('-startedAt'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});
export type SessionListQuery = z.infer<typeof sessionListQuery>;

/** PATCH /api/sessions/:id — what an engineer may change; `baseline: true` makes it its core's baseline. */
export const sessionPatchBody = z.strictObject({
  notes: text(10_000).optional(),
  tags: tags.optional(),
  baseline: z.literal(true).optional(),
});
export type SessionPatchBody = z.infer<typeof sessionPatchBody>;
