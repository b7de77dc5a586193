// The sessions API: what /api/sessions accepts and what it answers.
import { z } from 'zod';
import { limitsSchema } from '../link-engine/limits';
import type { ScoreSummary } from '../numeric/score';
import type { ToneFigures } from '../numeric/spectral';
import type { VectorScoreSummary } from '../vectoring';
import { conditionsSchema, CONDITION_RANGES, soakRecordSchema } from '../soak';
import { coreModeSchema } from './cores';
import { buildBrief, coreBrief, flag, id, isoDate, jsonObject, named, tags, text, typedObject } from './common';

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

// ——— Replies ———

/** One limit's outcome; `measured` and `pass` are null when the server could not measure it. */
export const limitOutcome = z.object({ limit: z.number(), measured: z.number().nullable(), pass: z.boolean().nullable() });
export type LimitOutcome = z.infer<typeof limitOutcome>;

/** Each limit the core set, judged; a limit the core does not set is absent. */
export const verdict = z.partialRecord(limitsSchema.keyof(), limitOutcome);
export type Verdict = z.infer<typeof verdict>;

/** Spectral figures of each channel of a coherent-tone session. */
export interface SessionSpectrum {
  cycles: number;
  cos: ToneFigures;
  sin: ToneFigures;
}
/**
 * The stored score: a rotation core's session holds the scorer's ScoreSummary (with the tone's
 * spectra); a vectoring core's holds `count` and `vectoring`, shared/vectoring's
 * VectorScoreSummary (docs/api.md, "Vectoring cores"). `{}` for a session stored without one.
 */
export type StoredStats = Partial<ScoreSummary> & { spectrum?: SessionSpectrum; vectoring?: VectorScoreSummary };
export const storedStats = typedObject<StoredStats>('stats');

/** What ran: the plan's `kind` and its own fields (see shared/numeric/plans.ts; imports add theirs). */
export const sessionPlan = z.looseObject({ kind: z.string().optional() });
export type SessionPlan = z.infer<typeof sessionPlan>;
/** How the samples reached the server: the bench page's link, the runner's, or an import. */
export const sessionTransport = z.looseObject({ kind: z.string().optional(), label: z.string().optional(), source: z.string().optional() });
export type SessionTransport = z.infer<typeof sessionTransport>;

/** A stored session's columns, without the sample and archive blobs. */
export const sessionRow = z.object({
  id: z.number().int(),
  coreId: z.number().int(),
  buildId: z.number().int().nullable(),
  boardId: z.number().int().nullable(),
  operatorId: z.number().int().nullable(),
  startedAt: isoDate,
  endedAt: isoDate.nullable(),
  plan: sessionPlan,
  transport: sessionTransport,
  deviceInfo: jsonObject.nullable(),
  stats: storedStats,
  verdict,
  /**
   * Largest |error| in LSB per 1/64 of the code range (-1: no answer there); for a vectoring core,
   * largest |angle error| in angle LSB per 1/64 turn of the input's direction. Null for old rows.
   */
  profile: z.array(z.number()).nullable(),
  passed: z.boolean(),
  regression: z.boolean(),
  sampleCount: z.number().int().min(0),
  notes: z.string(),
  tags: z.array(z.string()),
  createdAt: isoDate,
  updatedAt: isoDate,
});
export type SessionRow = z.infer<typeof sessionRow>;

/** A session as the list and the detail show it: its columns, the names of what it belongs to, whether an archive is kept. */
export const sessionListItem = sessionRow.extend({
  /** With its mode: a vectoring core's session has `stats.vectoring` and vectoring limits in its verdict. */
  core: coreBrief.extend({ mode: coreModeSchema.default('rotation') }),
  build: buildBrief.nullable(),
  board: named.nullable(),
  operator: named.nullable(),
  hasArchive: z.boolean(),
  /** Operating conditions (`{}` when none were recorded); a soak's passes and unstable codes (null: not a soak). Defaults keep older replies readable. */
  conditions: conditionsSchema.default({}),
  soakPasses: z.number().int().nullable().default(null),
  unstableCodes: z.number().int().nullable().default(null),
  /** The soak's books: in the detail only (null for a single pass). */
  soak: soakRecordSchema.nullable().optional(),
});
export type SessionListItem = z.infer<typeof sessionListItem>;

/** GET /api/sessions */
export const sessionPage = z.object({ items: z.array(sessionListItem), total: z.number().int().min(0), page: z.number().int(), pageSize: z.number().int() });
export type SessionPage = z.infer<typeof sessionPage>;

/** GET /api/sessions/:id */
export const sessionDetailReply = z.object({ session: sessionListItem });

/** PATCH /api/sessions/:id: the changed columns. */
export const sessionPatchReply = z.object({ session: sessionRow });

/** POST /api/sessions and /api/sessions/import: the server's own score and verdict of what it stored. */
export const sessionStoredReply = z.object({
  id: z.number().int(),
  /** The session's page (PUBLIC_URL when set, else the address the upload reached). */
  url: z.string(),
  passed: z.boolean(),
  regression: z.boolean(),
  verdict,
  stats: storedStats,
});
export type SessionStoredReply = z.infer<typeof sessionStoredReply>;
