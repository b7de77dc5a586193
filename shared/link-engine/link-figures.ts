import { NakReason } from '../link/kinds';

/** What the link did during a run: the numbers an engineer checks before trusting the results. */
export interface LinkFigures {
  framesSent: number;
  framesReceived: number;
  bytesSent: number;
  bytesReceived: number;
  /** Frames dropped by the decoder for a bad CHECK. */
  checkFailures: number;
  /** Bytes the decoder skipped for any reason (garbage, bad CHECK, impossible LEN or KIND). */
  skippedBytes: number;
  /** NAKs received, by reason code (1..6). */
  naks: Record<number, number>;
  /** Codes asked for again after a NAK, a loss or a timeout. */
  retries: number;
  /** Results that arrived for a code already answered (ignored, never counted twice). */
  duplicates: number;
  /** Replies whose TAG matched no request in flight. */
  strayReplies: number;
  /**
   * Answers asked for again to confirm them: they differed from the reference while the line had
   * just shown damage, and an 8-bit CHECK lets about 1 in 256 damaged frames through.
   */
  confirmations: number;
  /** Of those, answers accepted after every retry without two that agreed. */
  unconfirmed: number;
  /** Results per second over the whole run. */
  resultsPerS: number;
  /** Reply-direction bytes per second as a share of the line's baud/10 (0..1). */
  lineShare: number;
}

export const emptyFigures = (): LinkFigures => ({
  framesSent: 0,
  framesReceived: 0,
  bytesSent: 0,
  bytesReceived: 0,
  checkFailures: 0,
  skippedBytes: 0,
  naks: Object.fromEntries(Object.values(NakReason).map((r) => [r, 0])),
  retries: 0,
  duplicates: 0,
  strayReplies: 0,
  confirmations: 0,
  unconfirmed: 0,
  resultsPerS: 0,
  lineShare: 0,
});

/** Progress of a run, reported a few times a second. */
export interface RunProgress {
  /** Codes answered or given up. */
  done: number;
  answered: number;
  missing: number;
  total: number;
  /** Results per second over the last second or so. */
  ratePerS: number;
  /** Seconds left at that rate; null before there is a rate. */
  etaS: number | null;
  elapsedMs: number;
  paused: boolean;
}
