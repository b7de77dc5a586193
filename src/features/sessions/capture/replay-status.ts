// The capture pane's status line: what the terminal shows, in words a screen reader can follow
// (xterm's own text is not announced). Pure, so every wording is tested without a browser.
import type { ArchiveRecord } from '../../../../shared/link';

export type ReplayPhase = 'idle' | 'replaying' | 'stopped' | 'finished';

export interface ReplayStatus {
  phase: ReplayPhase;
  /** Frames among the listed records, and how many of them a replay has shown so far. */
  framesTotal: number;
  framesShown: number;
  /** Records listed, and how many of them a replay has shown so far. */
  records: number;
  recordsShown?: number;
  /** Recorded time of the listed records, and how far into it a replay has come. */
  durationS: number;
  elapsedS: number;
  speed: number;
  /** Long silences are shortened in this replay (its seconds are still recorded time). */
  skipSilences?: boolean;
  /** Set when only one direction is listed, e.g. "to the device". */
  direction?: string;
}

/** A replay's status line changes at most this often: often enough to follow, not so often a screen reader keeps restarting. */
export const STATUS_EVERY_MS = 500;

const n = (v: number) => v.toLocaleString('en-US');
const frames = (v: number) => `${n(v)} ${v === 1 ? 'frame' : 'frames'}`;
const records = (v: number) => `${n(v)} ${v === 1 ? 'record' : 'records'}`;
const seconds = (s: number) => `${s.toLocaleString('en-US', { minimumFractionDigits: 1, maximumFractionDigits: 1 })} s`;

export function statusText(s: ReplayStatus): string {
  // Bench captures record the device's frames only: with just the requests listed, count records.
  const byRecords = s.framesTotal === 0 && s.records > 0;
  const where = byRecords ? `record ${n(s.recordsShown ?? 0)} of ${n(s.records)}` : `frame ${n(s.framesShown)} of ${n(s.framesTotal)}`;
  const at = `${where}, ${seconds(Math.min(s.elapsedS, s.durationS))} of ${seconds(s.durationS)}`;
  switch (s.phase) {
    case 'idle':
      return `${byRecords ? 'No decoded frames recorded' : frames(s.framesTotal)} in ${records(s.records)}${s.direction ? ` ${s.direction}` : ''}, ${seconds(s.durationS)} of traffic`;
    case 'replaying':
      return `Replaying${s.speed === 1 ? '' : ` ${s.speed}× faster`}${s.skipSilences ? ', skipping silences' : ''}: ${at}`;
    case 'stopped':
      return `Stopped at ${at}`;
    case 'finished':
      return `Replay finished: ${byRecords ? records(s.records) : frames(s.framesTotal)}, ${seconds(s.durationS)} of traffic`;
  }
}

/** `before[i]`: how many of the first `i` records are frames (length records + 1). */
export function framesBefore(records: readonly ArchiveRecord[]): Uint32Array {
  const before = new Uint32Array(records.length + 1);
  records.forEach((r, i) => (before[i + 1] = before[i] + (r.type === 'frame' ? 1 : 0)));
  return before;
}
