// The ledger of one run: the requests in flight and, per code, its answer, how often it was
// asked and whether it is settled (answered, or listed missing with a reason). The run decides
// what to send and when; the ledger guarantees that every code ends answered exactly once or
// missing, never both. Inputs are angle codes or vectors alike: the ledger sees run indexes and
// the reply's two answer columns (cos and sin, or angle and magnitude), kept as `cos` and `sin`.
import type { MissingCode, ResultBatch } from './link-engine';
import { isExpandedKind, type AnswerColumns, type RunKind } from './run-source';

/** One request on the line. */
export interface InFlight {
  tag: number;
  kind: RunKind;
  /** Order of sending: a reply to a later request means an earlier one has lost what it lacks. */
  seq: number;
  /** For ONE/LIST (VEC_ONE/VEC_LIST): the run indexes asked for. For SWEEP (VEC_GRID): [first run index, count]. */
  indexes: Uint32Array;
  count: number;
  received: number;
}

const OPEN = 0;
const ANSWERED = 1;
const GIVEN_UP = 2;

/** Says whether an answer must be confirmed by a second, equal one before it is taken. */
export type NeedsConfirming = (index: number, cos: number, sin: number) => boolean;

/** What became of a code whose request ended without its answer. */
export type Requeued = 'retry' | 'missing' | 'taken unconfirmed';

export class RunLedger {
  readonly cos: Int32Array;
  readonly sin: Int32Array;
  readonly missing: MissingCode[] = [];
  /** Run indexes to ask for again, oldest first. */
  readonly retry: number[] = [];
  answeredCount = 0;
  /** Answers asked for by ONE/LIST requests still open: what the device's queue holds. */
  pairsInFlight = 0;
  sweepsInFlight = 0;
  private readonly state: Uint8Array;
  private readonly attempts: Uint8Array;
  private readonly inFlight = new Map<number, InFlight>();
  private seq = 0;
  /** Answers waiting for a second, equal one, by run index: cos and sin. */
  private readonly held = new Map<number, [number, number]>();

  constructor(
    /** What names each input in the missing list (its angle code, or a vector's x). */
    readonly codes: ArrayLike<number>,
    private readonly maxRetries: number,
  ) {
    const n = codes.length;
    this.cos = new Int32Array(n);
    this.sin = new Int32Array(n);
    this.state = new Uint8Array(n);
    this.attempts = new Uint8Array(n);
  }

  // ---- requests ---------------------------------------------------------------------------

  /** Puts a request on the books, numbered in sending order. */
  open(tag: number, kind: InFlight['kind'], indexes: Uint32Array, count: number): void {
    this.inFlight.set(tag, { tag, kind, seq: this.seq++, indexes, count, received: 0 });
    if (isExpandedKind(kind)) this.sweepsInFlight++;
    else this.pairsInFlight += count;
  }

  request(tag: number): InFlight | undefined {
    return this.inFlight.get(tag);
  }

  /** The requests still open, in sending order. */
  openRequests(): InFlight[] {
    return [...this.inFlight.values()];
  }

  /**
   * Takes a request off the books; returns the codes it asked for that are still open (none
   * when `settled`), or null when it was not open.
   */
  close(req: InFlight, settled = false): number[] | null {
    if (!this.inFlight.delete(req.tag)) return null;
    if (isExpandedKind(req.kind)) this.sweepsInFlight--;
    else this.pairsInFlight -= req.count;
    return settled ? [] : this.unanswered(req);
  }

  /** The codes a request asked for that have no answer yet. */
  unanswered(req: InFlight): number[] {
    const out: number[] = [];
    if (isExpandedKind(req.kind)) {
      for (let i = req.indexes[0], end = i + req.count; i < end; i++) if (this.isOpen(i)) out.push(i);
    } else for (const i of req.indexes) if (this.isOpen(i)) out.push(i);
    return out;
  }

