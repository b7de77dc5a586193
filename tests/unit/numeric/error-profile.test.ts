import { describe, expect, it } from 'vitest';
import { createCordicModel, errorProfile, PROFILE_EMPTY, ScoreAccumulator } from '../../../shared/numeric';

// The profile's figures are checked against Math.cos/Math.sin of 2πc/2^16 (IEEE 754 double, far
// finer than one 2^-14 LSB), computed here independently of the exact reference.
const model = createCordicModel({});
const scale = 2 ** 14;
const err = (code: number, cos: number, sin: number) => {
  const a = (2 * Math.PI * code) / 65536;
  return Math.max(Math.abs(cos - Math.cos(a) * scale), Math.abs(sin - Math.sin(a) * scale));
};

describe('the error profile', () => {
  it('holds per bin of the 16-bit range the largest |error| of cos or sin, and marks empty bins', () => {
    const codes = [0, 100, 1023, 1024, 40000, 65535];
    const cos = codes.map((c) => model.evaluate(c).cos);
    const sin = codes.map((c) => model.evaluate(c).sin);
    sin[1] += 9; // code 100 is 9 LSB off in sin
    const profile = errorProfile({}, codes, cos, sin, 64);
    expect(profile).toHaveLength(64);
    expect(profile[0]).toBeCloseTo(Math.max(err(0, cos[0], sin[0]), err(100, cos[1], sin[1]), err(1023, cos[2], sin[2])), 6);
    expect(profile[0]).toBeGreaterThan(8);
    expect(profile[1]).toBeCloseTo(err(1024, cos[3], sin[3]), 6);
    expect(profile[Math.floor((40000 * 64) / 65536)]).toBeCloseTo(err(40000, cos[4], sin[4]), 6);
    expect(profile[63]).toBeCloseTo(err(65535, cos[5], sin[5]), 6);
    expect(profile.filter((v) => v === PROFILE_EMPTY)).toHaveLength(64 - 4);
  });

  it('is the same whether scored in one batch or in merged pieces, and absent unless asked for', () => {
    const codes = Array.from({ length: 4096 }, (_, i) => i * 16);
    const out = codes.map((c) => model.evaluate(c));
    const cos = out.map((o) => o.cos);
    const sin = out.map((o) => o.sin);
    const whole = errorProfile({}, codes, cos, sin, 32);
    const a = new ScoreAccumulator({}, { profileBins: 32 }).add(codes.slice(0, 1000), cos.slice(0, 1000), sin.slice(0, 1000));
    const b = new ScoreAccumulator({}, { profileBins: 32 }).add(codes.slice(1000), cos.slice(1000), sin.slice(1000));
    expect(a.merge(b).profile()).toEqual(whole);
    expect(new ScoreAccumulator({}).add(codes, cos, sin).profile()).toBeNull();
  });
});
