import { describe, expect, it } from 'vitest';
import { verdictRows } from '../../../src/features/sessions/components/verdict-rows';

describe('the verdict per limit', () => {
  const verdict = {
    minCoveragePct: { limit: 90, measured: 100, pass: true },
    maxAbsErrorLsb: { limit: 4, measured: 5.5, pass: false },
    minSfdrDb: { limit: 84, measured: null, pass: null },
    maxModelMismatches: { limit: 0, measured: 0, pass: true },
  };

  it('lists the limits in a fixed order with their requirement in words', () => {
    const rows = verdictRows(verdict);
    expect(rows.map((r) => r.key)).toEqual(['maxAbsErrorLsb', 'minSfdrDb', 'maxModelMismatches', 'minCoveragePct']);
    const words = rows.map((r) => r.limitWords);
    expect([words[0], words[1], words[3]]).toEqual(['at most 4 LSB', 'at least 84 dB', 'at least 90 %']);
    // A count: its unit word (if any) follows the number.
    expect(words[2]).toMatch(/^at most 0( \w+)?$/);
  });

  it('gives the margin as room left: negative when missed, in the direction of each limit', () => {
    const byKey = Object.fromEntries(verdictRows(verdict).map((r) => [r.key, r]));
    expect(byKey.maxAbsErrorLsb).toMatchObject({ margin: -1.5, outcome: 'fail' });
    expect(byKey.minCoveragePct).toMatchObject({ margin: 10, outcome: 'pass' });
    expect(byKey.maxModelMismatches).toMatchObject({ margin: 0, outcome: 'pass' });
  });

  it('says "not measured" for a limit the server could not measure, with no margin', () => {
    expect(verdictRows(verdict).find((r) => r.key === 'minSfdrDb')).toMatchObject({ measured: null, margin: null, outcome: 'not measured' });
  });

  it('has no rows for a core without limits', () => {
    expect(verdictRows({})).toEqual([]);
    expect(verdictRows(null)).toEqual([]);
  });
});
