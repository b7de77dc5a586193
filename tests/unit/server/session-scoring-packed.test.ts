import { describe, expect, it } from 'vitest';
import { packSamples } from '../../../shared/link-engine/sample-pack';
import { createCordicModel } from '../../../shared/numeric';
import { modelConfigSchema } from '../../../server/schemas/core';
import { decodeSamples, scorePackedSamples, scoreSamples } from '../../../server/services/session-scoring';
import { HttpError } from '../../../server/http-error';

describe('scorePackedSamples', () => {
  it('gives the score of the whole unpacked session to the last bit, over several batches and a partial one', () => {
    const config = modelConfigSchema.parse({ angleBits: 18 });
    // 2.5 scoring batches of 65,536, in a scrambled order, with damaged answers the statistics must see.
    const n = 163_840;
    const codes = Float64Array.from({ length: n }, (_, i) => (i * 104_729) % 2 ** 18);
    const cos = new Int32Array(n);
    const sin = new Int32Array(n);
    createCordicModel(config).evaluateInto(codes, cos, sin);
    for (let i = 0; i < n; i += 1009) cos[i] += (i % 7) - 3;
    const packed = packSamples(codes, cos, sin, new Uint8Array(n).fill(1));
    const whole = scoreSamples(config, decodeSamples(packed, 'turn'));
    const batched = scorePackedSamples(config, packed, 'turn');
    expect(batched.count).toBe(n);
    // JSON keeps every double's bits (shortest round-trip form), so equal text is equal values.
    expect(JSON.stringify(batched.stats)).toBe(JSON.stringify(whole.stats));
    expect(batched.profile).toEqual(whole.profile);
    expect(batched.envelope).toEqual(whole.envelope);
    expect(batched.stats.mismatches.count).toBeGreaterThan(0);
  });

  it('answers 400 for a length that is not whole samples', () => {
    expect(() => scorePackedSamples({}, new Uint8Array(25), 'turn')).toThrow(HttpError);
  });
});
