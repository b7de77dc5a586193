// The plan form's fields, turned into a plan of the numeric core. Angles may be typed in degrees,
// radians, turns or raw codes; lists are pasted with commas, spaces or new lines between.
import { z } from 'zod';
import { assertAngleCode, degreesToAngleCode, radiansToAngleCode, turnsToAngleCode, type AngleFormat, type Plan } from '../../../../shared/numeric';
import { parseSoakSpec, SoakSpecError, type SoakSpec } from '../../../../shared/soak';

export const PLAN_KINDS = [
  ['exhaustive', 'Every code'],
  ['sweep', 'Sweep'],
  ['one', 'One angle'],
  ['list', 'Pasted list'],
  ['random', 'Seeded random'],
  ['edges', 'Edge set'],
  ['tone', 'Coherent tone'],
] as const;
export const ANGLE_UNITS = [
  ['deg', 'degrees'],
  ['rad', 'radians'],
  ['turn', 'turns'],
  ['code', 'raw code'],
] as const;

export const planFormSchema = z.object({
  kind: z.enum(['exhaustive', 'sweep', 'one', 'list', 'random', 'edges', 'tone']),
  unit: z.enum(['deg', 'rad', 'turn', 'code']),
  angle: z.string(),
  list: z.string(),
  start: z.string(),
  step: z.string(),
  count: z.string(),
  seed: z.string(),
  cycles: z.string(),
  samples: z.string(),
  /** Blank for one pass; else a soak in the runner's --soak grammar. */
  soak: z.string(),
});
export type PlanForm = z.infer<typeof planFormSchema>;

export const defaultPlanForm: PlanForm = { kind: 'exhaustive', unit: 'deg', angle: '30', list: '0, 45, 90', start: '0', step: '1', count: '4096', seed: '1', cycles: '127', samples: '4096', soak: '' };

export class PlanFieldError extends Error {
  constructor(
    readonly field: keyof PlanForm,
    message: string,
  ) {
    super(message);
  }
}

// Numbers as people type them. Number() alone would also take "", "0x10", "0b1" and "Infinity".
const DECIMAL = /^[+-]?(\d+(\.\d*)?|\.\d+)(e[+-]?\d+)?$/i;
const WHOLE = /^[+-]?\d+$/;

function toCode(f: AngleFormat, unit: PlanForm['unit'], text: string, field: keyof PlanForm): number {
  const t = text.trim();
  if (t === '') throw new PlanFieldError(field, 'Type an angle');
  if (!DECIMAL.test(t)) throw new PlanFieldError(field, `“${t}” is not a number`);
  const v = Number(t);
  if (!Number.isFinite(v)) throw new PlanFieldError(field, `“${t}” is too large`);
  try {
    if (unit === 'code') {
      assertAngleCode(f, v);
      return v;
    }
    return unit === 'deg' ? degreesToAngleCode(f, v) : unit === 'rad' ? radiansToAngleCode(f, v) : turnsToAngleCode(f, v);
  } catch (e) {
    throw new PlanFieldError(field, (e as Error).message);
  }
}

function int(text: string, field: keyof PlanForm, min: number, max: number): number {
  const t = text.trim();
  const v = WHOLE.test(t) ? Number(t) : NaN;
  if (!Number.isSafeInteger(v) || v < min || v > max) throw new PlanFieldError(field, `A whole number from ${min.toLocaleString('en-US')} to ${max.toLocaleString('en-US')}`);
  return v;
}

/** The form field a plan's key stands for (PlanError.key of shared/numeric's bindPlan), if any. */
export function planFieldOf(key: string): keyof PlanForm | null {
  if (key === 'code') return 'angle';
  if (key.startsWith('codes')) return 'list';
  return (['start', 'step', 'count', 'seed', 'cycles', 'samples'] as const).find((k) => k === key) ?? null;
}

// The plan's own bounds (shared/numeric/plans.ts): counts to 2^32, seeds of 32 bits.
const MAX_COUNT = 2 ** 32;
const MAX_SEED = 2 ** 32 - 1;
const MAX_STEP = 2 ** 31 - 1;

/** @throws PlanFieldError naming the field at fault. */
export function planFromForm(v: PlanForm, f: AngleFormat): Plan {
  switch (v.kind) {
    case 'exhaustive':
    case 'edges':
      return { kind: v.kind };
    case 'one':
      return { kind: 'one', code: toCode(f, v.unit, v.angle, 'angle') };
    case 'list': {
      const items = v.list.split(/[\s,;]+/).filter(Boolean);
      if (!items.length) throw new PlanFieldError('list', 'Paste at least one angle');
      return { kind: 'list', codes: items.map((t) => toCode(f, v.unit, t, 'list')) };
    }
    case 'sweep':
      return { kind: 'sweep', start: toCode(f, v.unit, v.start, 'start'), step: int(v.step, 'step', -MAX_STEP - 1, MAX_STEP), count: int(v.count, 'count', 1, MAX_COUNT) };
    case 'random':
      return { kind: 'random', seed: int(v.seed, 'seed', 0, MAX_SEED), count: int(v.count, 'count', 1, MAX_COUNT) };
    case 'tone':
      return { kind: 'tone', cycles: int(v.cycles, 'cycles', 1, MAX_COUNT), samples: int(v.samples, 'samples', 8, 2 ** 24) };
  }
}

/** The "Repeat" field: null (one pass) when blank, else a soak as the runner's --soak reads it. @throws PlanFieldError */
export function soakFromForm(text: string): SoakSpec | null {
  if (text.trim() === '') return null;
  try {
    return parseSoakSpec(text);
  } catch (e) {
    if (!(e instanceof SoakSpecError)) throw e;
    // The shared message starts lower-case, for the runner's "--soak: …".
    throw new PlanFieldError('soak', e.message.charAt(0).toUpperCase() + e.message.slice(1));
  }
}
