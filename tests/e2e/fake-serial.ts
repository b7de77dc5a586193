// A fake Web Serial port in the page, wired to a simulated board in the test's own process: the
// page's navigator.serial gives one port whose readable and writable carry the board's line bytes
// through functions the test exposes to the page. The page's own transport code drives it.
import type { Page } from 'playwright-core';
import { defaultBoardSettings, openBoardSession, type BoardSettings } from '../../mock-device/board-session';

/** What the page did with the port, as the board's end saw it. */
export interface FakeSerialBoard {
  /** The options of each port.open(), as the page passed them. */
  readonly opened: Record<string, unknown>[];
  /** Each setSignals() call. */
  readonly signals: Record<string, unknown>[];
  /** Bytes the page wrote to the port. */
  readonly bytesFromPage: number;
  /** Times the page closed the port. */
  readonly closes: number;
}

/** Runs in the page before its own scripts: a navigator.serial with one port. */
function installFakeSerial() {
  type Binding = (arg?: string) => Promise<string | null>;
  const call = (name: string) => (window as unknown as Record<string, Binding>)[name];
  const fromBase64 = (s: string) => Uint8Array.from(atob(s), (c) => c.charCodeAt(0));
  const toBase64 = (b: Uint8Array) => {
    let s = '';
    for (let i = 0; i < b.length; i += 0x8000) s += String.fromCharCode(...b.subarray(i, i + 0x8000));
    return btoa(s);
  };
  class FakeSerialPort extends EventTarget {
    readable: ReadableStream<Uint8Array> | null = null;
    writable: WritableStream<Uint8Array> | null = null;
    getInfo() {
      return { usbVendorId: 0x0403, usbProductId: 0x6015 };
    }
    async open(options: object) {
      if (this.readable) throw new DOMException('The port is already open.', 'InvalidStateError');
      await call('__fakeSerialOpen')(JSON.stringify(options));
      this.readable = new ReadableStream<Uint8Array>({
        pull: async (controller) => {
          const chunk = await call('__fakeSerialRead')();
          if (chunk === null) controller.close();
          else controller.enqueue(fromBase64(chunk));
        },
      });
      this.writable = new WritableStream<Uint8Array>({
        write: async (chunk) => {
          await call('__fakeSerialWrite')(toBase64(chunk));
        },
      });
    }
    async setSignals(signals: object) {
      await call('__fakeSerialSignals')(JSON.stringify(signals));
    }
    async close() {
      this.readable = null;
      this.writable = null;
      await call('__fakeSerialClose')();
    }
  }
  const port = new FakeSerialPort();
  const serial = Object.assign(new EventTarget(), { requestPort: async () => port, getPorts: async () => [port] });
  Object.defineProperty(Navigator.prototype, 'serial', { configurable: true, get: () => serial });
}

/**
 * Give `page` (before it loads) a navigator.serial whose one port has a simulated board with
 * `overrides` behind it; a fresh board each time the page opens the port.
 */
export async function fakeSerialBoard(page: Page, overrides: Partial<BoardSettings> = {}): Promise<FakeSerialBoard> {
  const state = { opened: [] as Record<string, unknown>[], signals: [] as Record<string, unknown>[], bytesFromPage: 0, closes: 0 };
  let session: ReturnType<typeof openBoardSession> | null = null;
  // The board's bytes wait here until the page's next read takes them all.
  let queued: Buffer[] = [];
  let waiting: ((chunk: string | null) => void) | null = null;
  const deliver = (bytes: Uint8Array) => {
    queued.push(Buffer.from(bytes));
    if (waiting) take(waiting);
  };
  const take = (resolve: (chunk: string | null) => void) => {
    waiting = null;
    const chunk = Buffer.concat(queued).toString('base64');
    queued = [];
    resolve(chunk);
  };

  await page.exposeFunction('__fakeSerialOpen', (options: string) => {
    state.opened.push(JSON.parse(options) as Record<string, unknown>);
    queued = [];
    session = openBoardSession({ ...defaultBoardSettings(), ...overrides }, deliver);
    return null;
  });
  await page.exposeFunction(
    '__fakeSerialRead',
    () =>
      new Promise<string | null>((resolve) => {
        if (!session) return resolve(null);
        if (queued.length) take(resolve);
        else waiting = resolve;
      }),
  );
  await page.exposeFunction('__fakeSerialWrite', (chunk: string) => {
    const bytes = Buffer.from(chunk, 'base64');
    state.bytesFromPage += bytes.length;
    session?.receive(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength));
    return null;
  });
  await page.exposeFunction('__fakeSerialSignals', (signals: string) => {
    state.signals.push(JSON.parse(signals) as Record<string, unknown>);
    return null;
  });
  await page.exposeFunction('__fakeSerialClose', () => {
    state.closes++;
    session?.close();
    session = null;
    waiting?.(null);
    waiting = null;
    return null;
  });
  await page.addInitScript(installFakeSerial);
  return state;
}
