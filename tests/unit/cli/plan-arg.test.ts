import { describe, expect, it } from 'vitest';
import { parsePlanArg, parsePlanSpec } from '../../../cli/run-options';
import { parseVectorPlanSpec } from '../../../cli/run-vector-plan';

describe('--plan NAME:ARGS, read by one table-driven parser for both kinds of core', () => {
  it('reads each shape of plan: no arguments, whole numbers into named fields, a path', () => {
    const plans = { quiet: 'none', pair: { fields: ['a', 'b'], spelled: 'A,B' }, file: 'path' } as const;
    expect(parsePlanArg('quiet', plans, 'x')).toEqual({ kind: 'quiet' });
    expect(parsePlanArg('pair:-3,0x10', plans, 'x')).toEqual({ kind: 'pair', a: -3, b: 16 });
    expect(parsePlanArg('file:C:/plans/a.csv', plans, 'x')).toEqual({ kind: 'file', path: 'C:/plans/a.csv' });
    expect(() => parsePlanArg('pair:1', plans, 'x')).toThrow('--plan pair needs A,B, got "1"');
    expect(() => parsePlanArg('quiet:1', plans, 'x')).toThrow('--plan quiet takes no arguments');
  });

  it('refuses a name that is only an object’s inherited property', () => {
    expect(() => parsePlanSpec('toString')).toThrow(/^--plan must be exhaustive, .* got "toString"$/);
    expect(() => parseVectorPlanSpec('constructor:1')).toThrow(/^--plan for a vectoring core must be .* got "constructor:1"$/);
  });
});
