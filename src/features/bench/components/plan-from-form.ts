// The plan form's fields, turned into a plan of the numeric core. Angles may be typed in degrees,
// radians, turns or raw codes; lists are pasted with commas, spaces or new lines between.
import { z } from 'zod';
import { degreesToAngleCode, radiansToAngleCode, turnsToAngleCode, type AngleFormat, type Plan } from '../../../../shared/numeric';

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
});
export type PlanForm = z.infer<typeof planFormSchema>;

export const defaultPlanForm: PlanForm = { kind: 'exhaustive', unit: 'deg', angle: '30', list: '0, 45, 90', start: '0', step: '1', count: '4096', seed: '1', cycles: '127', samples: '4096' };

export class PlanFieldError extends Error {
  constructor(
    readonly field: keyof PlanForm,
    message: string,
  ) {
    super(message);
  }
}

function toCode(f: AngleFormat, unit: PlanForm['unit'], text: string, field: keyof PlanForm): number {
  const v = Number(text.trim());
  if (text.trim() === '' || !Number.isFinite(v)) throw new PlanFieldError(field, `“${text.trim()}” is not a number`);
  try {
    if (unit === 'code') return v;
    return unit === 'deg' ? degreesToAngleCode(f, v) : unit === 'rad' ? radiansToAngleCode(f, v) : turnsToAngleCode(f, v);
  } catch (e) {
    throw new PlanFieldError(field, (e as Error).message);
  }
}

function int(text: string, field: keyof PlanForm): number {
  const v = Number(text.trim());
  if (!Number.isInteger(v)) throw new PlanFieldError(field, 'A whole number');
  return v;
}

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
      return { kind: 'sweep', start: toCode(f, v.unit, v.start, 'start'), step: int(v.step, 'step'), count: int(v.count, 'count') };
    case 'random':
      return { kind: 'random', seed: int(v.seed, 'seed'), count: int(v.count, 'count') };
    case 'tone':
      return { kind: 'tone', cycles: int(v.cycles, 'cycles'), samples: int(v.samples, 'samples') };
  }
}
