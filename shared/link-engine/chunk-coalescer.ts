// Merges a byte stream's small chunks into fewer, larger ones for a message transport. A board
// paced at 1 ms ticks (or a serial port delivering USB packets) yields a chunk a millisecond; sent
// as one WebSocket message each, the browser spends more on the messages than on the bytes. A few
// milliseconds of delay, far below any link timeout, cut the message rate several times over.
import type { EngineClock } from './link-engine';

export interface ChunkCoalescerOptions {
  clock: EngineClock;
  emit: (chunk: Uint8Array) => void;
  /** Longest a byte waits for company, ms. Default 5. */
  maxDelayMs?: number;
  /** Bytes that go out at once without waiting. Default 8 KiB. */
  flushBytes?: number;
}

export class ChunkCoalescer {
  private parts: Uint8Array[] = [];
  private size = 0;
  private cancel: (() => void) | null = null;
  private closed = false;

  constructor(private readonly o: ChunkCoalescerOptions) {}

  push(bytes: Uint8Array): void {
    if (this.closed || bytes.length === 0) return;
    this.parts.push(bytes);
    this.size += bytes.length;
    if (this.size >= (this.o.flushBytes ?? 8192)) this.flush();
    else this.cancel ??= this.o.clock.after(this.o.maxDelayMs ?? 5, () => this.flush());
  }

  /** Send what waits now, in order. */
  flush(): void {
    this.cancel?.();
    this.cancel = null;
    if (this.size === 0) return;
    const parts = this.parts;
    const out = parts.length === 1 ? parts[0] : new Uint8Array(this.size);
    if (parts.length > 1) {
      let at = 0;
      for (const p of parts) {
        out.set(p, at);
        at += p.length;
      }
    }
    this.parts = [];
    this.size = 0;
    this.o.emit(out);
  }

  /** Drop what waits and take no more (the peer is gone). */
  close(): void {
    this.closed = true;
    this.cancel?.();
    this.cancel = null;
    this.parts = [];
    this.size = 0;
  }
}
