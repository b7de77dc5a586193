import { describe, expect, it } from 'vitest';
import { describeSoak, parseSoakSpec, soakWantsAnotherPass } from '../../../shared/soak';

describe('soak spec', () => {
  it('reads passes and durations', () => {
    expect(parseSoakSpec('50')).toEqual({ kind: 'passes', passes: 50 });
    expect(parseSoakSpec('90s')).toEqual({ kind: 'duration', ms: 90_000 });
    expect(parseSoakSpec('30m')).toEqual({ kind: 'duration', ms: 1_800_000 });
    expect(parseSoakSpec('2h')).toEqual({ kind: 'duration', ms: 7_200_000 });
    expect(parseSoakSpec('1.5h')).toEqual({ kind: 'duration', ms: 5_400_000 });
    expect(describeSoak(parseSoakSpec('30m'))).toBe('30 min');
    expect(describeSoak(parseSoakSpec('1'))).toBe('1 pass');
  });

  it('refuses zero passes, malformed text and out-of-range durations clearly', () => {
    expect(() => parseSoakSpec('0')).toThrow('a soak needs at least 1 pass, got 0');
    expect(() => parseSoakSpec('-3')).toThrow(/number of passes \(50\) or a duration/);
    expect(() => parseSoakSpec('30 min')).toThrow(/number of passes \(50\) or a duration/);
    expect(() => parseSoakSpec('0s')).toThrow(/at least 1 s/);
    expect(() => parseSoakSpec('200h')).toThrow(/at most 7 days/);
    expect(() => parseSoakSpec('2000000')).toThrow(/at most 1,000,000 passes/);
  });

  it('runs whole passes until the count or the time is used up', () => {
    expect(soakWantsAnotherPass({ kind: 'passes', passes: 3 }, 2, 1e9)).toBe(true);
    expect(soakWantsAnotherPass({ kind: 'passes', passes: 3 }, 3, 0)).toBe(false);
    expect(soakWantsAnotherPass({ kind: 'duration', ms: 1000 }, 100, 999)).toBe(true);
    expect(soakWantsAnotherPass({ kind: 'duration', ms: 1000 }, 1, 1000)).toBe(false);
  });
});
