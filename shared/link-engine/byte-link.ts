/**
 * A raw byte pipe to a board: a Web Serial port, a WebSocket to the simulated board or a bench
 * bridge, or a real port in the runner. Bytes carry no framing; chunk boundaries mean nothing.
 */
export interface ByteLink {
  /** Send bytes. Writes are delivered in call order. Rejects with LinkClosedError once closed. */
  write(bytes: Uint8Array): Promise<void>;
  /** Every chunk received, in order. */
  onBytes(listener: (bytes: Uint8Array) => void): void;
  /** A recoverable line problem (overrun, framing, parity, break): reading goes on. */
  onWarning(listener: (message: string) => void): void;
  /** The link ended, by close() or because the device went away; called once. */
  onClose(listener: (reason: LinkCloseReason) => void): void;
  close(): Promise<void>;
  readonly closed: boolean;
}

export interface LinkCloseReason {
  /** True when the host asked for it; false when the device or the network went away. */
  requested: boolean;
  message: string;
}

export class LinkClosedError extends Error {
  constructor(message = 'The link is closed') {
    super(message);
    this.name = 'LinkClosedError';
  }
}

/** Listener bookkeeping shared by every ByteLink implementation. */
export class LinkEvents {
  private bytes: Array<(b: Uint8Array) => void> = [];
  private warnings: Array<(m: string) => void> = [];
  private closes: Array<(r: LinkCloseReason) => void> = [];
  private closeReason: LinkCloseReason | null = null;

  get closed() {
    return this.closeReason !== null;
  }
  onBytes(l: (b: Uint8Array) => void) {
    this.bytes.push(l);
  }
  onWarning(l: (m: string) => void) {
    this.warnings.push(l);
  }
  onClose(l: (r: LinkCloseReason) => void) {
    if (this.closeReason) l(this.closeReason);
    else this.closes.push(l);
  }
  emitBytes(b: Uint8Array) {
    for (const l of this.bytes) l(b);
  }
  emitWarning(m: string) {
    for (const l of this.warnings) l(m);
  }
  /** Report the end of the link once; later calls are ignored. */
  emitClose(reason: LinkCloseReason) {
    if (this.closeReason) return;
    this.closeReason = reason;
    for (const l of this.closes.splice(0)) l(reason);
  }
}

/** The listener half of a ByteLink; a transport extends it and adds write and close. */
export abstract class ByteLinkBase implements ByteLink {
  protected readonly events = new LinkEvents();

  get closed() {
    return this.events.closed;
  }
  onBytes(l: (b: Uint8Array) => void) {
    this.events.onBytes(l);
  }
  onWarning(l: (m: string) => void) {
    this.events.onWarning(l);
  }
  onClose(l: (r: LinkCloseReason) => void) {
    this.events.onClose(l);
  }
  abstract write(bytes: Uint8Array): Promise<void>;
  abstract close(): Promise<void>;
}
