import { describe, expect, it } from 'vitest';
import { defaultPlanForm, PlanFieldError, planFieldOf, planFromForm, soakFromForm, type PlanForm } from '../../../src/features/bench/components/plan-from-form';
import { bindPlan, PlanError, type AngleFormat } from '../../../shared/numeric';

const turn16: AngleFormat = { angleFormat: 'turn', angleBits: 16, angleFrac: 0 };
const form = (patch: Partial<PlanForm>): PlanForm => ({ ...defaultPlanForm, ...patch });

/** The field and message planFromForm refuses `patch` with. */
function refusal(patch: Partial<PlanForm>) {
  try {
    planFromForm(form(patch), turn16);
  } catch (e) {
    if (e instanceof PlanFieldError) return { field: e.field, message: e.message };
    throw e;
  }
  throw new Error('accepted');
}

describe('the plan form', () => {
  it('reads angles in each unit as the nearest 16-bit turn code', () => {
    // 2^16 codes to the turn: 90° is a quarter (16384), 0.125 turn an eighth (8192).
    expect(planFromForm(form({ kind: 'one', unit: 'deg', angle: '90' }), turn16)).toEqual({ kind: 'one', code: 16384 });
    expect(planFromForm(form({ kind: 'one', unit: 'turn', angle: ' 0.125 ' }), turn16)).toEqual({ kind: 'one', code: 8192 });
    expect(planFromForm(form({ kind: 'one', unit: 'code', angle: '+12' }), turn16)).toEqual({ kind: 'one', code: 12 });
    expect(planFromForm(form({ kind: 'list', unit: 'deg', list: '0, 45\n-90;1e2' }), turn16)).toEqual({ kind: 'list', codes: [0, 8192, 49152, 18204] });
  });

  it('takes decimal numbers only, by the field at fault', () => {
    expect(refusal({ kind: 'one', angle: '' })).toEqual({ field: 'angle', message: 'Type an angle' });
    expect(refusal({ kind: 'one', angle: '0x10' })).toEqual({ field: 'angle', message: '“0x10” is not a number' });
    expect(refusal({ kind: 'one', angle: 'Infinity' })).toEqual({ field: 'angle', message: '“Infinity” is not a number' });
    expect(refusal({ kind: 'one', angle: '1e999' })).toEqual({ field: 'angle', message: '“1e999” is too large' });
    expect(refusal({ kind: 'list', list: '1 2 x' })).toEqual({ field: 'list', message: '“x” is not a number' });
    expect(refusal({ kind: 'one', unit: 'code', angle: '65536' })).toEqual({ field: 'angle', message: 'angle code 65536 is not an integer 0..65535 (turn, 16 bits)' });
    expect(refusal({ kind: 'random', seed: '0x1' })).toEqual({ field: 'seed', message: 'A whole number from 0 to 4,294,967,295' });
    expect(refusal({ kind: 'random', count: '0' })).toEqual({ field: 'count', message: 'A whole number from 1 to 4,294,967,296' });
    expect(refusal({ kind: 'sweep', step: '1.5' })).toEqual({ field: 'step', message: 'A whole number from -2,147,483,648 to 2,147,483,647' });
    expect(refusal({ kind: 'tone', samples: '4' })).toEqual({ field: 'samples', message: 'A whole number from 8 to 16,777,216' });
  });

  it('names the form field of a plan key that bindPlan refuses', () => {
    const keyOf = (plan: unknown) => {
      try {
        bindPlan(plan, turn16);
      } catch (e) {
        return (e as PlanError).key;
      }
      throw new Error('accepted');
    };
    expect(planFieldOf(keyOf({ kind: 'tone', cycles: 64, samples: 4096 }))).toBe('cycles');
    expect(planFieldOf(keyOf({ kind: 'list', codes: [1, 70000] }))).toBe('list');
    expect(planFieldOf('code')).toBe('angle');
    expect(planFieldOf('plan')).toBeNull();
  });
});

describe('the Repeat (soak) field', () => {
  /** The message soakFromForm refuses `text` with, on the soak field. */
  function soakRefusal(text: string) {
    try {
      soakFromForm(text);
    } catch (e) {
      if (e instanceof PlanFieldError) return { field: e.field, message: e.message };
      throw e;
    }
    throw new Error('accepted');
  }

  it('is one pass when blank, else passes or a duration in the runner’s grammar', () => {
    expect(soakFromForm('')).toBeNull();
    expect(soakFromForm('   ')).toBeNull();
    expect(soakFromForm('3')).toEqual({ kind: 'passes', passes: 3 });
    expect(soakFromForm(' 50 ')).toEqual({ kind: 'passes', passes: 50 });
    expect(soakFromForm('90s')).toEqual({ kind: 'duration', ms: 90_000 });
    expect(soakFromForm('30m')).toEqual({ kind: 'duration', ms: 1_800_000 });
    expect(soakFromForm('2h')).toEqual({ kind: 'duration', ms: 7_200_000 });
  });

  it('refuses zero passes, malformed and out-of-range entries on its own field, in a sentence', () => {
    expect(soakRefusal('0')).toEqual({ field: 'soak', message: 'A soak needs at least 1 pass, got 0' });
    expect(soakRefusal('ten')).toEqual({ field: 'soak', message: 'A soak is a number of passes (50) or a duration (90s, 30m, 2h), got "ten"' });
    expect(soakRefusal('-5').message).toMatch(/^A soak is a number of passes/);
    expect(soakRefusal('30 min').message).toMatch(/^A soak is a number of passes/);
    expect(soakRefusal('0.5s')).toEqual({ field: 'soak', message: 'A soak lasts at least 1 s, got "0.5s"' });
    expect(soakRefusal('8d').message).toMatch(/^A soak is a number of passes/);
    expect(soakRefusal('169h')).toEqual({ field: 'soak', message: 'A soak lasts at most 7 days, got "169h"' });
    expect(soakRefusal('1000001')).toEqual({ field: 'soak', message: 'A soak is at most 1,000,000 passes, got 1000001' });
  });
});
