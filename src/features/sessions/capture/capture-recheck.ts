// What the capture pane says about decoding the recorded bytes again: whether they give the
// frames the recorder kept. Only directions whose frames were kept can be compared.
import type { Direction } from '../../../../shared/link';
import type { SessionCapture } from '../api/get-session-capture';

export const DIRECTION_WORDS: Record<Direction, string> = { 'to-device': 'to the device', 'to-host': 'from the device' };

type Recheck = Pick<SessionCapture, 'checked' | 'recordedFrames' | 'replayedFrames' | 'replayedSkips'>;

export const recheckMatches = (c: Recheck) => c.replayedFrames === c.recordedFrames;

export function recheckText(c: Recheck): string {
  if (c.checked.length === 0) return 'The capture holds bytes only (no decoded frames were recorded to compare with).';
  const which = c.checked.length === 2 ? '' : ` ${DIRECTION_WORDS[c.checked[0]]}`;
  const n = (v: number) => v.toLocaleString('en-US');
  return recheckMatches(c)
    ? `Decoded again: ${n(c.replayedFrames)} frames${which} and ${n(c.replayedSkips)} skips, the same frames as recorded.`
    : `Decoded again: ${n(c.replayedFrames)} frames${which}, but ${n(c.recordedFrames)} were recorded. The capture may be damaged.`;
}
