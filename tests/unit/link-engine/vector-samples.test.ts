import { describe, expect, it } from 'vitest';
import { LIMIT_KEYS, LIMIT_MEANINGS, limitOutsideMode, limitsSchema, VECTOR_LIMIT_KEYS } from '../../../shared/link-engine/limits';
import { SampleCsvError } from '../../../shared/link-engine/sample-csv';
import { SamplePackError } from '../../../shared/link-engine/sample-pack';
import { parseVectorCsv, VECTOR_CSV_HEADER, vectorCsvChunks } from '../../../shared/link-engine/vector-sample-csv';
import { packVectorSamples, unpackVectorSamples, VECTOR_SAMPLE_BYTES } from '../../../shared/link-engine/vector-sample-pack';

const samples = () => ({
  xs: Int32Array.from([0, -32768, 32767, -1]),
  ys: Int32Array.from([0, 5, -32768, -1]),
  angles: Int32Array.from([0, 2 ** 31 - 1, 40000, 1]),
  magnitudes: Int32Array.from([0, -(2 ** 31), 7, 123456]),
});
const csv = (rows: string[]) => [VECTOR_CSV_HEADER, ...rows].join('\n');

describe('vectoring sample records', () => {
  it('pack x, y, angle and magnitude as four little-endian int32 in request order, and unpack them unchanged', () => {
    const packed = packVectorSamples(samples());
    expect(packed.length).toBe(4 * VECTOR_SAMPLE_BYTES);
    // The second record's x is -32768: 0x FFFF8000 little-endian.
    expect(Array.from(packed.subarray(16, 20))).toEqual([0x00, 0x80, 0xff, 0xff]);
    expect(unpackVectorSamples(packed)).toEqual(samples());
  });

  it('leave out what was not answered', () => {
    const back = unpackVectorSamples(packVectorSamples(samples(), [1, 0, 0, 1]));
    expect(Array.from(back.xs)).toEqual([0, -1]);
    expect(Array.from(back.magnitudes)).toEqual([0, 123456]);
  });

  it('refuse a length that is not a whole number of 16-byte records, such as rotation samples', () => {
    expect(() => unpackVectorSamples(new Uint8Array(12 * 3))).toThrow(SamplePackError);
    expect(() => unpackVectorSamples(new Uint8Array(12 * 3))).toThrow(/36 bytes is not a whole number of 16-byte/);
  });
});

describe('vectoring CSV', () => {
  it('reads the four columns, skipping blank lines, with CRLF and a byte-order mark', () => {
    const s = parseVectorCsv('\uFEFFx_code, y_code, angle_code, magnitude_code\r\n1,-2,300,4\r\n\r\n-5,6,0,-7\r\n');
    expect(s).toEqual({ xs: Int32Array.from([1, -5]), ys: Int32Array.from([-2, 6]), angles: Int32Array.from([300, 0]), magnitudes: Int32Array.from([4, -7]) });
  });

  it('is what the export writes, in chunks, and reads back to the same samples', () => {
    const text = [...vectorCsvChunks(samples(), 3)].join('');
    expect(text.split('\n')[0]).toBe(VECTOR_CSV_HEADER);
    expect(text.split('\n')[2]).toBe('-32768,5,2147483647,-2147483648');
    expect(parseVectorCsv(text)).toEqual(samples());
  });

  it.each([
    ['angle_code,cos_code,sin_code\n1,2,3', 1, /header must be "x_code,y_code,angle_code,magnitude_code"/],
    [csv([]), 2, /no samples/],
    [csv(['1,2,3,4', '1,2,3']), 3, /expected 4 values, found 3/],
    [csv(['1,2,3,4', '', '1,2,3,x']), 4, /magnitude_code "x" is not an integer/],
    [csv(['1,2,3,2147483648']), 2, /too large for a 32-bit code/],
  ])('names the bad line of %j', (text, line, message) => {
    let caught: unknown;
    try {
      parseVectorCsv(text);
    } catch (err) {
      caught = err;
    }
    expect(caught).toBeInstanceOf(SampleCsvError);
    expect((caught as SampleCsvError).line).toBe(line);
    expect((caught as Error).message).toMatch(message);
  });
});

describe('limits by core mode', () => {
  it('split into the rotation and the vectoring cores’ limits, sharing model mismatches and link errors', () => {
    expect(LIMIT_KEYS).toEqual(['maxAbsErrorLsb', 'maxRmsErrorLsb', 'maxAbsBiasLsb', 'minSfdrDb', 'maxModelMismatches', 'maxLinkErrors', 'minCoveragePct', 'maxUnstableCodes']);
    expect(VECTOR_LIMIT_KEYS).toEqual(['maxModelMismatches', 'maxLinkErrors', 'maxAngleErrorLsb', 'maxAngleRmsLsb', 'maxMagnitudeErrorLsb', 'maxMagnitudeErrorPpm', 'minPlaneCoveragePct']);
    expect(Object.keys(LIMIT_MEANINGS).sort()).toEqual(Object.keys(limitsSchema.shape).sort());
  });

  it('name the first limit a core of the mode cannot set', () => {
    expect(limitOutsideMode('vectoring', { maxAngleErrorLsb: 4, maxModelMismatches: 0 })).toBeNull();
    expect(limitOutsideMode('vectoring', { maxAngleErrorLsb: 4, maxRmsErrorLsb: 1 })).toBe('maxRmsErrorLsb');
    expect(limitOutsideMode('rotation', { maxAbsErrorLsb: 4, minPlaneCoveragePct: 50 })).toBe('minPlaneCoveragePct');
    expect(limitOutsideMode('rotation', { minPlaneCoveragePct: undefined })).toBeNull();
  });
});
