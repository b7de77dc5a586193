// Traffic on its way to the traffic pane: raw chunks, decoded frames and decoder skips, queued
// as they happen and drained by the pane a few times a second. The queue is bounded: when the
// pane cannot keep up (or is paused) the oldest entries go and are counted.
import type { DecodedFrame, SkipEvent } from '../../../../shared/link';

export type TrafficEntry =
  | { type: 'bytes'; direction: 'tx' | 'rx'; bytes: Uint8Array; atMs: number }
  | { type: 'frame'; frame: DecodedFrame; atMs: number }
  | { type: 'skip'; event: SkipEvent; atMs: number }
  | { type: 'note'; text: string; atMs: number };

export const MAX_QUEUED = 4000;

export class TrafficLog {
  private queue: TrafficEntry[] = [];
  /** Entries before `head` are dropped; compacted on drain rather than shifted on every push. */
  private head = 0;
  /** Entries dropped since the last drain because the queue was full. */
  private dropped = 0;

  push(e: TrafficEntry) {
    if (this.queue.length - this.head >= MAX_QUEUED) {
      this.head++;
      this.dropped++;
      if (this.head >= MAX_QUEUED) {
        this.queue = this.queue.slice(this.head);
        this.head = 0;
      }
    }
    this.queue.push(e);
  }

  drain(): { entries: TrafficEntry[]; dropped: number } {
    const out = { entries: this.head ? this.queue.slice(this.head) : this.queue, dropped: this.dropped };
    this.queue = [];
    this.head = 0;
    this.dropped = 0;
    return out;
  }
}
