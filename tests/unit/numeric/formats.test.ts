import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { AngleCodeError, OutputCodeError } from '../../../shared/numeric/errors';
import {
  angleCodeRange,
  angleCodeToDegrees,
  angleCodeToRadians,
  angleCodeToTurns,
  degreesToAngleCode,
  fieldBytes,
  outputCodeRange,
  outputCodeToValue,
  outputLsb,
  radiansToAngleCode,
  signExtend,
  toTwosComplement,
  turnsToAngleCode,
  valueToOutputCode,
  wrapOrSaturateAngleCode,
  type AngleFormat,
} from '../../../shared/numeric/formats';

const turn16: AngleFormat = { angleFormat: 'turn', angleBits: 16, angleFrac: 0 };
const rad16: AngleFormat = { angleFormat: 'rad', angleBits: 16, angleFrac: 12 };

const angleFormatArb = fc.oneof(
  fc.integer({ min: 2, max: 32 }).map((angleBits): AngleFormat => ({ angleFormat: 'turn', angleBits, angleFrac: 0 })),
  fc
    .integer({ min: 2, max: 32 })
    .chain((angleBits) => fc.integer({ min: 0, max: angleBits }).map((angleFrac): AngleFormat => ({ angleFormat: 'rad', angleBits, angleFrac }))),
);
const formatAndCode = angleFormatArb.chain((f) => {
  const r = angleCodeRange(f);
  return fc.tuple(fc.constant(f), fc.integer({ min: r.min, max: r.max }));
});

describe('angle formats', () => {
  it('decode(encode(x)) = x through turns, radians and degrees, for every format and code', () => {
    fc.assert(
      fc.property(formatAndCode, ([f, code]) => {
        expect(turnsToAngleCode(f, angleCodeToTurns(f, code))).toBe(code);
        expect(radiansToAngleCode(f, angleCodeToRadians(f, code))).toBe(code);
        expect(degreesToAngleCode(f, angleCodeToDegrees(f, code))).toBe(code);
      }),
      { numRuns: 2000 },
    );
  });

  it('maps degrees to 16-bit binary angles as the binary-angle convention tabulates', () => {
    // docs/references.md "Number formats" (binary angle; common practice, no source).
    expect(degreesToAngleCode(turn16, 1)).toBe(182);
    expect(degreesToAngleCode(turn16, 10)).toBe(1820);
    expect(degreesToAngleCode(turn16, 30)).toBe(5461);
    expect(angleCodeToDegrees(turn16, 5461)).toBeCloseTo(29.99817, 5);
    expect(degreesToAngleCode(turn16, 45)).toBe(0x2000);
    expect(degreesToAngleCode(turn16, 90)).toBe(0x4000);
    expect(degreesToAngleCode(turn16, 180)).toBe(0x8000);
    expect(degreesToAngleCode(turn16, 270)).toBe(0xc000);
    expect(angleCodeToDegrees(turn16, 1)).toBe(0.0054931640625);
  });

  it('wraps binary angles modulo a full turn, negative angles included', () => {
    // docs/references.md "Number formats": a binary angle wraps modulo 2^N (common practice, no source).
    expect(degreesToAngleCode(turn16, -90)).toBe(0xc000);
    expect(degreesToAngleCode(turn16, 360 + 45)).toBe(0x2000);
    expect(degreesToAngleCode(turn16, 359.999)).toBe(0);
    expect(wrapOrSaturateAngleCode(turn16, 65536 + 5)).toBe(5);
    expect(wrapOrSaturateAngleCode(turn16, -1)).toBe(65535);
  });

  it('covers [-8, 8) rad with 16 bits and 12 fraction bits, and saturates sweeps there', () => {
    // docs/protocol.md "3. Numbers": 16 bits, 12 fraction bits covers [-8, 8) rad.
    expect(angleCodeRange(rad16)).toEqual({ min: -32768, max: 32767, count: 65536 });
    expect(angleCodeToRadians(rad16, -32768)).toBe(-8);
    expect(angleCodeToRadians(rad16, 32767)).toBe(8 - 2 ** -12);
    expect(radiansToAngleCode(rad16, 2 * Math.PI)).toBe(Math.round(2 * Math.PI * 4096));
    expect(wrapOrSaturateAngleCode(rad16, 40000)).toBe(32767);
    expect(wrapOrSaturateAngleCode(rad16, -40000)).toBe(-32768);
  });

  it('refuses angles a rad format cannot hold and codes that are not in the format', () => {
    expect(() => radiansToAngleCode(rad16, 8)).toThrow(AngleCodeError);
    expect(() => degreesToAngleCode(rad16, -500)).toThrow(/outside the rad format/);
    expect(() => angleCodeToTurns(turn16, 65536)).toThrow(AngleCodeError);
    expect(() => angleCodeToTurns(turn16, -1)).toThrow(/0\.\.65535/);
    expect(() => angleCodeToRadians(rad16, 1.5)).toThrow(AngleCodeError);
    expect(() => turnsToAngleCode(turn16, Number.NaN)).toThrow(AngleCodeError);
  });
});

