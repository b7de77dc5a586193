import { describe, expect, it } from 'vitest';
import { parseBoardArgs } from '../../../mock-device/options';

describe('the simulated board soak options', () => {
  it('reads a flaky fault, a seed and repeatable conditions', () => {
    const { settings } = parseBoardArgs(['--core-fault', 'flaky:0.001@30', '--seed', '9', '--condition', 'temperature_c=85', '--condition', 'vccint_v=0.95']);
    expect(settings.flaky).toEqual({ kind: 'flaky', rate: 0.001, onsetS: 30 });
    expect(settings.coreFault).toBeUndefined();
    expect(settings.seed).toBe(9);
    expect(settings.conditions).toEqual({ temperature_c: 85, vccint_v: 0.95 });
  });

  it('refuses a malformed or out-of-range condition, naming the option', () => {
    expect(() => parseBoardArgs(['--condition', 'temperature_c'])).toThrow(/^--condition: a condition is name=value/);
    expect(() => parseBoardArgs(['--condition', 'vccint_v=9'])).toThrow('--condition: vccint_v must be 0.1..5 V, got 9');
    expect(() => parseBoardArgs(['--core-fault', 'flaky:abc'])).toThrow(/flaky:RATE or flaky:RATE@SECONDS/);
  });
});
