import { describe, expect, it } from 'vitest';
import { LOSS_SILENCE_MS, sweepSegmentFor } from '../../../src/features/bench/live/link-settings';

describe('the Bench page’s link settings', () => {
  it('asks for about a quarter second of results per sweep segment, as a power of two', () => {
    // 8N1: baud/10 bytes a second, about 4 bytes a result on a 16-bit profile.
    expect(sweepSegmentFor(3_000_000)).toBe(16_384);
    expect(sweepSegmentFor(12_000_000)).toBe(65_536);
    expect(sweepSegmentFor(921_600)).toBe(8192);
  });

  it('never goes below the engine’s own segment on slow lines', () => {
    expect(sweepSegmentFor(115_200)).toBe(8192);
    expect(sweepSegmentFor(9600)).toBe(8192);
  });

  it('waits longer than a page stall before counting silence as loss', () => {
    expect(LOSS_SILENCE_MS).toBeGreaterThan(300);
  });
});
