import { describe, expect, it } from 'vitest';
import { defaultVectorPlanForm, vectorPlanFieldOf, VectorPlanFieldError, vectorPlanFromForm, type VectorPlanForm } from '../../../src/features/bench/components/vector-plan-from-form';
import { bindVectorPlan, PlanError } from '../../../shared/vectoring';

const c12 = { inBits: 12 };
const form = (patch: Partial<VectorPlanForm>): VectorPlanForm => ({ ...defaultVectorPlanForm, ...patch });
const fieldOf = (f: () => unknown) => {
  try {
    f();
  } catch (e) {
    if (e instanceof VectorPlanFieldError) return { field: e.field, message: e.message };
    throw e;
  }
  throw new Error('did not throw');
};

describe('vectorPlanFromForm', () => {
  it('makes each kind of plan', () => {
    expect(vectorPlanFromForm(form({ kind: 'grid', target: '4096' }), c12)).toEqual({ kind: 'grid', target: 4096 });
    expect(vectorPlanFromForm(form({ kind: 'circle', radius: '1000', points: '90' }), c12)).toEqual({ kind: 'circle', radius: 1000, points: 90 });
    expect(vectorPlanFromForm(form({ kind: 'random', seed: '5', count: '100' }), c12)).toEqual({ kind: 'random', seed: 5, count: 100 });
    expect(vectorPlanFromForm(form({ kind: 'list', pairs: '1 2\n-3, 4\n\n' }), c12)).toEqual({ kind: 'list', points: [[1, 2], [-3, 4]] });
    expect(vectorPlanFromForm(form({ kind: 'edges' }), c12)).toEqual({ kind: 'edges' });
  });

  it('names the field at fault, in words', () => {
    // 12-bit inputs reach 2047.
    expect(fieldOf(() => vectorPlanFromForm(form({ kind: 'circle', radius: '4096' }), c12))).toEqual({ field: 'radius', message: 'A whole number from 1 to 2,047' });
    expect(fieldOf(() => vectorPlanFromForm(form({ kind: 'grid', target: '1.5' }), c12)).field).toBe('target');
    expect(fieldOf(() => vectorPlanFromForm(form({ kind: 'list', pairs: '1 2 3' }), c12)).message).toBe('Line 1, “1 2 3”: give two codes, x then y');
    expect(fieldOf(() => vectorPlanFromForm(form({ kind: 'list', pairs: '1 2\n0.5 1' }), c12)).message).toMatch(/^Line 2: x “0.5” is not a whole number/);
    expect(fieldOf(() => vectorPlanFromForm(form({ kind: 'list', pairs: '0 -2049' }), c12)).message).toBe('Line 1: y -2049 is not an input code -2048..2047 (12 bits)');
    expect(fieldOf(() => vectorPlanFromForm(form({ kind: 'list', pairs: ' \n' }), c12)).field).toBe('pairs');
  });

  it('leaves the exhaustive plan of wide inputs to the plan’s own refusal, shown without a field', () => {
    const plan = vectorPlanFromForm(form({ kind: 'exhaustive' }), c12);
    let err: unknown;
    try {
      bindVectorPlan(plan, c12);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(PlanError);
    expect(vectorPlanFieldOf((err as PlanError).key, 'exhaustive')).toBeNull();
    expect(vectorPlanFieldOf('points.3.1', 'list')).toBe('pairs');
    expect(vectorPlanFieldOf('points', 'circle')).toBe('points');
  });
});
