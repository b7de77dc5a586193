// One run on a LinkEngine: what to send when, replies, losses and retries; the books of requests
// and answers are kept by its RunLedger. What is asked (angle codes or vectors) is its RunSource's
// business: the run sees run indexes and two answer columns.
import { Kind, NakReason } from '../link/kinds';
import type { DecodedFrame } from '../link/decoder';
import type { LinkEngine, MissingCode, ResultBatch } from './link-engine';
import type { LinkFigures, RunProgress } from './link-figures';
import { RunLedger, type InFlight, type NeedsConfirming } from './run-ledger';
import { isExpandedKind, type AnswerColumns, type RunSource } from './run-source';

/** How a run ended, before the engine dresses it as a rotating or a vectoring result. */
export interface RunOutcome {
  status: 'complete' | 'aborted' | 'failed';
  message?: string;
  /** The two answer columns (cos, sin or angle, magnitude), by run index. */
  cos: Int32Array;
  sin: Int32Array;
  answered: Uint8Array;
  missing: MissingCode[];
  figures: LinkFigures;
  elapsedMs: number;
}

/** The run's listeners, by run index. */
export interface RunListeners {
  onResults?: (batch: ResultBatch) => void;
  onProgress?: (p: RunProgress) => void;
  confirm?: NeedsConfirming;
}

const PROGRESS_EVERY_MS = 100;
/** How long after the decoder last skipped damaged bytes answers are confirmed (RunHandlers.confirm). */
export const CONFIRM_WINDOW_MS = 1000;

export class Run<R> {
  readonly done: Promise<R>;
  private readonly ledger: RunLedger;
  private cursor = 0;
  private paused = false;
  private finished = false;
  private readonly startedAt: number;
  private readonly rxBytesAtStart: number;
  private rateMark = { t: 0, done: 0, rate: 0 };
  private readonly unlisten: () => void;
  private cancelTick = () => {};
  private resolve!: (r: R) => void;
  private readonly total: number;

  constructor(
    private readonly engine: LinkEngine,
    private readonly source: RunSource,
    private readonly handlers: RunListeners,
    private readonly dress: (outcome: RunOutcome) => R,
  ) {
    this.total = source.count;
    this.ledger = new RunLedger(source.keys, engine.options.maxRetries);
    this.startedAt = engine.options.clock.now();
    this.rxBytesAtStart = engine.figures.bytesReceived;
    this.rateMark = { t: this.startedAt, done: 0, rate: 0 };
    this.done = new Promise((r) => (this.resolve = r));
    this.unlisten = engine.listen((f) => this.onReply(f));
    engine.options.link.onClose((reason) => {
      if (!this.finished) this.finish('failed', `The link closed during the run: ${reason.message}`, 'no answer');
    });
    this.scheduleTick();
    this.pump();
  }

  progress(): RunProgress {
    const now = this.engine.options.clock.now();
    const done = this.ledger.settled;
    const total = this.total;
    const rate = this.rateMark.rate;
    return {
      done,
      answered: this.ledger.answeredCount,
      missing: this.ledger.missing.length,
      total,
      ratePerS: rate,
      etaS: rate > 0 ? (total - done) / rate : null,
      elapsedMs: now - this.startedAt,
      paused: this.paused,
    };
  }

  async pause() {
    if (this.finished || this.paused) return;
    this.paused = true;
    await this.engine.request(Kind.Pause, new Uint8Array(0), (f) => f.kind === Kind.Ack);
  }

  async resume() {
    if (this.finished || !this.paused) return;
    await this.engine.request(Kind.Resume, new Uint8Array(0), (f) => f.kind === Kind.Ack);
    this.paused = false;
    this.pump();
  }

  async abort() {
    if (this.finished) return;
    this.paused = true; // no more requests go out
    try {
      await this.engine.request(Kind.Abort, new Uint8Array(0), (f) => f.kind === Kind.Ack, 2);
    } finally {
      this.finish('aborted', 'Aborted by the operator', 'aborted');
    }
  }

