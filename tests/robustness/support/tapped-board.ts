// The simulated board in this process with its line faults applied here rather than inside the
// board session, so the test also sees the clean bytes the board sent: what the host decodes can
// then be told apart into frames the board really sent and frames made by damage on the line.
import { LinkEvents, type ByteLink } from '../../../shared/link-engine/byte-link';
import { FrameDecoder, type DecodedFrame } from '../../../shared/link/decoder';
import { defaultBoardSettings, openBoardSession, type BoardSettings } from '../../../mock-device/board-session';
import { LineFaults, noLineFaults, type LineFaultSettings } from '../../../mock-device/line-faults';
import { realClock } from '../../../mock-device/line-pacer';

const frameKey = (f: Pick<DecodedFrame, 'kind' | 'tag' | 'payload'>) => `${f.kind}.${f.tag}.${Buffer.from(f.payload).toString('hex')}`;

export function tappedBoard(lineFaults: LineFaultSettings, overrides: Partial<BoardSettings> = {}) {
  const events = new LinkEvents();
  const faults = new LineFaults(lineFaults);
  const sent = new Set<string>();
  // The clean reply stream, decoded with the profile the board announces (the default core here).
  const clean = new FrameDecoder({ accept: 'replies', onFrame: (f) => sent.add(frameKey(f)) });
  let releaseAt = 0;
  let closed = false;
  // The same fault order as board-session.ts: corrupt the chunk, then delay it without reordering.
  const deliver = (chunk: Uint8Array) => {
    clean.push(chunk);
    const bytes = faults.corrupt(chunk);
    if (bytes.length === 0) return;
    releaseAt = Math.max(releaseAt, realClock.now() + faults.jitter());
    realClock.after(releaseAt - realClock.now(), () => !closed && events.emitBytes(bytes));
  };
  const session = openBoardSession({ ...defaultBoardSettings(), ...overrides, lineFaults: noLineFaults }, deliver);
  const link: ByteLink = {
    get closed() {
      return events.closed;
    },
    write: async (bytes) => {
      setTimeout(() => session.receive(bytes), 0);
    },
    onBytes: (l) => events.onBytes(l),
    onWarning: (l) => events.onWarning(l),
    onClose: (l) => events.onClose(l),
    close: async () => {
      closed = true;
      session.close();
      events.emitClose({ requested: true, message: 'closed' });
    },
  };
  return {
    link,
    faults,
    /** True when the board really sent this frame (so it was not made by line damage). */
    wasSent: (f: DecodedFrame) => sent.has(frameKey(f)),
  };
}
