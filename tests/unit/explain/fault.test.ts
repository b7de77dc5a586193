import { describe, expect, it } from 'vitest';
import { checkFault, FAULT_SPELLINGS, FaultError, formatCoreFault, formatFault, parseCoreFault, parseFault, type Fault } from '../../../shared/explain';
import { DEFAULT_MODEL_CONFIG, parseModelConfig } from '../../../shared/numeric';

describe('the catalogue spelling', () => {
  const cases: [string, Fault][] = [
    ['sign-slip:5', { kind: 'sign-slip', iteration: 5 }],
    ['atan-entry:3:-1', { kind: 'atan-entry', iteration: 3, delta: -1 }],
    ['atan-entry:3:+2', { kind: 'atan-entry', iteration: 3, delta: 2 }],
    ['atan-entry:0:flip7', { kind: 'atan-entry', iteration: 0, flipBit: 7 }],
    ['shift:4:+1', { kind: 'shift', iteration: 4, by: 1 }],
    ['shift:4:-1', { kind: 'shift', iteration: 4, by: -1 }],
    ['logical-shift:y', { kind: 'logical-shift', register: 'y' }],
    ['stuck-bit:sin:13:0', { kind: 'stuck-bit', channel: 'sin', bit: 13, value: 0 }],
    ['swap', { kind: 'swap' }],
    ['negate:cos', { kind: 'negate', channel: 'cos' }],
    ['wrap', { kind: 'wrap' }],
    ['angle-offset:-12', { kind: 'angle-offset', codes: -12 }],
    ['angle-bit:3:0', { kind: 'angle-bit', bit: 3, value: 0 }],
    ['gain:0', { kind: 'gain', iterations: 0 }],
    ['blocking-update', { kind: 'blocking-update' }],
    ['zero-direction', { kind: 'zero-direction' }],
    ['fold-sign', { kind: 'fold-sign' }],
  ];

  it('reads every entry and writes it back the same way', () => {
    for (const [text, fault] of cases) {
      expect(parseFault(text)).toEqual(fault);
      expect(formatFault(fault)).toBe(text);
    }
    // Every documented spelling is covered by a case above.
    const kinds = new Set(cases.map(([, f]) => f.kind));
    for (const s of FAULT_SPELLINGS) expect(kinds.has(s.split(':')[0] as Fault['kind'])).toBe(true);
  });

  it("keeps the simulated board's old spellings", () => {
    expect(parseFault('sign:5')).toEqual({ kind: 'sign-slip', iteration: 5 });
    expect(parseFault('stuck:0')).toEqual({ kind: 'stuck-bit', channel: 'both', bit: 0, value: 1 });
    expect(parseFault('gain')).toEqual({ kind: 'gain', iterations: 2 });
    expect(parseCoreFault('fold')).toEqual({ config: { fold: false }, fault: null });
  });

  it('reads configuration deviations as key=value', () => {
    expect(parseCoreFault('iterations=15')).toEqual({ config: { iterations: 15 }, fault: null });
    expect(parseCoreFault('shiftRounding=nearest')).toEqual({ config: { shiftRounding: 'nearest' }, fault: null });
    expect(parseCoreFault('fold=false')).toEqual({ config: { fold: false }, fault: null });
    expect(parseCoreFault('swap')).toEqual({ config: {}, fault: { kind: 'swap' } });
    const c = parseModelConfig({ iterations: 15 });
    expect(formatCoreFault(c, DEFAULT_MODEL_CONFIG, { kind: 'sign-slip', iteration: 2 })).toBe('iterations=15 sign-slip:2');
  });

  it('refuses bad text with a message that says what is wrong', () => {
    expect(() => parseFault('melt')).toThrow(/"melt" is not a core fault; known: sign-slip:K/);
    expect(() => parseFault('sign-slip')).toThrow(/sign-slip takes 1 parameter/);
    expect(() => parseFault('sign-slip:x')).toThrow(/the iteration must be a whole number/);
    expect(() => parseFault('atan-entry:3:0')).toThrow(/the delta must be a non-zero integer/);
    expect(() => parseFault('shift:3:2')).toThrow(/by must be \+1 or -1 or 1/);
    expect(() => parseFault('stuck-bit:tan:1:1')).toThrow(/the channel must be cos or sin or both/);
    expect(() => parseFault('swap:1')).toThrow(/swap takes no parameters/);
    expect(() => parseCoreFault('outBits=12')).toThrow(/outBits is not a key the RTL can deviate in/);
    expect(() => parseCoreFault('iterations=99')).toThrow(/iterations/);
    expect(() => parseFault('melt')).toThrow(FaultError);
  });

  it('refuses a defect the core cannot have', () => {
    const c = DEFAULT_MODEL_CONFIG;
    expect(() => checkFault(c, { kind: 'sign-slip', iteration: 16 })).toThrow(/sign-slip:16: the core has only 16 iterations/);
    expect(() => checkFault(c, { kind: 'stuck-bit', channel: 'cos', bit: 16, value: 1 })).toThrow(/only 16 bits/);
    expect(() => checkFault(c, { kind: 'shift', iteration: 0, by: -1 })).toThrow(/negative/);
    expect(() => checkFault(parseModelConfig({ fold: false }), { kind: 'fold-sign' })).toThrow(/does not fold/);
    expect(() => checkFault(c, { kind: 'sign-slip', iteration: 15 })).not.toThrow();
  });
});
