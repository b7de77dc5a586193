import { ByteLinkBase, LinkClosedError } from '../../../../shared/link-engine/byte-link';
import type { SerialSettings } from './serial-options';

/** Read errors after which the port's readable can be taken again (WICG Web Serial draft). */
const RECOVERABLE = new Set(['BufferOverrunError', 'BreakError', 'FramingError', 'ParityError']);

/** Is Web Serial available in this browser (Chromium-based desktop browsers over https or localhost)? */
export const hasWebSerial = (nav: Navigator = navigator) => 'serial' in nav && nav.serial !== undefined;

/**
 * One open Web Serial port as a ByteLink. A background loop reads into listeners; writes go
 * through one promise chain so they never interleave; locks are always released.
 */
export class WebSerialLink extends ByteLinkBase {
  private reader: ReadableStreamDefaultReader<Uint8Array> | null = null;
  private writeChain: Promise<void> = Promise.resolve();
  private readLoop: Promise<void> = Promise.resolve();
  private closing = false;
  private readonly onDisconnect = (e: Event) => {
    if (e.target === this.port) void this.finish(false, 'The serial device was disconnected');
  };

  private constructor(
    private readonly port: SerialPort,
    private readonly serial: Serial,
  ) {
    super();
  }

  /** Open `port` with `settings` and start reading. */
  static async open(port: SerialPort, settings: SerialSettings, serial: Serial = navigator.serial): Promise<WebSerialLink> {
    await port.open({
      baudRate: settings.baudRate,
      dataBits: settings.dataBits,
      stopBits: settings.stopBits,
      parity: settings.parity,
      flowControl: settings.flowControl,
      bufferSize: settings.bufferSize,
    });
    const link = new WebSerialLink(port, serial);
    await port.setSignals({ dataTerminalReady: settings.dataTerminalReady, requestToSend: settings.requestToSend });
    serial.addEventListener('disconnect', link.onDisconnect);
    link.readLoop = link.read();
    return link;
  }


  /** Change DTR/RTS while open (many boards wire them to reset or boot pins). */
  setSignals(signals: { dataTerminalReady?: boolean; requestToSend?: boolean }) {
    return this.port.setSignals(signals);
  }

  write(bytes: Uint8Array): Promise<void> {
    if (this.closed || this.closing) return Promise.reject(new LinkClosedError());
    const next = this.writeChain.then(async () => {
      const writable = this.port.writable;
      if (!writable) throw new LinkClosedError('The serial port is not writable');
      const writer = writable.getWriter();
      try {
        await writer.write(bytes);
      } finally {
        writer.releaseLock();
      }
    });
    // A failed write must not poison the chain for later writes; the caller still sees it.
    this.writeChain = next.catch(() => undefined);
    return next;
  }

  async close(): Promise<void> {
    await this.finish(true, 'Closed by the host');
  }

  private async read() {
    let ended = false;
    while (!ended && !this.closing && this.port.readable) {
      const reader = this.port.readable.getReader();
      this.reader = reader;
      try {
        for (;;) {
          const { value, done } = await reader.read();
          if (done) {
            ended = true; // the stream closed itself: only a lost device does that
            break;
          }
          if (value && value.byteLength) this.events.emitBytes(value);
        }
      } catch (err) {
        const name = (err as Error).name;
        if (this.closing) break;
        if (RECOVERABLE.has(name)) {
          this.events.emitWarning(`${name}: ${(err as Error).message || 'line error'}; reading goes on`);
          continue;
        }
        void this.finish(false, `The serial port failed: ${(err as Error).message || name}`);
        return;
      } finally {
        reader.releaseLock();
        this.reader = null;
      }
    }
    // The readable went away without our asking: the device is gone.
    if (!this.closing) void this.finish(false, 'The serial device stopped answering (port no longer readable)');
  }

  private async finish(requested: boolean, message: string) {
    if (this.closing) return;
    this.closing = true;
    this.serial.removeEventListener('disconnect', this.onDisconnect);
    try {
      await this.reader?.cancel();
    } catch {
      // Already errored: nothing to cancel.
    }
    await this.readLoop;
    await this.writeChain;
    try {
      await this.port.close();
    } catch {
      // A vanished device cannot be closed; the browser has released it already.
    }
    this.events.emitClose({ requested, message });
  }
}
