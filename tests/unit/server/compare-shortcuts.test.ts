// The compare view's shortcuts give the answers of the long way exactly: the envelope kept at
// ingest equals the one computed from the samples, and the in-place diff of packed samples equals
// diffSessions on decoded columns (sorted or not, codes answered twice or not).
import { describe, expect, it } from 'vitest';
import { packSamples } from '../../../shared/link-engine/sample-pack';
import { createCordicModel } from '../../../shared/numeric/cordic-model';
import { codeBinner, envelopeFromBounds, errorEnvelope } from '../../../server/services/error-envelope';
import { diffPacked, diffSessions } from '../../../server/services/session-diff';
import { decodeSamples, scoreSamples } from '../../../server/services/session-scoring';
import { modelConfigSchema } from '../../../server/schemas/core';
import { PROFILE_BINS } from '../../../shared/numeric';
import { ScoreAccumulator } from '../../../shared/numeric/score';

function lcg(seed: number) {
  let s = seed >>> 0;
  return (n: number) => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s % n;
  };
}

/** Answers of the model to `codes`, some nudged by a few LSB so the errors differ from the model's. */
function answers(config: ReturnType<typeof modelConfigSchema.parse>, codes: number[], seed: number) {
  const rnd = lcg(seed);
  const model = createCordicModel(config);
  const cos = new Int32Array(codes.length);
  const sin = new Int32Array(codes.length);
  model.evaluateInto(Float64Array.from(codes), cos, sin);
  const top = 2 ** (config.outBits - 1) - 1;
  for (let i = 0; i < codes.length; i++) {
    if (rnd(7) === 0) cos[i] = Math.max(-top, Math.min(top, cos[i] + rnd(5) - 2));
    if (rnd(11) === 0) sin[i] = Math.max(-top, Math.min(top, sin[i] + rnd(3) - 1));
  }
  return { cos, sin };
}

const pack = (codes: number[], a: { cos: Int32Array; sin: Int32Array }) => packSamples(codes, a.cos, a.sin, new Uint8Array(codes.length).fill(1));

describe('the envelope kept at ingest', () => {
  for (const input of [{ angleBits: 12 }, { angleBits: 14, angleFormat: 'rad' as const }]) {
    it(`equals the envelope computed from the samples (${JSON.stringify(input)})`, () => {
      const config = modelConfigSchema.parse(input);
      const rnd = lcg(3);
      const span = 2 ** config.angleBits;
      const min = config.angleFormat === 'turn' ? 0 : -span / 2;
      // Part of the range only, so some bins stay empty.
      const codes = Array.from({ length: 3000 }, () => min + rnd(span / 2));
      const decoded = decodeSamples(pack(codes, answers(config, codes, 5)), config.angleFormat);
      const stored = JSON.parse(JSON.stringify(scoreSamples(config, decoded).envelope));
      const computed = errorEnvelope(config, decoded);
      expect(computed.lo.some((v) => v === null)).toBe(true);
      expect(computed.hi.some((v) => v !== null && v > 0)).toBe(true);
      expect(envelopeFromBounds(config, stored)).toEqual(computed);
    });
  }
});

describe('diffPacked', () => {
  const config = modelConfigSchema.parse({ angleBits: 12 });
  const binner = codeBinner(config);
  const cases: Record<string, [number[], number[]]> = {
    'both in code order': [Array.from({ length: 4096 }, (_, i) => i), Array.from({ length: 3000 }, (_, i) => 500 + i)],
    'codes answered twice': [Array.from({ length: 3000 }, (_, i) => i >> 1), Array.from({ length: 3000 }, (_, i) => Math.floor(i / 3) + 100)],
    'one side shuffled': [Array.from({ length: 2000 }, (_, i) => (i * 1597) % 4096), Array.from({ length: 4096 }, (_, i) => i)],
  };
  for (const [name, [codesA, codesB]] of Object.entries(cases)) {
    it(`equals diffSessions on decoded columns: ${name}`, () => {
      const a = pack(codesA, answers(config, codesA, 1));
      const b = pack(codesB, answers(config, codesB, 2));
      const expected = diffSessions(decodeSamples(a, 'turn'), decodeSamples(b, 'turn'), undefined, binner);
      expect(expected.differing).toBeGreaterThan(0);
      expect(diffPacked(a, b, 'turn', undefined, binner)).toEqual(expected);
      // A blob at an odd offset, as a database driver may hand it over.
      const shifted = new Uint8Array(b.length + 1).subarray(1);
      shifted.set(b);
      expect(diffPacked(a, shifted, 'turn', 7, binner)).toEqual(diffSessions(decodeSamples(a, 'turn'), decodeSamples(b, 'turn'), 7, binner));
    });
  }
});

describe('scoring at intake in batches', () => {
  it('gives the statistics of one batch to the last bit (three batches and a part)', () => {
    const config = modelConfigSchema.parse({ angleBits: 18 });
    const rnd = lcg(9);
    const codes = Array.from({ length: 3 * 65_536 + 1234 }, () => rnd(2 ** 18));
    const decoded = decodeSamples(pack(codes, answers(config, codes, 4)), config.angleFormat);
    const whole = new ScoreAccumulator(config, { profileBins: PROFILE_BINS }).add(decoded.codes, decoded.cos, decoded.sin);
    const scored = scoreSamples(config, decoded);
    expect(scored.stats.mismatches.count).toBeGreaterThan(0);
    expect(scored.stats).toEqual(whole.summary());
    expect(scored.profile).toEqual(whole.profile());
  });
});
