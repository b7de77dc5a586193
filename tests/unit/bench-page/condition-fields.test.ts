import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { checkConditionForm, conditionFormFields, conditionsOfForm, emptyConditionForm } from '../../../src/features/bench/components/condition-fields';

const schema = z.object(conditionFormFields).superRefine(checkConditionForm);

describe('the save form’s operating conditions', () => {
  it('turns the fields into conditions, leaving out empty ones', () => {
    expect(conditionsOfForm(emptyConditionForm)).toEqual({});
    expect(conditionsOfForm({ temperature_c: ' 85 ', vccint_v: '0.95', clock_mhz: '', otherConditions: 'chamber=TC-2, airflow=off' })).toEqual({
      temperature_c: 85,
      vccint_v: 0.95,
      other: { chamber: 'TC-2', airflow: 'off' },
    });
  });

  it('puts each problem on the field it concerns', () => {
    const bad = schema.safeParse({ ...emptyConditionForm, vccint_v: '950' });
    expect(bad.success).toBe(false);
    expect(bad.error!.issues[0]).toMatchObject({ path: ['vccint_v'], message: 'vccint_v must be 0.1..5 V, got 950' });
    const other = schema.safeParse({ ...emptyConditionForm, otherConditions: 'chamber' });
    expect(other.error!.issues[0].path).toEqual(['otherConditions']);
    expect(other.error!.issues[0].message).toMatch(/name=value/);
  });
});
