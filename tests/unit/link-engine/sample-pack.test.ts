import { describe, expect, it } from 'vitest';
import { packSamples, SAMPLE_BYTES, SamplePackError, unpackSamples, unpackSamplesInto } from '../../../shared/link-engine/sample-pack';

/** The format read field by field with DataView: three little-endian int32 a sample (shared/link-engine/sample-pack.ts). */
function unpackByView(bytes: Uint8Array, angleFormat: 'turn' | 'rad') {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const n = bytes.length / SAMPLE_BYTES;
  const codes: number[] = [];
  const cos: number[] = [];
  const sin: number[] = [];
  for (let i = 0; i < n; i++) {
    codes.push(angleFormat === 'turn' ? view.getUint32(i * 12, true) : view.getInt32(i * 12, true));
    cos.push(view.getInt32(i * 12 + 4, true));
    sin.push(view.getInt32(i * 12 + 8, true));
  }
  return { codes, cos, sin };
}

// Codes above 2^31 (turn codes keep their bits), negative rad codes, the int32 extremes.
const CODES = [0, 1, 2 ** 31 - 1, -(2 ** 31), -1, 12_345, -54_321, 0x7fff_0000];
const COS = [32767, -32768, 0, 1, -1, 2 ** 31 - 1, -(2 ** 31), 99];
const SIN = [-5, 5, 2 ** 30, -(2 ** 30), 7, -7, 0, -99];

describe('unpackSamples', () => {
  const packed = packSamples(CODES, COS, SIN, new Uint8Array(CODES.length).fill(1));

  it.each(['turn', 'rad'] as const)('reads every field as the format defines it (%s codes)', (format) => {
    const want = unpackByView(packed, format);
    const got = unpackSamples(packed, format);
    expect(Array.from(got.codes)).toEqual(want.codes);
    expect(Array.from(got.cos)).toEqual(want.cos);
    expect(Array.from(got.sin)).toEqual(want.sin);
    if (format === 'turn') expect(got.codes[3]).toBe(2 ** 31);
    else expect(got.codes[3]).toBe(-(2 ** 31));
  });

  it('reads a buffer at an odd offset (a blob inside a larger allocation) the same', () => {
    const holder = new Uint8Array(packed.length + 3);
    holder.set(packed, 3);
    const shifted = holder.subarray(3);
    expect(unpackSamples(shifted, 'turn')).toEqual(unpackSamples(packed, 'turn'));
    expect(unpackSamples(shifted, 'rad')).toEqual(unpackSamples(packed, 'rad'));
  });

  it('unpacks batch by batch into the same values as all at once', () => {
    const whole = unpackSamples(packed, 'turn');
    const batch = { codes: new Float64Array(3), cos: new Int32Array(3), sin: new Int32Array(3) };
    const codes: number[] = [];
    for (let first = 0; first < CODES.length; first += 3) {
      const n = Math.min(3, CODES.length - first);
      unpackSamplesInto(packed, 'turn', first, n, batch);
      codes.push(...batch.codes.subarray(0, n));
      expect(Array.from(batch.cos.subarray(0, n))).toEqual(Array.from(whole.cos.subarray(first, first + n)));
    }
    expect(codes).toEqual(Array.from(whole.codes));
  });

  it('refuses a length that is not whole samples', () => {
    expect(() => unpackSamples(packed.subarray(0, 13), 'turn')).toThrow(SamplePackError);
  });
});
