// What a saved session keeps of its soak, validated wherever it crosses a boundary (the upload,
// the session detail): the spec, the whole soak's totals, the timeline and the unstable codes.
import { z } from 'zod';
import { MAX_SOAK_MS, MAX_SOAK_PASSES } from './soak-spec';
import type { SoakRecord } from './soak-accumulator';

const count = z.number().int().min(0);
const ms = z.number().min(0);
const lsb = z.number().min(0).nullable();
const code = z.number().int();

export const soakSpecSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('passes'), passes: z.number().int().min(1).max(MAX_SOAK_PASSES) }),
  z.strictObject({ kind: z.literal('duration'), ms: z.number().int().min(1000).max(MAX_SOAK_MS) }),
]);

const point = z.strictObject({
  pass: z.number().int().min(1),
  passes: z.number().int().min(1),
  atMs: ms,
  elapsedMs: ms,
  answered: count,
  missing: count,
  mismatches: count,
  checkFailures: count,
  retries: count,
  linkErrors: count,
  newUnstable: count,
  unstableCodes: count,
  maxAbsErrorLsb: lsb,
});

const answer = z.strictObject({ cos: code, sin: code, count: z.number().int().min(1) });

export const soakRecordSchema = z.strictObject({
  spec: soakSpecSchema,
  summary: z.strictObject({
    passes: z.number().int().min(1),
    elapsedMs: ms,
    codesPerPass: count,
    answered: count,
    missing: count,
    mismatches: count,
    passesWithMismatches: count,
    checkFailures: count,
    retries: count,
    linkErrors: count,
    unstableCodes: count,
    maxAbsErrorLsb: lsb,
  }),
  timeline: z.array(point).max(1024),
  unstable: z
    .strictObject({
      count,
      listed: count,
      codes: z
        .array(z.strictObject({ code, index: count, firstPass: z.number().int().min(2), answers: z.array(answer).min(2).max(64), otherAnswers: count }))
        .max(4096),
    })
    .refine((u) => u.codes.length === u.listed && u.listed <= u.count, 'unstable.listed must be the number of codes listed, at most unstable.count'),
}).refine((r) => r.summary.unstableCodes === r.unstable.count, 'summary.unstableCodes must equal unstable.count');

export function parseSoakRecord(input: unknown): SoakRecord {
  return soakRecordSchema.parse(input) as SoakRecord;
}