  // ---- sending ----------------------------------------------------------------------------

  private pump() {
    if (this.finished || this.paused) return;
    const depth = Math.max(1, this.engine.info!.queueDepth);
    const listMax = this.source.maxList;
    for (;;) {
      // Codes to ask again go first, in LIST frames, within the device's queue.
      const room = depth - this.ledger.pairsInFlight;
      const retry = this.ledger.retry;
      if (retry.length > 0) {
        const k = Math.min(listMax, retry.length, room);
        if (k <= 0 || !this.sendList(retry.splice(0, k))) break;
        continue;
      }
      if (this.cursor >= this.total) break;
      if (this.source.expanded) {
        // The device makes sweep codes (grid vectors) itself at line rate; two segments keep the line busy.
        if (this.ledger.sweepsInFlight >= 2 || !this.sendSweep()) break;
        continue;
      }
      const k = Math.min(listMax, this.total - this.cursor, room);
      if (k <= 0) break;
      const idx: number[] = [];
      for (let i = 0; i < k; i++) idx.push(this.cursor + i);
      if (!this.sendList(idx)) break;
      this.cursor += k;
    }
    this.checkDone();
  }

  private sendList(indexes: number[]): boolean {
    const tag = this.engine.takeTag();
    if (tag < 0) {
      this.ledger.retry.unshift(...indexes);
      return false;
    }
    const { kind, payload } = this.source.listRequest(indexes);
    this.ledger.open(tag, kind, Uint32Array.from(indexes), indexes.length);
    this.transmit(kind, tag, payload);
    return true;
  }

  private sendSweep(): boolean {
    const tag = this.engine.takeTag();
    if (tag < 0) return false;
    const first = this.cursor;
    const { kind, payload, count } = this.source.expanded!(first, this.engine.options.sweepSegment);
    this.ledger.open(tag, kind, Uint32Array.of(first, count), count);
    this.cursor += count;
    this.transmit(kind, tag, payload);
    return true;
  }

  private transmit(kind: number, tag: number, payload: Uint8Array) {
    this.sentAt = this.engine.options.clock.now();
    this.engine.send(kind, tag, payload).catch((err: Error) => {
      if (!this.finished) this.finish('failed', `Could not send to the device: ${err.message}`, 'no answer');
    });
  }

  // ---- receiving --------------------------------------------------------------------------

  private onReply(f: DecodedFrame) {
    if (this.finished) return;
    if (f.kind !== Kind.Results && f.kind !== Kind.VecResults && f.kind !== Kind.SweepEnd && f.kind !== Kind.Nak) return;
    const req = this.ledger.request(f.tag);
    if (!req) {
      // A control reply is handled by its own listener; anything else is stray.
      if (f.kind !== Kind.Nak) this.engine.figures.strayReplies++;
      return;
    }
    const m = this.engine.decode(f);
    const answers = this.source.answers(m);
    if (answers) this.onResults(req, answers);
    else if (m.kind === Kind.SweepEnd) {
      if (isExpandedKind(req.kind)) this.close(req, false);
    } else if (m.kind === Kind.Nak) {
      if (m.refused !== req.kind) return;
      const outOfRange = m.reason === NakReason.AngleOutOfRange ? 'angle out of range' : m.reason === NakReason.VectorOutOfRange ? 'vector out of range' : null;
      if (outOfRange) {
        for (const i of this.ledger.unanswered(req)) this.ledger.giveUp(i, outOfRange);
        this.close(req, false, true);
      } else this.close(req, true);
    } else return; // the other mode's results: not this run's (its TAG was reused by a corrupt frame)
    this.overtake(req.seq);
    this.pump();
  }

