// Small pieces every part of the API contract uses.
import { z } from 'zod';

/**
 * A row id: a positive integer. Path and query strings must be plain decimal digits: a bare
 * coercion would also read "0x10" as 16, "1e1" as 10 and " 7" as 7.
 */
export const id = z.preprocess((v) => (typeof v === 'string' && /^\d+$/.test(v) ? Number(v) : v), z.number().int().positive().max(Number.MAX_SAFE_INTEGER));
export const idParams = z.strictObject({ id });

/** Free text, trimmed, at most `max` characters. */
export const text = (max: number) => z.string().trim().max(max);

/** A query-string flag: exactly `true` or `false`. */
export const flag = z.enum(['true', 'false']).transform((v) => v === 'true');

/** A date as JSON carries it: an ISO 8601 string (Date objects are serialized to it). */
export const isoDate = z.iso.datetime({ offset: true });

/** A JSON object whose keys the API does not fix. */
export const jsonObject = z.record(z.string(), z.unknown());

/** A session's tags: at most 20, each 1–40 characters. */
export const tags = z.array(text(40).min(1)).max(20);

/** Another row as a reply names it. */
export const named = z.object({ id: z.number().int(), name: z.string() });
export type Named = z.infer<typeof named>;
export const coreBrief = z.object({ id: z.number().int(), name: z.string(), slug: z.string() });
export const buildBrief = z.object({ id: z.number().int(), label: z.string() });

/** An object column checked only for being an object, typed as `T` (its shape is owned elsewhere). */
export const typedObject = <T extends object>(what: string) =>
  z.custom<T>((v) => typeof v === 'object' && v !== null && !Array.isArray(v), { message: `${what}: expected an object` });

/** Every failure, whatever its status: `{ error: { code, message, details? } }` (docs/api.md). */
export const errorReply = z.object({ error: z.object({ code: z.string(), message: z.string(), details: z.unknown().optional() }) });
export type ErrorReply = z.infer<typeof errorReply>;
