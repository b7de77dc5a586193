// Traffic on its way to the traffic pane: raw chunks, decoded frames and decoder skips, queued
// as they happen and drained by the pane once per animation frame. The queue is bounded: when
// the pane cannot keep up (or is paused) the oldest entries go and are counted.
import type { DecodedFrame, SkipEvent } from '../../../../shared/link';

export type TrafficEntry =
  | { type: 'bytes'; direction: 'tx' | 'rx'; bytes: Uint8Array; atMs: number }
  | { type: 'frame'; frame: DecodedFrame; atMs: number }
  | { type: 'skip'; event: SkipEvent; atMs: number }
  | { type: 'note'; text: string; atMs: number };

const MAX_QUEUED = 4000;

export class TrafficLog {
  private queue: TrafficEntry[] = [];
  /** Entries dropped since the last drain because the queue was full. */
  private dropped = 0;

  push(e: TrafficEntry) {
    if (this.queue.length >= MAX_QUEUED) {
      this.queue.shift();
      this.dropped++;
    }
    this.queue.push(e);
  }

  drain(): { entries: TrafficEntry[]; dropped: number } {
    const out = { entries: this.queue, dropped: this.dropped };
    this.queue = [];
    this.dropped = 0;
    return out;
  }
}
