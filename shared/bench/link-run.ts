// One run on a LinkEngine: the bookkeeping of requests in flight, replies, losses and retries.
import { Kind, NakReason } from '../link/kinds';
import { encodePayload, type MessageOf } from '../link/payloads';
import type { DecodedFrame } from '../link/decoder';
import { maxListCodes } from '../link/wire-profile';
import type { LinkEngine, MissingCode, RunHandle, RunHandlers, RunResult } from './link-engine';
import type { RunProgress } from './link-figures';

interface InFlight {
  tag: number;
  kind: typeof Kind.One | typeof Kind.List | typeof Kind.Sweep;
  /** Order of sending: a reply to a later request means an earlier one has lost what it lacks. */
  seq: number;
  /** For ONE/LIST: the run indexes asked for. For SWEEP: [first run index, count]. */
  indexes: Uint32Array;
  sweep: boolean;
  count: number;
  received: number;
}

const PROGRESS_EVERY_MS = 100;

export class Run implements RunHandle {
  readonly done: Promise<RunResult>;
  private readonly cos: Int32Array;
  private readonly sin: Int32Array;
  private readonly answered: Uint8Array;
  private readonly attempts: Uint8Array;
  private readonly missing: MissingCode[] = [];
  private readonly retry: number[] = [];
  private readonly inFlight = new Map<number, InFlight>();
  private cursor = 0;
  private seq = 0;
  private pairsInFlight = 0;
  private sweepsInFlight = 0;
  private answeredCount = 0;
  private paused = false;
  private finished = false;
  private readonly startedAt: number;
  private readonly rxBytesAtStart: number;
  private rateMark = { t: 0, done: 0, rate: 0 };
  private readonly unlisten: () => void;
  private cancelTick = () => {};
  private resolve!: (r: RunResult) => void;

