// The session CSV export's condition lines: above the header, the runner's name=value grammar,
// absent when the session has none, and read back by the sample CSV import.
import { describe, expect, it } from 'vitest';
import { CSV_HEADER, sessionCsvChunks } from '../../../server/services/session-csv';
import { parseSampleCsv } from '../../../shared/link-engine/sample-csv';
import { conditionsFromTexts } from '../../../shared/soak';

const samples = { codes: Float64Array.of(0, 16384), cos: Int32Array.of(16384, 0), sin: Int32Array.of(0, 16384) };
const csvOf = (conditions?: Parameters<typeof sessionCsvChunks>[2]) => [...sessionCsvChunks({}, samples, conditions)].join('');

describe('the session CSV export', () => {
  it('starts with one "# condition name=value" line per condition, named ones first, then the header', () => {
    const conditions = { temperature_c: -40, vccint_v: 0.9, clock_mhz: 250, other: { chamber: 'bay 4, door shut', airflow: 'off' } };
    const lines = csvOf(conditions).split('\n');
    expect(lines.slice(0, 6)).toEqual([
      '# condition temperature_c=-40',
      '# condition vccint_v=0.9',
      '# condition clock_mhz=250',
      '# condition chamber=bay 4, door shut',
      '# condition airflow=off',
      CSV_HEADER,
    ]);
    // The lines read back as the conditions they came from, through the runner's own parser.
    const back = conditionsFromTexts(lines.filter((l) => l.startsWith('# condition ')).map((l) => l.slice('# condition '.length)));
    expect(back).toEqual(conditions);
  });

  it('is unchanged for a session without conditions: the header is its first line', () => {
    expect(csvOf().split('\n')[0]).toBe(CSV_HEADER);
    expect(csvOf({})).toBe(csvOf());
  });

  it('reads back through the sample CSV import, conditions and all', () => {
    const s = parseSampleCsv(csvOf({ temperature_c: 85, other: { board: 'rev-b' } }));
    expect(Array.from(s.codes)).toEqual([0, 16384]);
    expect(Array.from(s.cos)).toEqual([16384, 0]);
    expect(Array.from(s.sin)).toEqual([0, 16384]);
  });
});