describe('output formats', () => {
  it('reads 16-bit outputs with 14 fraction bits as the protocol states: 1.0 is 16384', () => {
    // docs/protocol.md "3. Numbers".
    const f = { outBits: 16, outFrac: 14 };
    expect(valueToOutputCode(f, 1)).toBe(16384);
    expect(outputLsb(f)).toBe(2 ** -14);
    expect(outputCodeRange(f)).toEqual({ min: -32768, max: 32767, count: 65536 });
  });

  it('gives Q15 its usual range and LSB', () => {
    // docs/references.md "Number formats": Q15 is [-1, 1 - 2^-15], LSB 3.0517578125e-5
    // (DSP vendor fixed-point library documentation; common practice).
    const q15 = { outBits: 16, outFrac: 15 };
    expect(outputLsb(q15)).toBe(3.0517578125e-5);
    expect(outputCodeToValue(q15, -32768)).toBe(-1);
    expect(outputCodeToValue(q15, 32767)).toBe(1 - 2 ** -15);
    expect(() => valueToOutputCode(q15, 1)).toThrow(OutputCodeError);
  });

  it('decode(encode(x)) = x for every output format and code', () => {
    const arb = fc
      .integer({ min: 2, max: 24 })
      .chain((outBits) => fc.integer({ min: 0, max: outBits - 1 }).map((outFrac) => ({ outBits, outFrac })))
      .chain((f) => fc.tuple(fc.constant(f), fc.integer({ min: -(2 ** (f.outBits - 1)), max: 2 ** (f.outBits - 1) - 1 })));
    fc.assert(
      fc.property(arb, ([f, code]) => {
        expect(valueToOutputCode(f, outputCodeToValue(f, code))).toBe(code);
      }),
      { numRuns: 2000 },
    );
  });

  it('refuses output codes outside the format', () => {
    expect(() => outputCodeToValue({ outBits: 8, outFrac: 6 }, 128)).toThrow(/-128\.\.127/);
  });
});

describe('wire fields', () => {
  it('sizes fields as ceil(bits / 8) bytes', () => {
    // docs/protocol.md "3. Numbers".
    expect([1, 8, 9, 16, 17, 24, 25, 32].map(fieldBytes)).toEqual([1, 1, 2, 2, 3, 3, 4, 4]);
  });

  it('sign-extends two\u2019s-complement fields up to 32 bits and back', () => {
    // Two's complement (common practice, no source): the top bit carries weight -2^(bits-1).
    expect(signExtend(0xffff, 16)).toBe(-1);
    expect(signExtend(0x8000, 16)).toBe(-32768);
    expect(signExtend(0x7fff, 16)).toBe(32767);
    expect(signExtend(0xffffffff, 32)).toBe(-1);
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 32 }).chain((bits) => fc.tuple(fc.constant(bits), fc.integer({ min: -(2 ** (bits - 1)), max: 2 ** (bits - 1) - 1 }))), ([bits, v]) => {
        const raw = toTwosComplement(v, bits);
        expect(raw).toBeGreaterThanOrEqual(0);
        expect(raw).toBeLessThan(2 ** bits);
        expect(signExtend(raw, bits)).toBe(v);
      }),
    );
  });
});
