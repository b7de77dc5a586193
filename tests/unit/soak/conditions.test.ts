import { describe, expect, it } from 'vitest';
import {
  conditionsFromBoardName,
  conditionsFromTexts,
  conditionValue,
  mergeConditions,
  nameWithConditions,
  parseConditions,
  parseConditionText,
} from '../../../shared/soak';

describe('operating conditions', () => {
  it('reads named conditions as numbers and keeps other pairs as text', () => {
    expect(conditionsFromTexts(['temperature_c=85', 'vccint_v=0.95', 'clock_mhz=200', 'chamber=B-2'])).toEqual({
      temperature_c: 85,
      vccint_v: 0.95,
      clock_mhz: 200,
      other: { chamber: 'B-2' },
    });
    expect(parseConditionText('temperature_c=-40')).toEqual({ name: 'temperature_c', value: -40 });
  });

  it('refuses malformed text with a message that says what is wrong', () => {
    expect(() => parseConditionText('temperature_c')).toThrow(/name=value/);
    expect(() => parseConditionText('=85')).toThrow(/name=value/);
    expect(() => parseConditionText('Temperature=85')).toThrow(/lower-case/);
    expect(() => parseConditionText('vccint_v=')).toThrow(/no value/);
    expect(() => parseConditionText('vccint_v=0.95V')).toThrow(/vccint_v must be a number in V, got "0.95V"/);
    expect(() => conditionsFromTexts(['clock_mhz=100', 'clock_mhz=200'])).toThrow(/given twice/);
  });

  it('refuses values out of range, naming the range and unit', () => {
    expect(() => parseConditionText('temperature_c=400')).toThrow('temperature_c must be -70..200 °C, got 400');
    // 950 for 0.95: a value in mV typed where V is asked.
    expect(() => parseConditionText('vccint_v=950')).toThrow(/vccint_v must be 0.1..5 V/);
    expect(() => parseConditions({ clock_mhz: 0 })).toThrow(/clock_mhz must be at least 0.001 MHz/);
    expect(() => parseConditions({ temperature_c: '85' })).toThrow(/temperature_c must be a number/);
    expect(() => parseConditions({ other: { temperature_c: '85' } })).toThrow(/own fields/);
    expect(() => parseConditions({ humidity: 3 })).toThrow();
  });

  it('merges name by name, later winning, and reads values for plotting', () => {
    const m = mergeConditions({ temperature_c: 25, other: { chamber: 'A' } }, { temperature_c: 85, other: { rig: '2' } });
    expect(m).toEqual({ temperature_c: 85, other: { chamber: 'A', rig: '2' } });
    expect(conditionValue(m, 'temperature_c')).toBe(85);
    expect(conditionValue(m, 'rig')).toBe(2);
    expect(conditionValue(m, 'chamber')).toBeNull();
    expect(conditionValue(m, 'vccint_v')).toBeNull();
  });

  it('round-trips through a board name suffix and ignores brackets that are not conditions', () => {
    const name = nameWithConditions('Bench board', { temperature_c: 85, vccint_v: 0.95, other: { chamber: 'B 2' } });
    expect(name).toBe('Bench board [temperature_c=85; vccint_v=0.95; chamber=B 2]');
    expect(conditionsFromBoardName(name)).toEqual({ name: 'Bench board', conditions: { temperature_c: 85, vccint_v: 0.95, other: { chamber: 'B 2' } } });
    expect(conditionsFromBoardName('Board [rev B]')).toEqual({ name: 'Board [rev B]', conditions: null });
    expect(conditionsFromBoardName('Board')).toEqual({ name: 'Board', conditions: null });
  });
});
