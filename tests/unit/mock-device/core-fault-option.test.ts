import { describe, expect, it } from 'vitest';
import { parseBoardArgs } from '../../../mock-device/options';

describe("the simulated board's --core-fault", () => {
  it('takes catalogue spellings and configuration deviations', () => {
    expect(parseBoardArgs(['--core-fault', 'atan-entry:3:-1']).settings.coreFault).toEqual({ config: {}, fault: { kind: 'atan-entry', iteration: 3, delta: -1 } });
    expect(parseBoardArgs(['--core-fault', 'iterations=14']).settings.coreFault).toEqual({ config: { iterations: 14 }, fault: null });
    expect(parseBoardArgs(['--core-fault', 'stuck:0']).settings.coreFault).toEqual({ config: {}, fault: { kind: 'stuck-bit', channel: 'both', bit: 0, value: 1 } });
  });

  it('refuses at start a fault the core cannot have, naming the option', () => {
    expect(() => parseBoardArgs(['--core-fault', 'sign-slip:16'])).toThrow(/^--core-fault sign-slip:16: the core has only 16 iterations/);
    expect(() => parseBoardArgs(['--core', '{"outBits":12,"outFrac":10}', '--core-fault', 'stuck-bit:cos:12:1'])).toThrow(/only 12 bits/);
    expect(() => parseBoardArgs(['--core-fault', 'sign-slip:5:2'])).toThrow(/^--core-fault "sign-slip:5:2": sign-slip takes 1 parameter/);
  });
});
