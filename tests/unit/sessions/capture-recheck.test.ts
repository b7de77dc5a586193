import { describe, expect, it } from 'vitest';
import { recheckMatches, recheckText } from '../../../src/features/sessions/capture/capture-recheck';

describe('the capture re-check line', () => {
  it('compares only the directions whose frames were recorded', () => {
    // The Bench page keeps the device's frames only: its requests decode again but have nothing to match.
    const bench = { checked: ['to-host' as const], recordedFrames: 2, replayedFrames: 2, replayedSkips: 0 };
    expect(recheckMatches(bench)).toBe(true);
    expect(recheckText(bench)).toBe('Decoded again: 2 frames from the device and 0 skips, the same frames as recorded.');
  });

  it('says the capture may be damaged when the counts differ', () => {
    const c = { checked: ['to-host' as const, 'to-device' as const], recordedFrames: 1_057, replayedFrames: 1_056, replayedSkips: 3 };
    expect(recheckMatches(c)).toBe(false);
    expect(recheckText(c)).toBe('Decoded again: 1,056 frames, but 1,057 were recorded. The capture may be damaged.');
  });

  it('says when there is nothing to compare with', () => {
    expect(recheckText({ checked: [], recordedFrames: 0, replayedFrames: 4, replayedSkips: 0 })).toMatch(/bytes only/);
  });
});
