/**
 * Paces the simulated board's output to a UART's line rate: 8N1 carries baud/10 bytes a second
 * (common practice, no source), and the pacer never lets the total sent run ahead of that.
 * Bytes leave in chunks of whatever accumulated since the last tick, the way a USB-serial adapter
 * merges and splits the line into packets, so chunk boundaries carry no meaning.
 */
import type { EngineClock } from '../shared/link-engine/link-engine';

/** The same injected time as the link engine's, so one clock serves both ends in tests. */
export type PacerClock = EngineClock;

export const realClock: PacerClock = {
  now: () => performance.now(),
  after: (ms, fn) => {
    const t = setTimeout(fn, ms);
    return () => clearTimeout(t);
  },
};

export interface LinePacerOptions {
  baud: number;
  /** Where paced chunks go (a WebSocket send, say). */
  emit: (chunk: Uint8Array) => void;
  /** Milliseconds between deliveries while busy; 1 ms is one USB full-speed frame. Default 1. */
  tickMs?: number;
  /** Most bytes held before `write` reports back-pressure. Default 1 MiB. */
  maxQueuedBytes?: number;
  clock?: PacerClock;
}

export class LinePacer {
  private readonly bytesPerMs: number;
  private readonly tickMs: number;
  private readonly clock: PacerClock;
  private readonly chunks: Uint8Array[] = [];
  private headOffset = 0;
  private queued = 0;
  private busySinceMs = 0;
  private sentSinceBusy = 0;
  private cancelTick: (() => void) | null = null;
  private drainWaiters: Array<() => void> = [];
  private stopped = false;

  constructor(private readonly options: LinePacerOptions) {
    if (!(options.baud >= 300 && options.baud <= 20_000_000)) throw new RangeError(`baud must be 300..20,000,000, got ${options.baud}`);
    this.bytesPerMs = options.baud / 10 / 1000;
    this.tickMs = options.tickMs ?? 1;
    this.clock = options.clock ?? realClock;
  }

  /** Bytes waiting for the line. */
  get queuedBytes() {
    return this.queued;
  }

  /** Queue bytes for the line; false when the queue is past its limit (the caller should wait). */
  write(bytes: Uint8Array): boolean {
    if (this.stopped || bytes.length === 0) return !this.stopped;
    if (this.queued === 0) {
      this.busySinceMs = this.clock.now();
      this.sentSinceBusy = 0;
    }
    this.chunks.push(bytes);
    this.queued += bytes.length;
    if (!this.cancelTick) this.cancelTick = this.clock.after(0, () => this.tick());
    return this.queued <= (this.options.maxQueuedBytes ?? 1 << 20);
  }

  /** Resolve once everything queued has gone out. */
  drained(): Promise<void> {
    if (this.queued === 0) return Promise.resolve();
    return new Promise((resolve) => this.drainWaiters.push(resolve));
  }

  /** Drop whatever is queued and stop. */
  stop() {
    this.stopped = true;
    this.cancelTick?.();
    this.cancelTick = null;
    this.chunks.length = 0;
    this.queued = 0;
    for (const w of this.drainWaiters.splice(0)) w();
  }

  private tick() {
    this.cancelTick = null;
    if (this.stopped) return;
    const allowed = Math.floor((this.clock.now() - this.busySinceMs) * this.bytesPerMs) - this.sentSinceBusy;
    const n = Math.min(allowed, this.queued);
    if (n > 0) {
      this.options.emit(this.take(n));
      this.sentSinceBusy += n;
    }
    if (this.queued > 0) this.cancelTick = this.clock.after(this.tickMs, () => this.tick());
    else for (const w of this.drainWaiters.splice(0)) w();
  }

  /** Take the next n queued bytes as one chunk. */
  private take(n: number): Uint8Array {
    const out = new Uint8Array(n);
    let filled = 0;
    while (filled < n) {
      const head = this.chunks[0];
      const part = Math.min(head.length - this.headOffset, n - filled);
      out.set(head.subarray(this.headOffset, this.headOffset + part), filled);
      filled += part;
      this.headOffset += part;
      if (this.headOffset === head.length) {
        this.chunks.shift();
        this.headOffset = 0;
      }
    }
    this.queued -= n;
    return out;
  }
}
