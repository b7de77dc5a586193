// A real serial port (USB-UART adapter to the board) from Node, as a ByteLink, through the
// `serialport` package. The binding is injectable so tests run on @serialport/binding-mock.
import { SerialPort, type SerialPortOpenOptions } from 'serialport';
import type { AutoDetectTypes } from '@serialport/bindings-cpp';
import { ByteLinkBase, LinkClosedError } from '../../shared/link-engine/byte-link';

export interface SerialLinkOptions {
  path: string;
  /** Line rate; 8N1, no flow control (the bench link's physical layer). */
  baud: number;
  /**
   * The hardware access layer (a serialport binding, e.g. @serialport/binding-mock's MockBinding);
   * default the platform's native binding.
   */
  binding?: object;
}

// Line problems the port reports that leave it usable: reading goes on (see docs/protocol.md "1. Line").
const RECOVERABLE = /overrun|framing|parity|break/i;

/** One open serial port. Writes are serialised in call order through the port's own queue. */
export class PortSerialLink extends ByteLinkBase {
  private requested = false;

  private constructor(private readonly port: SerialPort) {
    super();
    port.on('data', (data: Buffer) => this.events.emitBytes(new Uint8Array(data.buffer, data.byteOffset, data.byteLength)));
    port.on('error', (err: Error) => {
      if (RECOVERABLE.test(err.message)) this.events.emitWarning(err.message);
      else this.gone(`The serial port failed: ${err.message}`);
    });
    port.on('close', (err?: { disconnected?: boolean; message?: string }) => {
      if (this.requested) this.events.emitClose({ requested: true, message: 'Closed by the host' });
      else this.gone(err?.disconnected ? 'The serial adapter was unplugged' : `The serial port closed${err?.message ? `: ${err.message}` : ''}`);
    });
  }

  /** Open the port; reject with a one-line reason (no such port, busy, no permission). */
  static open(options: SerialLinkOptions): Promise<PortSerialLink> {
    const settings = {
      path: options.path,
      baudRate: options.baud,
      dataBits: 8,
      parity: 'none',
      stopBits: 1,
      rtscts: false,
      autoOpen: false,
      ...(options.binding ? { binding: options.binding } : {}),
    } as SerialPortOpenOptions<AutoDetectTypes>;
    let port: SerialPort;
    try {
      port = new SerialPort(settings);
    } catch (err) {
      return Promise.reject(new Error(`Cannot open ${options.path}: ${(err as Error).message}`));
    }
    return new Promise((resolve, reject) => {
      port.open((err) => (err ? reject(new Error(`Cannot open ${options.path}: ${err.message.replace(/^Error: /, '')}`)) : resolve(new PortSerialLink(port))));
    });
  }

  write(bytes: Uint8Array): Promise<void> {
    if (this.closed || !this.port.isOpen) return Promise.reject(new LinkClosedError());
    return new Promise((resolve, reject) => {
      this.port.write(Buffer.from(bytes), (err) => (err ? reject(err) : resolve()));
    });
  }

  close(): Promise<void> {
    if (this.closed) return Promise.resolve();
    this.requested = true;
    return new Promise((resolve) => {
      this.onClose(() => resolve());
      if (!this.port.isOpen) this.events.emitClose({ requested: true, message: 'Closed by the host' });
      else this.port.close((err) => err && this.events.emitClose({ requested: true, message: `Closed by the host (${err.message})` }));
    });
  }

  private gone(message: string) {
    this.events.emitClose({ requested: false, message });
  }
}
