import { describe, expect, it } from 'vitest';
import { packSamples } from '../../../shared/link-engine/sample-pack';
import { createCordicModel } from '../../../shared/numeric';
import { modelConfigSchema } from '../../../server/schemas/core';
import { decodeSamples, PackedScoring, scorePackedSamples, scoreSamples } from '../../../server/services/session-scoring';
import { HttpError } from '../../../server/http-error';

const config = modelConfigSchema.parse({ angleBits: 18 });

/** 2.5 scoring batches of 65,536, in a scrambled order, with damaged answers the statistics must see. */
function session() {
  const n = 163_840;
  const codes = Float64Array.from({ length: n }, (_, i) => (i * 104_729) % 2 ** 18);
  const cos = new Int32Array(n);
  const sin = new Int32Array(n);
  createCordicModel(config).evaluateInto(codes, cos, sin);
  for (let i = 0; i < n; i += 1009) cos[i] += (i % 7) - 3;
  return { n, packed: packSamples(codes, cos, sin, new Uint8Array(n).fill(1)) };
}

describe('scorePackedSamples', () => {
  it('gives the score of the whole unpacked session to the last bit, over several batches and a partial one', () => {
    const { n, packed } = session();
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

describe('PackedScoring', () => {
  it('fed the bytes as they arrive, in chunks that split samples, gives scorePackedSamples to the last bit', () => {
    const { n, packed } = session();
    const expected = scorePackedSamples(config, packed, 'turn');
    const scoring = new PackedScoring(config, 'turn');
    // Uneven chunks, as a socket delivers them: 65,537 bytes splits a sample at every boundary.
    // The bytes arrive into a buffer the size of the body, filled as they come.
    const arriving = new Uint8Array(packed.length);
    for (let size = 0; size < packed.length; ) {
      const next = Math.min(packed.length, size + 65_537);
      arriving.set(packed.subarray(size, next), size);
      size = next;
      scoring.feed(arriving, size);
    }
    const fed = scoring.finish(arriving);
    expect(fed.count).toBe(n);
    expect(JSON.stringify(fed.stats)).toBe(JSON.stringify(expected.stats));
    expect(fed.profile).toEqual(expected.profile);
    expect(fed.envelope).toEqual(expected.envelope);
  });

  it('leaves the last, partial batch to finish: what is fed is only ever whole batches', () => {
    const { packed } = session();
    const scoring = new PackedScoring(config, 'turn');
    // Every byte but the last sample's: two whole batches are scored, the rest waits.
    scoring.feed(packed, packed.length - 1);
    const fed = scoring.finish(packed);
    expect(JSON.stringify(fed.stats)).toBe(JSON.stringify(scorePackedSamples(config, packed, 'turn').stats));
  });

  it('answers 400 at finish for a body that is not whole samples, as scorePackedSamples does', () => {
    const { packed } = session();
    const scoring = new PackedScoring(config, 'turn');
    scoring.feed(packed, packed.length);
    expect(() => scoring.finish(packed.subarray(0, packed.length - 5))).toThrow(HttpError);
  });
});
