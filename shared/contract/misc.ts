// Comments, golden vectors, health and the admin pages' lists.
import { z } from 'zod';
import { isoDate, jsonObject, named } from './common';

/** POST /api/sessions/:id/comments */
export const commentBody = z.strictObject({ body: z.string().trim().min(1).max(10_000) });

export const comment = z.object({
  id: z.number().int(),
  sessionId: z.number().int(),
  authorId: z.number().int().nullable(),
  body: z.string(),
  createdAt: isoDate,
  updatedAt: isoDate,
});
export const commentWithAuthor = comment.extend({ author: named.nullable() });
export type SessionComment = z.infer<typeof commentWithAuthor>;
/** GET /api/sessions/:id/comments */
export const commentListReply = z.object({ comments: z.array(commentWithAuthor) });
/** POST /api/sessions/:id/comments */
export const commentReply = z.object({ comment });

/**
 * A golden-vector set, its rows summarised against the core's current model. For a vectoring core
 * `distinctCodes` counts distinct (x, y) pairs, `coverageShare` is over the 2^(2·inBits) pairs, and
 * the differing rows are in `firstVectorMismatches` (`firstMismatches` is empty).
 */
export const goldenVectorSet = z.object({
  id: z.number().int(),
  coreId: z.number().int(),
  name: z.string(),
  createdAt: isoDate,
  count: z.number().int(),
  distinctCodes: z.number().int(),
  /** Distinct codes over the size of the core's angle-code range (0..1). */
  coverageShare: z.number(),
  modelMismatches: z.number().int(),
  firstMismatches: z.array(z.object({ line: z.number().int(), code: z.number(), cos: z.number(), sin: z.number(), modelCos: z.number(), modelSin: z.number() })),
  firstVectorMismatches: z
    .array(z.object({ line: z.number().int(), x: z.number(), y: z.number(), angle: z.number(), magnitude: z.number(), modelAngle: z.number(), modelMagnitude: z.number() }))
    .optional(),
});
export type GoldenVectorSet = z.infer<typeof goldenVectorSet>;
/** GET /api/cores/:id/golden-vectors */
export const goldenVectorListReply = z.object({ sets: z.array(goldenVectorSet) });
/** POST /api/cores/:id/golden-vectors */
export const goldenVectorReply = z.object({ set: goldenVectorSet });

/** GET /api/health: 200 when the database answers, 503 (`degraded`) when it does not. */
export const healthReply = z.object({
  status: z.enum(['ok', 'degraded']),
  version: z.string(),
  database: z.looseObject({ status: z.enum(['ok', 'down']), dialect: z.string(), serverVersion: z.string().optional(), message: z.string().optional(), migrations: z.number().int() }),
  uptimeS: z.number(),
});
export type HealthReply = z.infer<typeof healthReply>;

export const auditEntry = z.object({
  id: z.number().int(),
  userId: z.number().int().nullable(),
  action: z.string(),
  entity: z.string(),
  entityId: z.number().int().nullable(),
  detail: jsonObject.nullable(),
  at: isoDate,
});
export type AuditEntry = z.infer<typeof auditEntry>;
/** GET /api/audit */
export const auditListReply = z.object({ entries: z.array(auditEntry), total: z.number().int() });

export const outboxMessage = z.object({
  id: z.number().int(),
  to: z.string(),
  from: z.string(),
  subject: z.string(),
  text: z.string(),
  html: z.string().nullable(),
  receivedAt: isoDate,
});
export type OutboxMessage = z.infer<typeof outboxMessage>;
/** GET /api/outbox */
export const outboxListReply = z.object({ messages: z.array(outboxMessage), total: z.number().int() });