  private onResults(req: InFlight, m: AnswerColumns) {
    // Confirming costs a second request per doubtful answer, so only while the line is damaging frames.
    const confirm = this.handlers.confirm;
    const damaged = this.engine.options.clock.now() - this.engine.lastDamageAt < CONFIRM_WINDOW_MS;
    const needsConfirming = confirm && damaged ? confirm : null;
    const { batch, duplicates, held } = this.ledger.results(req, m, needsConfirming);
    this.engine.figures.duplicates += duplicates;
    this.engine.figures.confirmations += held;
    if (batch) this.handlers.onResults?.(batch);
    if (!isExpandedKind(req.kind) && req.received >= req.count) this.close(req, false);
  }

  /** Requests sent before `seq` that are still open have lost what they lack. */
  private overtake(seq: number) {
    for (const req of this.ledger.openRequests()) if (req.seq < seq) this.close(req, true);
  }

  /** Close a request; what it did not get goes back for another try (or is given up). */
  private close(req: InFlight, lost: boolean, settled = false) {
    const open = this.ledger.close(req, settled);
    if (open === null) return;
    this.engine.releaseTag(req.tag, lost || open.length > 0);
    const taken: number[] = [];
    for (const i of open) {
      const r = this.ledger.requeue(i);
      if (r === 'retry') this.engine.figures.retries++;
      else if (r === 'taken unconfirmed') taken.push(i);
    }
    if (taken.length > 0) {
      this.engine.figures.unconfirmed += taken.length;
      this.handlers.onResults?.(this.ledger.batchOf(Uint32Array.from(taken)));
    }
  }

  // ---- time -------------------------------------------------------------------------------

  private scheduleTick() {
    const { clock, timeoutMs } = this.engine.options;
    const everyMs = Math.min(PROGRESS_EVERY_MS, timeoutMs / 3);
    const dueAt = clock.now() + everyMs;
    this.cancelTick = clock.after(everyMs, () => {
      if (this.finished) return;
      const now = clock.now();
      // A tick this late means the host itself stalled (a busy event loop or machine): replies
      // that arrived meanwhile are still waiting to be read, so silence cannot be judged yet.
      const hostStalled = now - dueAt > timeoutMs / 2;
      const dt = now - this.rateMark.t;
      if (dt >= 500) {
        const done = this.ledger.settled;
        this.rateMark = { t: now, done, rate: ((done - this.rateMark.done) * 1000) / dt };
      }
      // A silent line with requests in flight: they are lost (not while paused on purpose).
      const quietMs = now - Math.max(this.engine.lastReplyAt, this.lastSendAt());
      const open = this.ledger.openRequests();
      if (!this.paused && !hostStalled && open.length > 0 && quietMs > timeoutMs) {
        for (const req of open) this.close(req, true);
        this.pump();
      }
      this.handlers.onProgress?.(this.progress());
      if (!this.finished) this.scheduleTick();
    });
  }

  private sentAt = 0;
  private lastSendAt() {
    return Math.max(this.sentAt, this.startedAt);
  }

  private checkDone() {
    if (this.finished) return;
    if (this.ledger.complete) this.finish('complete');
  }

  private finish(status: RunOutcome['status'], message?: string, leftover: MissingCode['reason'] = 'no answer') {
    if (this.finished) return;
    const open = this.ledger.closeAll(leftover);
    this.finished = true;
    this.cancelTick();
    this.unlisten();
    for (const req of open) this.engine.releaseTag(req.tag, true);
    const now = this.engine.options.clock.now();
    const elapsedMs = now - this.startedAt;
    const figures = { ...this.engine.figures, naks: { ...this.engine.figures.naks } };
    figures.resultsPerS = elapsedMs > 0 ? (this.ledger.answeredCount * 1000) / elapsedMs : 0;
    const rxBytes = figures.bytesReceived - this.rxBytesAtStart;
    figures.lineShare = elapsedMs > 0 ? (rxBytes * 1000) / elapsedMs / (this.engine.options.baud / 10) : 0;
    this.handlers.onProgress?.(this.progress());
    const { cos, sin, missing } = this.ledger;
    this.resolve(this.dress({ status, message, cos, sin, answered: this.ledger.answeredMask(), missing, figures, elapsedMs }));
  }
}
