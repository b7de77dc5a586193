import { LinkEvents, type ByteLink } from '../../shared/link-engine/byte-link';
import type { EngineClock } from '../../shared/link-engine/link-engine';
import { realClock } from '../../mock-device/line-pacer';
import { defaultBoardSettings, openBoardSession, type BoardSettings } from '../../mock-device/board-session';

/** Real time for the engine, the same clock the simulated board paces with. */
export { realClock as realEngineClock };

/**
 * The simulated board in this process, behind a ByteLink, paced by real time or by `clock`.
 * `toHost`, when given, carries each chunk of the board's bytes to the host (`emit`), so a test
 * can hold bytes back.
 */
export function inProcessBoard(
  overrides: Partial<BoardSettings> = {},
  { clock = realClock, toHost }: { clock?: EngineClock; toHost?: (bytes: Uint8Array, emit: (bytes: Uint8Array) => void) => void } = {},
) {
  const settings = { ...defaultBoardSettings(), ...overrides };
  const events = new LinkEvents();
  const emit = (bytes: Uint8Array) => events.emitBytes(bytes);
  const session = openBoardSession(settings, toHost ? (bytes) => toHost(bytes, emit) : emit, clock);
  const written: Uint8Array[] = [];
  const link: ByteLink & { written: Uint8Array[] } = {
    written,
    get closed() {
      return events.closed;
    },
    write: async (bytes) => {
      written.push(bytes);
      // Asynchronous like hardware: the board sees the bytes after the write returns.
      clock.after(0, () => session.receive(bytes));
    },
    onBytes: (l) => events.onBytes(l),
    onWarning: (l) => events.onWarning(l),
    onClose: (l) => events.onClose(l),
    close: async () => {
      session.close();
      events.emitClose({ requested: true, message: 'closed' });
    },
  };
  return { link, session, settings };
}
