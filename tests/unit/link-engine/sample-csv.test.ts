import { describe, expect, it } from 'vitest';
import { parseSampleCsv, SampleCsvError } from '../../../shared/link-engine/sample-csv';
import { packColumns, unpackSamples } from '../../../shared/link-engine/sample-pack';

const csv = (rows: string[]) => ['angle_code,cos_code,sin_code', ...rows].join('\n');

describe('sample CSV', () => {
  it('reads rows of three integer codes, skipping blank lines, with CRLF and a byte-order mark', () => {
    const s = parseSampleCsv('\uFEFFangle_code, cos_code, sin_code\r\n0,32767,0\r\n\r\n16384,-3,-32768\r\n');
    expect(Array.from(s.codes)).toEqual([0, 16384]);
    expect(Array.from(s.cos)).toEqual([32767, -3]);
    expect(Array.from(s.sin)).toEqual([0, -32768]);
  });

  it('round-trips through the packed sample format', () => {
    const s = parseSampleCsv(csv(['65535,32767,-3', '1,2,3']));
    const back = unpackSamples(packColumns(s), 'turn');
    expect(Array.from(back.codes)).toEqual([65535, 1]);
    expect(Array.from(back.sin)).toEqual([-3, 3]);
  });

  it.each([
    ['angle,cos,sin\n1,2,3', 1, /header/],
    [csv([]), 2, /no samples/],
    [csv(['1,2,3', '4,5']), 3, /expected 3 values, found 2/],
    [csv(['1,2,3', '', '4,5,x']), 4, /sin_code "x" is not an integer/],
    [csv(['1.5,2,3']), 2, /angle_code "1.5"/],
    [csv(['1,99999999999,3']), 2, /too large/],
  ])('names the bad line of %j', (text, line, message) => {
    let caught: unknown;
    try {
      parseSampleCsv(text);
    } catch (err) {
      caught = err;
    }
    expect(caught).toBeInstanceOf(SampleCsvError);
    expect((caught as SampleCsvError).line).toBe(line);
    expect((caught as Error).message).toMatch(new RegExp(`^line ${line}: `));
    expect((caught as Error).message).toMatch(message);
  });

  it('reads a session’s CSV export back: its # lines skipped, its three columns taken by name', () => {
    const text = [
      '# condition temperature_c=85',
      '# condition chamber=bay 4, door shut',
      'index,angle_code,angle_deg,cos_code,sin_code,exact_cos,exact_sin,model_cos,model_sin,cos_err_lsb,sin_err_lsb',
      '0,0,0,16384,0,1,0,16384,0,0,0',
      '1,16384,90,-1,16383,6.1e-17,1,0,16384,-1,-1',
    ].join('\n');
    const s = parseSampleCsv(text);
    expect(Array.from(s.codes)).toEqual([0, 16384]);
    expect(Array.from(s.cos)).toEqual([16384, -1]);
    expect(Array.from(s.sin)).toEqual([0, 16383]);
    // Columns in another order are read by name as well.
    expect(Array.from(parseSampleCsv('sin_code,angle_code,cos_code\n5,7,9').cos)).toEqual([9]);
    // A bad row names its line counting the comment lines, and the header's width.
    expect(() => parseSampleCsv(`${text}\n2,3`)).toThrow(/^line 6: expected 11 values, found 2$/);
    expect(() => parseSampleCsv('# condition temperature_c=85\nangle,cos,sin\n1,2,3')).toThrow(/^line 2: the header must be/);
  });

  it('refuses more rows than allowed', () => {
    expect(() => parseSampleCsv(csv(['1,2,3', '4,5,6', '7,8,9']), 2)).toThrow(/more than 2 samples/);
  });
});