  /**
   * Books a RESULTS frame against its request: the new answers (null when none), how many
   * answered a code that had its answer already (ignored), and how many were held back to be
   * confirmed (the code stays open, so it is asked for again when its request ends).
   */
  results(req: InFlight, m: AnswerColumns, needsConfirming: NeedsConfirming | null): { batch: ResultBatch | null; duplicates: number; held: number } {
    const n = m.cos.length;
    const expanded = isExpandedKind(req.kind);
    const indexes = new Uint32Array(n);
    let kept = 0;
    let duplicates = 0;
    let held = 0;
    for (let j = 0; j < n; j++) {
      const pos = m.firstIndex + j;
      if (pos >= req.count) continue; // an index the request never had: corrupt, ignore
      const idx = expanded ? req.indexes[0] + pos : req.indexes[pos];
      req.received++;
      const cos = m.cos[j];
      const sin = m.sin[j];
      if (!this.isOpen(idx)) duplicates++;
      else if (needsConfirming?.(idx, cos, sin) && !this.agreesWithHeld(idx, cos, sin)) {
        this.held.set(idx, [cos, sin]);
        held++;
      } else {
        this.answer(idx, cos, sin);
        indexes[kept++] = idx;
      }
    }
    return { batch: kept === 0 ? null : this.batchOf(indexes.subarray(0, kept)), duplicates, held };
  }

  /** The answers of the given (answered) indexes, as a batch for the run's listener. */
  batchOf(indexes: Uint32Array): ResultBatch {
    // A plain loop: Int32Array.from with a mapping function was the page's costliest step per result.
    const n = indexes.length;
    const cos = new Int32Array(n);
    const sin = new Int32Array(n);
    for (let k = 0; k < n; k++) {
      cos[k] = this.cos[indexes[k]];
      sin[k] = this.sin[indexes[k]];
    }
    return { indexes, cos, sin };
  }

  private agreesWithHeld(index: number, cos: number, sin: number): boolean {
    const h = this.held.get(index);
    return h !== undefined && h[0] === cos && h[1] === sin;
  }

  // ---- codes ------------------------------------------------------------------------------

  /** Codes answered or given up. */
  get settled(): number {
    return this.answeredCount + this.missing.length;
  }

  get complete(): boolean {
    return this.settled === this.codes.length;
  }

  isOpen(index: number): boolean {
    return this.state[index] === OPEN;
  }

  /** Takes an answer; false for a code already settled (a duplicate). */
  answer(index: number, cos: number, sin: number): boolean {
    if (this.state[index] !== OPEN) return false;
    this.held.delete(index);
    this.state[index] = ANSWERED;
    this.answeredCount++;
    this.cos[index] = cos;
    this.sin[index] = sin;
    return true;
  }

  /**
   * Queues an open code for another try. Past maxRetries it is listed missing, or, when an
   * answer of it is held for confirming, that answer is taken (the device did answer).
   */
  requeue(index: number): Requeued {
    if (++this.attempts[index] <= this.maxRetries) {
      this.retry.push(index);
      return 'retry';
    }
    const h = this.held.get(index);
    if (h) {
      this.answer(index, h[0], h[1]);
      return 'taken unconfirmed';
    }
    this.giveUp(index, 'no answer');
    return 'missing';
  }

  giveUp(index: number, reason: MissingCode['reason']): void {
    if (this.state[index] !== OPEN) return;
    this.held.delete(index);
    this.state[index] = GIVEN_UP;
    this.missing.push({ index, code: this.codes[index], reason });
  }

  /** Settles every open code as missing and forgets the open requests (the run is ending). */
  closeAll(reason: MissingCode['reason']): InFlight[] {
    for (let i = 0; i < this.codes.length; i++) this.giveUp(i, reason);
    const open = this.openRequests();
    this.inFlight.clear();
    return open;
  }

  /** 1 where a code was answered, 0 elsewhere. */
  answeredMask(): Uint8Array {
    const mask = new Uint8Array(this.codes.length);
    for (let i = 0; i < mask.length; i++) mask[i] = this.state[i] === ANSWERED ? 1 : 0;
    return mask;
  }
}
