// The core form: every number is typed as text, then checked by the same zod schemas the server
// uses (shared/numeric/model-config.ts, shared/link-engine/limits.ts), so the bounds live in one place.
import { z } from 'zod';
import { limitsSchema, type LimitKey, type Limits } from '../../../../shared/link-engine/limits';
import { modelConfigSchema, type ModelConfigInput } from '../../../../shared/numeric/model-config';
import type { CoreRecord, LinkProfile } from '../../../lib/resources/cores';
import { LIMIT_KEYS } from './core-meanings';

// As linkProfileSchema in server/schemas/core.ts (the server checks them again).
export const CRC_VARIANTS = ['CRC-8/SMBUS', 'CRC-8/MAXIM-DOW', 'CRC-8/DVB-S2', 'CRC-8/AUTOSAR'] as const;
const BAUD_MIN = 9_600;
const BAUD_MAX = 12_000_000;

const INT_KEYS = ['angleBits', 'angleFrac', 'outBits', 'outFrac', 'iterations', 'guardBits', 'zGuardBits'] as const;
type IntKey = (typeof INT_KEYS)[number];

export const coreFormSchema = z
  .object({
    name: z.string().trim().min(1, 'Give the core a name').max(120, 'At most 120 characters'),
    slug: z.string().regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Lower-case letters, digits and single hyphens, e.g. mixer-nco-18').max(64, 'At most 64 characters'),
    baud: z.string(),
    crc: z.enum(CRC_VARIANTS),
    angleFormat: z.enum(['turn', 'rad']),
    ...(Object.fromEntries(INT_KEYS.map((k) => [k, z.string()])) as Record<IntKey, z.ZodString>),
    shiftRounding: z.enum(['floor', 'nearest']),
    outputRounding: z.enum(['truncate', 'nearest']),
    fold: z.boolean(),
    limits: z.object(Object.fromEntries(LIMIT_KEYS.map((k) => [k, z.string()])) as Record<LimitKey, z.ZodString>),
  })
  .superRefine((v, ctx) => {
    for (const issue of toPayload(v).issues) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
  });

export type CoreFormValues = z.infer<typeof coreFormSchema>;

/** What POST /api/cores takes (PATCH takes any part of it). */
export interface CorePayload {
  name: string;
  slug: string;
  linkProfile: LinkProfile;
  modelConfig: ModelConfigInput;
  limits: Limits;
}

export interface Issue {
  path: (string | number)[];
  message: string;
}

/** zod's issue in plain words. */
function plain(issue: z.core.$ZodIssue): string {
  if (issue.code === 'too_small') return `Must be at least ${String(issue.minimum)}`;
  if (issue.code === 'too_big') return `Must be at most ${String(issue.maximum)}`;
  if (issue.code === 'invalid_type' && issue.expected === 'int') return 'Must be a whole number';
  return issue.message.charAt(0).toUpperCase() + issue.message.slice(1);
}

// "3,000,000" or "3 000 000" is grouped thousands; "0,5" is not read as 5 but refused.
const GROUPED = /^[+-]?[1-9]\d{0,2}([,_ ]\d{3})+(\.\d+)?$/;
const PLAIN = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

/** Text to number; blank is `undefined`, anything else not a number is an issue. */
export function readNumber(text: string, path: Issue['path'], issues: Issue[]): number | undefined {
  const t = text.trim();
  if (t === '') return undefined;
  const plain = GROUPED.test(t) ? t.replace(/[,_ ]/g, '') : t;
  if (!PLAIN.test(plain)) {
    issues.push({ path, message: t.includes(',') ? 'Enter a number, with a point for decimals' : 'Enter a number' });
    return undefined;
  }
  return Number(plain);
}

/** The form's text as the API's JSON, with every problem found, each at its field. */
export function toPayload(v: CoreFormValues): { payload: CorePayload; issues: Issue[] } {
  const issues: Issue[] = [];
  const baud = readNumber(v.baud, ['baud'], issues);
  if (baud === undefined) issues.push({ path: ['baud'], message: 'Enter the line rate' });
  else if (!Number.isInteger(baud) || baud < BAUD_MIN || baud > BAUD_MAX) issues.push({ path: ['baud'], message: `A whole number from ${BAUD_MIN.toLocaleString('en-US')} to ${BAUD_MAX.toLocaleString('en-US')}` });

  const model: Record<string, unknown> = { angleFormat: v.angleFormat, shiftRounding: v.shiftRounding, outputRounding: v.outputRounding, fold: v.fold };
  for (const k of INT_KEYS) {
    if (k === 'angleFrac' && v.angleFormat !== 'rad') continue;
    const n = readNumber(v[k], [k], issues);
    if (n === undefined && k !== 'angleFrac') issues.push({ path: [k], message: 'Enter a value' });
    if (n !== undefined) model[k] = n;
  }
  const modelCheck = modelConfigSchema.safeParse(model);
  if (!modelCheck.success) for (const i of modelCheck.error.issues) issues.push({ path: i.path.map((p) => (typeof p === 'symbol' ? String(p) : p)), message: plain(i) });

  const limits: Record<string, number> = {};
  for (const k of LIMIT_KEYS) {
    const n = readNumber(v.limits[k], ['limits', k], issues);
    if (n !== undefined) limits[k] = n;
  }
  const limitCheck = limitsSchema.safeParse(limits);
  if (!limitCheck.success) for (const i of limitCheck.error.issues) issues.push({ path: ['limits', ...i.path.map((p) => (typeof p === 'symbol' ? String(p) : p))], message: plain(i) });

  // Keep only the first problem of each field: "enter a number" says more than the schema after it.
  const seen = new Set<string>();
  const unique = issues.filter((i) => !seen.has(i.path.join('.')) && seen.add(i.path.join('.')));
  return {
    payload: { name: v.name.trim(), slug: v.slug, linkProfile: { baud: baud ?? 0, crc: v.crc }, modelConfig: model as ModelConfigInput, limits },
    issues: unique,
  };
}

const text = (n: number | undefined) => (n === undefined ? '' : String(n));

/** A stored core as form text; `null` gives the defaults of a new core (the server's own). */
export function formValuesOf(core: CoreRecord | null): CoreFormValues {
  const m = core?.modelConfig ?? modelConfigSchema.parse({});
  const l: Limits = core?.limits ?? {};
  return {
    name: core?.name ?? '',
    slug: core?.slug ?? '',
    baud: text(core?.linkProfile.baud ?? 3_000_000),
    crc: (CRC_VARIANTS as readonly string[]).includes(core?.linkProfile.crc ?? '') ? (core!.linkProfile.crc as CoreFormValues['crc']) : 'CRC-8/SMBUS',
    angleFormat: m.angleFormat,
    angleBits: text(m.angleBits),
    angleFrac: m.angleFormat === 'rad' ? text(m.angleFrac) : '',
    outBits: text(m.outBits),
    outFrac: text(m.outFrac),
    iterations: text(m.iterations),
    guardBits: text(m.guardBits),
    zGuardBits: text(m.zGuardBits),
    shiftRounding: m.shiftRounding,
    outputRounding: m.outputRounding,
    fold: m.fold,
    limits: Object.fromEntries(LIMIT_KEYS.map((k) => [k, text(l[k])])) as Record<LimitKey, string>,
  };
}
