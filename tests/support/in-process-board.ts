import { LinkEvents, type ByteLink } from '../../shared/bench/byte-link';
import { realClock } from '../../mock-device/line-pacer';
import { defaultBoardSettings, openBoardSession, type BoardSettings } from '../../mock-device/board-session';

/** Real time for the engine, the same clock the simulated board paces with. */
export { realClock as realEngineClock };

/** The simulated board in this process, behind a ByteLink, paced by real time. */
export function inProcessBoard(overrides: Partial<BoardSettings> = {}) {
  const settings = { ...defaultBoardSettings(), ...overrides };
  const events = new LinkEvents();
  const session = openBoardSession(settings, (bytes) => events.emitBytes(bytes));
  const written: Uint8Array[] = [];
  const link: ByteLink & { written: Uint8Array[] } = {
    written,
    get closed() {
      return events.closed;
    },
    write: async (bytes) => {
      written.push(bytes);
      // Asynchronous like hardware: the board sees the bytes after the write returns.
      setTimeout(() => session.receive(bytes), 0);
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
