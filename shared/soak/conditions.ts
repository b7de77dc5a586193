// The operating conditions a session ran under: three named ones with units and ranges (typed
// columns on the server, so the sessions list filters them by range) and free-form name=value
// pairs for the rest (chamber, supply serial, airflow…).
import { z } from 'zod';

/**
 * Accepted ranges. Wide enough for any chamber or bench supply a lab uses, narrow enough to catch
 * a unit slip (mV for V, kHz for MHz). Common practice, no source: chambers reach about −70..+180 °C;
 * FPGA core supplies sit well under 5 V; fabric clocks under 2 GHz.
 */
export const CONDITION_RANGES = {
  temperature_c: { min: -70, max: 200, unit: '°C', label: 'Temperature' },
  vccint_v: { min: 0.1, max: 5, unit: 'V', label: 'Core supply' },
  clock_mhz: { min: 0.001, max: 2000, unit: 'MHz', label: 'Core clock' },
} as const;

export type NamedCondition = keyof typeof CONDITION_RANGES;
export const NAMED_CONDITIONS = Object.keys(CONDITION_RANGES) as NamedCondition[];

/** A free-form condition's name: lower-case, digits and underscores, as the named ones are. */
export const CONDITION_NAME = /^[a-z][a-z0-9_]{0,39}$/;
export const MAX_OTHER_CONDITIONS = 20;
const MAX_VALUE_CHARS = 100;

const named = (k: NamedCondition) => {
  const r = CONDITION_RANGES[k];
  return z
    .number({ error: `${k} must be a number (${r.unit})` })
    .finite()
    .min(r.min, `${k} must be at least ${r.min} ${r.unit}`)
    .max(r.max, `${k} must be at most ${r.max} ${r.unit}`);
};

export const conditionsSchema = z.strictObject({
  temperature_c: named('temperature_c').optional(),
  vccint_v: named('vccint_v').optional(),
  clock_mhz: named('clock_mhz').optional(),
  /** Free-form pairs; a name of a named condition is refused here (it has its own field). */
  other: z
    .record(
      z.string().regex(CONDITION_NAME, 'a condition name is lower-case letters, digits and _, starting with a letter, at most 40 characters'),
      z.string().trim().min(1, 'a condition value cannot be empty').max(MAX_VALUE_CHARS, `a condition value is at most ${MAX_VALUE_CHARS} characters`).regex(/^[\x20-\x7e]*$/, 'a condition value is printable ASCII'),
    )
    .refine((o) => Object.keys(o).length <= MAX_OTHER_CONDITIONS, `at most ${MAX_OTHER_CONDITIONS} free-form conditions`)
    .refine((o) => !Object.keys(o).some((k) => k in CONDITION_RANGES), 'temperature_c, vccint_v and clock_mhz are numbers in their own fields')
    .optional(),
});
export type Conditions = z.infer<typeof conditionsSchema>;

export class ConditionError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ConditionError';
  }
}

/** Validate conditions from any source; the error names the first problem in one line. */
export function parseConditions(input: unknown): Conditions {
  const r = conditionsSchema.safeParse(input);
  if (r.success) return r.data;
  const issue = r.error.issues[0];
  const where = issue.path.map(String).join('.');
  throw new ConditionError(where && !issue.message.startsWith(where) ? `${where}: ${issue.message}` : issue.message);
}

/**
 * One `name=value` text, as typed after --condition or in the save form. Named conditions must
 * be numbers in range; anything else is a free-form pair kept as text.
 */
export function parseConditionText(text: string): { name: string; value: number | string } {
  const eq = text.indexOf('=');
  if (eq <= 0) throw new ConditionError(`a condition is name=value (e.g. temperature_c=85), got "${text}"`);
  const name = text.slice(0, eq).trim();
  const value = text.slice(eq + 1).trim();
  if (!CONDITION_NAME.test(name)) throw new ConditionError(`condition name "${name}" must be lower-case letters, digits and _, starting with a letter`);
  if (value === '') throw new ConditionError(`condition ${name} has no value`);
  if (name in CONDITION_RANGES) {
    const k = name as NamedCondition;
    const r = CONDITION_RANGES[k];
    const n = Number(value);
    if (!/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(value) || !Number.isFinite(n)) throw new ConditionError(`${k} must be a number in ${r.unit}, got "${value}"`);
    if (n < r.min || n > r.max) throw new ConditionError(`${k} must be ${r.min}..${r.max} ${r.unit}, got ${value}`);
    return { name, value: n };
  }
  return { name, value };
}

/** Several `name=value` texts into one Conditions; a name given twice is an error. */
export function conditionsFromTexts(texts: readonly string[]): Conditions {
  const out: Record<string, unknown> = {};
  const other: Record<string, string> = {};
  const seen = new Set<string>();
  for (const t of texts) {
    const { name, value } = parseConditionText(t);
    if (seen.has(name)) throw new ConditionError(`condition ${name} is given twice`);
    seen.add(name);
    if (typeof value === 'number') out[name] = value;
    else other[name] = value;
  }
  if (Object.keys(other).length > 0) out.other = other;
  return parseConditions(out);
}

/** Conditions as `name=value` texts, named ones first: for INFO names, reports and forms. */
export function conditionTexts(c: Conditions): string[] {
  const out: string[] = [];
  for (const k of NAMED_CONDITIONS) if (c[k] !== undefined) out.push(`${k}=${c[k]}`);
  for (const [k, v] of Object.entries(c.other ?? {})) out.push(`${k}=${v}`);
  return out;
}

/** Later conditions win name by name (e.g. the runner's --condition over what the board reported). */
export function mergeConditions(base: Conditions, over: Conditions): Conditions {
  const other = { ...(base.other ?? {}), ...(over.other ?? {}) };
  const merged: Conditions = { ...base, ...over };
  if (Object.keys(other).length > 0) merged.other = other;
  else delete merged.other;
  return merged;
}

export const isEmptyConditions = (c: Conditions) => conditionTexts(c).length === 0;

/** A condition's value by name: named ones as numbers, free-form ones as numbers when they read as one. */
export function conditionValue(c: Conditions, name: string): number | null {
  if (name in CONDITION_RANGES) return c[name as NamedCondition] ?? null;
  const v = c.other?.[name];
  if (v === undefined) return null;
  const n = Number(v);
  return v.trim() !== '' && Number.isFinite(n) ? n : null;
}

/** The caution shown once wherever conditions are entered. */
export const CONDITIONS_CAUTION =
  'Driving a board outside its rated temperature, supply or clock can damage it or its supply. Follow the board and device vendors’ ratings and your lab’s own rules for chambers and bench supplies.';