  constructor(
    private readonly engine: LinkEngine,
    private readonly codes: Float64Array,
    private readonly sweep: { start: number; step: number } | null,
    private readonly handlers: RunHandlers,
  ) {
    const n = codes.length;
    this.cos = new Int32Array(n);
    this.sin = new Int32Array(n);
    this.answered = new Uint8Array(n);
    this.attempts = new Uint8Array(n);
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
    const done = this.answeredCount + this.missing.length;
    const total = this.codes.length;
    const rate = this.rateMark.rate;
    return {
      done,
      answered: this.answeredCount,
      missing: this.missing.length,
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
    const p = this.engine.profile;
    const depth = Math.max(1, this.engine.info!.queueDepth);
    const listMax = maxListCodes(p);
    for (;;) {
      // Codes to ask again go first, in LIST frames, within the device's queue.
      const room = depth - this.pairsInFlight;
      if (this.retry.length > 0) {
        const k = Math.min(listMax, this.retry.length, room);
        if (k <= 0 || !this.sendList(this.retry.splice(0, k))) break;
        continue;
      }
      if (this.cursor >= this.codes.length) break;
      if (this.sweep) {
        // The device makes sweep codes itself at line rate; two segments keep the line busy.
        if (this.sweepsInFlight >= 2 || !this.sendSweep()) break;
        continue;
      }
      const k = Math.min(listMax, this.codes.length - this.cursor, room);
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
      this.retry.unshift(...indexes);
      return false;
    }
    const p = this.engine.profile;
    const one = indexes.length === 1;
    const payload = one
      ? encodePayload({ kind: Kind.One, angleCode: this.codes[indexes[0]] }, p)
      : encodePayload({ kind: Kind.List, angleCodes: indexes.map((i) => this.codes[i]) }, p);
    const req: InFlight = { tag, kind: one ? Kind.One : Kind.List, seq: this.seq++, indexes: Uint32Array.from(indexes), sweep: false, count: indexes.length, received: 0 };
    this.inFlight.set(tag, req);
    this.pairsInFlight += req.count;
    this.transmit(req.kind, tag, payload);
    return true;
  }

  private sendSweep(): boolean {
    const tag = this.engine.takeTag();
    if (tag < 0) return false;
    const first = this.cursor;
    const count = Math.min(this.engine.options.sweepSegment, this.codes.length - first);
    const payload = encodePayload({ kind: Kind.Sweep, start: this.codes[first], step: this.sweep!.step, count }, this.engine.profile);
    const req: InFlight = { tag, kind: Kind.Sweep, seq: this.seq++, indexes: Uint32Array.of(first, count), sweep: true, count, received: 0 };
    this.inFlight.set(tag, req);
    this.sweepsInFlight++;
    this.cursor += count;
    this.transmit(Kind.Sweep, tag, payload);
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
    if (f.kind !== Kind.Results && f.kind !== Kind.SweepEnd && f.kind !== Kind.Nak) return;
    const req = this.inFlight.get(f.tag);
    if (!req) {
      // A control reply is handled by its own listener; anything else is stray.
      if (f.kind !== Kind.Nak) this.engine.figures.strayReplies++;
      return;
    }
    const m = this.engine.decode(f);
    if (m.kind === Kind.Results) this.onResults(req, m);
    else if (m.kind === Kind.SweepEnd) {
      if (req.sweep) this.close(req, false);
    } else if (m.kind === Kind.Nak) {
      if (m.refused !== req.kind) return;
      if (m.reason === NakReason.AngleOutOfRange) {
        for (const i of this.unanswered(req)) this.giveUp(i, 'angle out of range');
        this.close(req, false, true);
      } else this.close(req, true);
    }
    this.overtake(req.seq);
    this.pump();
  }

  private onResults(req: InFlight, m: MessageOf<typeof Kind.Results>) {
    const n = m.cos.length;
    const indexes = new Uint32Array(n);
    let kept = 0;
    for (let j = 0; j < n; j++) {
      const pos = m.firstIndex + j;
      if (pos >= req.count) continue; // an index the request never had: corrupt, ignore
      const idx = req.sweep ? req.indexes[0] + pos : req.indexes[pos];
      req.received++;
      if (this.answered[idx]) {
        this.engine.figures.duplicates++;
        continue;
      }
      this.answered[idx] = 1;
      this.answeredCount++;
      this.cos[idx] = m.cos[j];
      this.sin[idx] = m.sin[j];
      indexes[kept] = idx;
      kept++;
    }
    if (kept > 0) {
      const sel = indexes.subarray(0, kept);
      const cos = new Int32Array(kept);
      const sin = new Int32Array(kept);
      for (let k = 0; k < kept; k++) {
        cos[k] = this.cos[sel[k]];
        sin[k] = this.sin[sel[k]];
      }
      this.handlers.onResults?.({ indexes: sel, cos, sin });
    }
    if (!req.sweep && req.received >= req.count) this.close(req, false);
  }

  /** Requests sent before `seq` that are still open have lost what they lack. */
  private overtake(seq: number) {
    for (const req of [...this.inFlight.values()]) if (req.seq < seq) this.close(req, true);
  }

  /** Close a request; what it did not get goes back for another try (or is given up). */
  private close(req: InFlight, lost: boolean, settled = false) {
    if (!this.inFlight.delete(req.tag)) return;
    if (req.sweep) this.sweepsInFlight--;
    else this.pairsInFlight -= req.count;
    const open = settled ? [] : this.unanswered(req);
    this.engine.releaseTag(req.tag, lost || open.length > 0);
    for (const i of open) {
      if (++this.attempts[i] > this.engine.options.maxRetries) this.giveUp(i, 'no answer');
      else {
        this.retry.push(i);
        this.engine.figures.retries++;
      }
    }
  }

  private unanswered(req: InFlight): number[] {
    const out: number[] = [];
    if (req.sweep) {
      for (let i = req.indexes[0], end = i + req.count; i < end; i++) if (!this.answered[i]) out.push(i);
    } else for (const i of req.indexes) if (!this.answered[i]) out.push(i);
    return out;
  }

  private giveUp(index: number, reason: MissingCode['reason']) {
    if (this.answered[index]) return;
    this.answered[index] = 2; // settled without an answer: never counted as answered
    this.missing.push({ index, code: this.codes[index], reason });
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
        const done = this.answeredCount + this.missing.length;
        this.rateMark = { t: now, done, rate: ((done - this.rateMark.done) * 1000) / dt };
      }
      // A silent line with requests in flight: they are lost (not while paused on purpose).
      const quietMs = now - Math.max(this.engine.lastReplyAt, this.lastSendAt());
      if (!this.paused && !hostStalled && this.inFlight.size > 0 && quietMs > timeoutMs) {
        for (const req of [...this.inFlight.values()]) this.close(req, true);
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
    if (this.answeredCount + this.missing.length === this.codes.length) this.finish('complete');
  }

  private finish(status: RunResult['status'], message?: string, leftover: MissingCode['reason'] = 'no answer') {
    if (this.finished) return;
    for (let i = 0; i < this.codes.length; i++) if (!this.answered[i]) this.giveUp(i, leftover);
    this.finished = true;
    this.cancelTick();
    this.unlisten();
    for (const req of this.inFlight.values()) this.engine.releaseTag(req.tag, true);
    this.inFlight.clear();
    const now = this.engine.options.clock.now();
    const elapsedMs = now - this.startedAt;
    const figures = { ...this.engine.figures, naks: { ...this.engine.figures.naks } };
    figures.resultsPerS = elapsedMs > 0 ? (this.answeredCount * 1000) / elapsedMs : 0;
    const rxBytes = figures.bytesReceived - this.rxBytesAtStart;
    figures.lineShare = elapsedMs > 0 ? (rxBytes * 1000) / elapsedMs / (this.engine.options.baud / 10) : 0;
    this.handlers.onProgress?.(this.progress());
    const answered = new Uint8Array(this.codes.length);
    for (let i = 0; i < answered.length; i++) answered[i] = this.answered[i] === 1 ? 1 : 0;
    this.resolve({ status, message, codes: this.codes, cos: this.cos, sin: this.sin, answered, missing: this.missing, figures, elapsedMs });
  }
}
