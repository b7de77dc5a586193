// The vectoring plan form's fields, turned into a vectoring plan (shared/vectoring/vector-plans.ts).
// Inputs are x/y codes as the board takes them; pasted pairs are "x y" or "x, y", one per line.
import { z } from 'zod';
import { inputRange, MAX_EXHAUSTIVE_IN_BITS, MAX_VECTOR_PLAN_POINTS, type VectorConfig, type VectorPlan } from '../../../../shared/vectoring';

export const VECTOR_PLAN_KINDS = [
  ['grid', 'Grid over the x–y square'],
  ['circle', 'Circle'],
  ['random', 'Seeded random pairs'],
  ['edges', 'Edge set (axes, diagonals, corners, near the origin)'],
  ['exhaustive', `Every pair (inputs of ≤ ${MAX_EXHAUSTIVE_IN_BITS} bits)`],
  ['list', 'Pasted pairs'],
] as const;

export const vectorPlanFormSchema = z.object({
  kind: z.enum(['grid', 'circle', 'random', 'edges', 'exhaustive', 'list']),
  target: z.string(),
  radius: z.string(),
  points: z.string(),
  seed: z.string(),
  count: z.string(),
  pairs: z.string(),
});
export type VectorPlanForm = z.infer<typeof vectorPlanFormSchema>;

export const defaultVectorPlanForm: VectorPlanForm = { kind: 'grid', target: '4096', radius: '8192', points: '360', seed: '1', count: '4096', pairs: '16384 0\n0 16384\n-11585 -11585' };

export class VectorPlanFieldError extends Error {
  constructor(
    readonly field: keyof VectorPlanForm,
    message: string,
  ) {
    super(message);
  }
}

const WHOLE = /^[+-]?\d+$/;

function int(text: string, field: keyof VectorPlanForm, min: number, max: number): number {
  const t = text.trim();
  const v = WHOLE.test(t) ? Number(t) : NaN;
  if (!Number.isSafeInteger(v) || v < min || v > max) throw new VectorPlanFieldError(field, `A whole number from ${min.toLocaleString('en-US')} to ${max.toLocaleString('en-US')}`);
  return v;
}

/** The form field a vectoring plan's key stands for (PlanError.key of bindVectorPlan), if any. */
export function vectorPlanFieldOf(key: string, kind: VectorPlanForm['kind']): keyof VectorPlanForm | null {
  if (key.startsWith('points.')) return 'pairs';
  if (key === 'points') return kind === 'list' ? 'pairs' : 'points';
  if (key === 'kind') return null;
  return (['target', 'radius', 'seed', 'count'] as const).find((k) => k === key) ?? null;
}

/** @throws VectorPlanFieldError naming the field at fault. */
export function vectorPlanFromForm(v: VectorPlanForm, c: Pick<VectorConfig, 'inBits'>): VectorPlan {
  const { min, max } = inputRange(c);
  switch (v.kind) {
    case 'edges':
    case 'exhaustive':
      return { kind: v.kind };
    case 'grid':
      return { kind: 'grid', target: int(v.target, 'target', 1, 2 ** 32) };
    case 'circle':
      return { kind: 'circle', radius: int(v.radius, 'radius', 1, max), points: int(v.points, 'points', 1, MAX_VECTOR_PLAN_POINTS) };
    case 'random':
      return { kind: 'random', seed: int(v.seed, 'seed', 0, 2 ** 32 - 1), count: int(v.count, 'count', 1, MAX_VECTOR_PLAN_POINTS) };
    case 'list': {
      const lines = v.pairs
        .split('\n')
        .map((l) => l.trim())
        .filter(Boolean);
      if (!lines.length) throw new VectorPlanFieldError('pairs', 'Paste at least one pair: x and y on a line');
      const points = lines.map((line, i): [number, number] => {
        const parts = line.split(/[\s,;]+/).filter(Boolean);
        if (parts.length !== 2) throw new VectorPlanFieldError('pairs', `Line ${i + 1}, “${line}”: give two codes, x then y`);
        const [x, y] = parts.map((t) => (WHOLE.test(t) ? Number(t) : NaN));
        for (const [name, val, text] of [['x', x, parts[0]], ['y', y, parts[1]]] as const) {
          if (!Number.isSafeInteger(val)) throw new VectorPlanFieldError('pairs', `Line ${i + 1}: ${name} “${text}” is not a whole number (input codes, not real values)`);
          if (val < min || val > max) throw new VectorPlanFieldError('pairs', `Line ${i + 1}: ${name} ${val} is not an input code ${min}..${max} (${c.inBits} bits)`);
        }
        return [x, y];
      });
      return { kind: 'list', points };
    }
  }
}
