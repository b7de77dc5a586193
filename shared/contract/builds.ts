// The builds API: bitstreams of a core, their files and their reviews.
import { z } from 'zod';
import { coreBrief, id, isoDate, named, text } from './common';

/** See server/services/build-status.ts for the rules. */
export const buildStatus = z.enum(['untested', 'passing', 'failing', 'approved', 'rejected']);
export type BuildStatus = z.infer<typeof buildStatus>;

/** POST /api/builds */
export const buildCreateBody = z.strictObject({
  coreId: id,
  label: text(120).min(1),
  sourceRevision: text(80),
  toolVersion: text(80),
  clockMHz: z.number().positive().max(10_000),
  notes: text(10_000).default(''),
});
/** PATCH /api/builds/:id */
export const buildPatchBody = buildCreateBody.omit({ coreId: true }).partial();
/** GET /api/builds: of one core, or of all. */
export const buildListQuery = z.strictObject({ coreId: id.optional() });
/** POST /api/builds/:id/reviews */
export const reviewBody = z.strictObject({ decision: z.enum(['approve', 'reject']), note: text(10_000).default('') });

export const buildRow = z.object({
  id: z.number().int(),
  coreId: z.number().int(),
  label: z.string(),
  sourceRevision: z.string(),
  toolVersion: z.string(),
  clockMHz: z.number(),
  notes: z.string(),
  fileName: z.string().nullable(),
  fileSize: z.number().int().nullable(),
  sha256: z.string().nullable(),
  createdById: z.number().int().nullable(),
  createdAt: isoDate,
  updatedAt: isoDate,
});
export type BuildRow = z.infer<typeof buildRow>;

/** A build as the list and the detail show it: with its core, author and standing. */
export const buildRecord = buildRow.extend({
  core: coreBrief,
  createdBy: named.nullable(),
  status: buildStatus,
  sessionCount: z.number().int().min(0),
  /** When the latest session ran, null without sessions. */
  lastSessionAt: isoDate.nullable(),
});
export type BuildRecord = z.infer<typeof buildRecord>;

export const review = z.object({
  id: z.number().int(),
  buildId: z.number().int(),
  reviewerId: z.number().int().nullable(),
  decision: z.enum(['approve', 'reject']),
  note: z.string(),
  createdAt: isoDate,
  updatedAt: isoDate,
});
export const reviewWithReviewer = review.extend({ reviewer: named.nullable() });
export type Review = z.infer<typeof reviewWithReviewer>;

/** Other builds holding a file with the same SHA-256. */
const duplicates = z.array(z.object({ id: z.number().int(), label: z.string() }));

/** GET /api/builds */
export const buildListReply = z.object({ builds: z.array(buildRecord) });
/** GET /api/builds/:id */
export const buildDetailReply = z.object({
  build: buildRecord.extend({ duplicates }),
  reviews: z.array(reviewWithReviewer),
  standing: z.enum(['approve', 'reject', 'unreviewed']),
});
export type BuildDetailReply = z.infer<typeof buildDetailReply>;
/** POST /api/builds, PATCH /api/builds/:id */
export const buildReply = z.object({ build: buildRow });
/** POST /api/builds/:id/file */
export const buildFileReply = z.object({ build: buildRow, duplicates });
/** GET /api/builds/:id/reviews */
export const reviewListReply = z.object({ reviews: z.array(reviewWithReviewer) });
/** POST /api/builds/:id/reviews */
export const reviewReply = z.object({ review, mailed: z.boolean() });
/** POST /api/builds/:id/request-review */
export const reviewRequestReply = z.object({ reviewers: z.number().int(), mailed: z.boolean() });
