import { describe, expect, it } from 'vitest';
import { linkFigureRows } from '../../../src/features/sessions/detail/link-figure-rows';
import { emptyFigures, type LinkFigures } from '../../../shared/link-engine/link-figures';

const asMap = (rows: { label: string; value: string }[]) => Object.fromEntries(rows.map((r) => [r.label, r.value]));

describe('link figures on the session page', () => {
  const figures: LinkFigures = {
    ...emptyFigures(),
    framesSent: 12_345,
    framesReceived: 12_340,
    bytesSent: 98_760,
    bytesReceived: 1_234_567,
    checkFailures: 3,
    skippedBytes: 41,
    naks: { ...emptyFigures().naks, 1: 2, 4: 1 },
    retries: 5,
    duplicates: 1,
    strayReplies: 0,
    confirmations: 4,
    unconfirmed: 1,
    resultsPerS: 2_871.456,
    lineShare: 0.8734,
  };

  it('reads every figure with its unit and thousands grouped, in reading order', () => {
    const rows = linkFigureRows(figures as unknown as Record<string, unknown>);
    expect(rows).toEqual([
      { label: 'Frames out / in', value: '12,345 / 12,340' },
      { label: 'Bytes out / in', value: '98,760 B / 1,234,567 B' },
      { label: 'Frames with a bad CHECK', value: '3' },
      { label: 'Bytes skipped by the decoder', value: '41 B' },
      { label: 'NAKs by reason', value: '3 (bad CHECK 2, paused 1)' },
      { label: 'Retries', value: '5' },
      { label: 'Duplicate results', value: '1' },
      { label: 'Stray replies', value: '0' },
      { label: 'Confirmations / unconfirmed', value: '4 / 1' },
      { label: 'Results per second', value: '2,871.5 /s' },
      { label: 'Line use (replies)', value: '87.3 %' },
    ]);
  });

  it('says "none" when no NAK came, and names a reason code it does not know', () => {
    expect(asMap(linkFigureRows({ naks: emptyFigures().naks }))['NAKs by reason']).toBe('none');
    expect(asMap(linkFigureRows({ naks: { 9: 2, 5: 1 } }))['NAKs by reason']).toBe('3 (queue full 1, reason 9 2)');
  });

  it('shows only the figures a partial record holds, and lists unknown ones plainly', () => {
    const rows = linkFigureRows({ checkFailures: 0, retries: 1200, framesSent: 7, driftPpm: -12.5, note: { a: 1 } });
    expect(rows).toEqual([
      { label: 'Frames out / in', value: '7 / —' },
      { label: 'Frames with a bad CHECK', value: '0' },
      { label: 'Retries', value: '1,200' },
      { label: 'driftPpm', value: '-12.5' },
      { label: 'note', value: '{"a":1}' },
    ]);
  });

  it('shows a known figure stored as something other than a number as it is', () => {
    expect(asMap(linkFigureRows({ retries: 'many', naks: [1, 2] }))).toEqual({ Retries: 'many', 'NAKs by reason': '[1,2]' });
  });
});
