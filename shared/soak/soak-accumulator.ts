// The books of a soak: each pass's figures, and across passes the codes whose answers differ.
// Memory does not grow with the number of passes: per code, typed arrays hold its first answer
// and how often it came back; only codes that ever answered differently get a side-table entry
// (their distinct answers with counts), and both that table and the timeline are capped.
import type { SoakSpec } from './soak-spec';

/** One pass as the link engine returned it, with its scoring and this pass's own link figures. */
export interface SoakPassInput {
  /** Angle codes in request order; the same plan every pass. */
  codes: ArrayLike<number>;
  cos: ArrayLike<number>;
  sin: ArrayLike<number>;
  /** 1 where the code was answered (from a frame whose CHECK was good). */
  answered: ArrayLike<number>;
  /** Answers that differ from the bit-accurate model, this pass. */
  mismatches: number;
  /** Largest |error| against the exact values this pass, LSB; null when nothing was answered. */
  maxAbsErrorLsb: number | null;
  /** Frames dropped for a bad CHECK during this pass. */
  checkFailures: number;
  /** Codes asked for again during this pass (after a bad CHECK, a loss, a NAK). */
  retries: number;
  /** Ms from the start of the soak to the start of this pass, and the pass's own length. */
  atMs: number;
  elapsedMs: number;
}

/** One point of the timeline: one pass, or several neighbouring passes merged once it grew long. */
export interface SoakTimelinePoint {
  /** First pass (1-based) and how many passes the point covers. */
  pass: number;
  passes: number;
  atMs: number;
  elapsedMs: number;
  answered: number;
  missing: number;
  mismatches: number;
  checkFailures: number;
  retries: number;
  /** Bad CHECK plus codes never answered. */
  linkErrors: number;
  /** Codes found unstable in these passes, and all unstable so far at their end. */
  newUnstable: number;
  unstableCodes: number;
  maxAbsErrorLsb: number | null;
}

export interface SoakAnswer {
  cos: number;
  sin: number;
  count: number;
}

export interface UnstableCode {
  code: number;
  /** Position in the plan. */
  index: number;
  /** The pass (1-based) whose answer first differed. */
  firstPass: number;
  /** Every distinct answer seen, in order of first appearance, with how often. */
  answers: SoakAnswer[];
  /** Answers beyond the per-code cap of distinct answers (counted, not listed). */
  otherAnswers: number;
}

export interface SoakSummary {
  passes: number;
  elapsedMs: number;
  codesPerPass: number;
  answered: number;
  missing: number;
  mismatches: number;
  passesWithMismatches: number;
  checkFailures: number;
  retries: number;
  linkErrors: number;
  unstableCodes: number;
  maxAbsErrorLsb: number | null;
}

export interface SoakOptions {
  /** Unstable codes listed with their answers; more are counted only. Default 4096. */
  maxListedUnstable?: number;
  /** Distinct answers kept per unstable code. Default 16. */
  maxAnswersPerCode?: number;
  /** Timeline points kept; past it, neighbouring points merge pairwise. Default 512. */
  maxTimelinePoints?: number;
}

const STABLE = 1;
const UNSTABLE = 2;

export class SoakAccumulator {
  private readonly codes: Float64Array;
  private readonly firstCos: Int32Array;
  private readonly firstSin: Int32Array;
  /** Times the first answer came back. */
  private readonly firstCount: Uint32Array;
  /** 0 not yet answered, STABLE, UNSTABLE. */
  private readonly state: Uint8Array;
  private readonly side = new Map<number, { firstPass: number; answers: SoakAnswer[]; otherAnswers: number }>();
  private unstable = 0;
  private points: SoakTimelinePoint[] = [];
  private pointSpan = 1;
  private totals: SoakSummary;
  private readonly o: Required<SoakOptions>;

  constructor(planCodes: ArrayLike<number>, options: SoakOptions = {}) {
    const n = planCodes.length;
    this.codes = Float64Array.from(planCodes);
    this.firstCos = new Int32Array(n);
    this.firstSin = new Int32Array(n);
    this.firstCount = new Uint32Array(n);
    this.state = new Uint8Array(n);
    this.o = { maxListedUnstable: 4096, maxAnswersPerCode: 16, maxTimelinePoints: 512, ...options };
    this.totals = {
      passes: 0, elapsedMs: 0, codesPerPass: n, answered: 0, missing: 0, mismatches: 0, passesWithMismatches: 0,
      checkFailures: 0, retries: 0, linkErrors: 0, unstableCodes: 0, maxAbsErrorLsb: null,
    };
  }

  get passes(): number {
    return this.totals.passes;
  }

  get unstableCount(): number {
    return this.unstable;
  }

  /** Take one finished pass; returns its timeline point (before any merging). */
  addPass(p: SoakPassInput): SoakTimelinePoint {
    const n = this.codes.length;
    if (p.codes.length !== n) throw new Error(`a soak pass has ${p.codes.length} codes, the plan ${n}`);
    const pass = this.totals.passes + 1;
    let answered = 0;
    let newUnstable = 0;
    for (let i = 0; i < n; i++) {
      if (!p.answered[i]) continue;
      if (p.codes[i] !== this.codes[i]) throw new Error(`a soak pass asked code ${p.codes[i]} at position ${i}, the plan ${this.codes[i]}`);
      answered++;
      const c = p.cos[i];
      const s = p.sin[i];
      const st = this.state[i];
      if (st === 0) {
        this.state[i] = STABLE;
        this.firstCos[i] = c;
        this.firstSin[i] = s;
        this.firstCount[i] = 1;
      } else if (st === STABLE) {
        if (c === this.firstCos[i] && s === this.firstSin[i]) this.firstCount[i]++;
        else {
          this.state[i] = UNSTABLE;
          this.unstable++;
          newUnstable++;
          if (this.side.size < this.o.maxListedUnstable) {
            this.side.set(i, { firstPass: pass, answers: [{ cos: this.firstCos[i], sin: this.firstSin[i], count: this.firstCount[i] }, { cos: c, sin: s, count: 1 }], otherAnswers: 0 });
          }
        }
      } else {
        const entry = this.side.get(i);
        if (!entry) continue; // past the listing cap: counted as unstable, answers not kept
        const a = entry.answers.find((x) => x.cos === c && x.sin === s);
        if (a) a.count++;
        else if (entry.answers.length < this.o.maxAnswersPerCode) entry.answers.push({ cos: c, sin: s, count: 1 });
        else entry.otherAnswers++;
      }
    }
    const missing = n - answered;
    const point: SoakTimelinePoint = {
      pass, passes: 1, atMs: p.atMs, elapsedMs: p.elapsedMs, answered, missing, mismatches: p.mismatches,
      checkFailures: p.checkFailures, retries: p.retries, linkErrors: p.checkFailures + missing,
      newUnstable, unstableCodes: this.unstable, maxAbsErrorLsb: p.maxAbsErrorLsb,
    };
    const t = this.totals;
    t.passes = pass;
    t.elapsedMs = p.atMs + p.elapsedMs;
    t.answered += answered;
    t.missing += missing;
    t.mismatches += p.mismatches;
    if (p.mismatches > 0) t.passesWithMismatches++;
    t.checkFailures += p.checkFailures;
    t.retries += p.retries;
    t.linkErrors += point.linkErrors;
    t.unstableCodes = this.unstable;
    t.maxAbsErrorLsb = maxOf(t.maxAbsErrorLsb, p.maxAbsErrorLsb);
    this.addPoint({ ...point });
    return point;
  }

  private addPoint(point: SoakTimelinePoint) {
    const last = this.points[this.points.length - 1];
    // Once points cover pointSpan passes each, a new pass joins the last point until it is full.
    if (last && last.passes < this.pointSpan) this.points[this.points.length - 1] = mergePoints(last, point);
    else this.points.push(point);
    if (this.points.length > this.o.maxTimelinePoints) {
      const merged: SoakTimelinePoint[] = [];
      for (let i = 0; i < this.points.length; i += 2) merged.push(i + 1 < this.points.length ? mergePoints(this.points[i], this.points[i + 1]) : this.points[i]);
      this.points = merged;
      this.pointSpan *= 2;
    }
  }

  timeline(): SoakTimelinePoint[] {
    return this.points.map((p) => ({ ...p }));
  }

  /** The listed unstable codes in plan order, each with every distinct answer and its count. */
  unstableCodes(): UnstableCode[] {
    return [...this.side.entries()]
      .sort((a, b) => a[0] - b[0])
      .map(([index, e]) => ({ code: this.codes[index], index, firstPass: e.firstPass, answers: e.answers.map((a) => ({ ...a })), otherAnswers: e.otherAnswers }));
  }

  summary(): SoakSummary {
    return { ...this.totals };
  }

  /** What a session keeps of the soak (soakRecordSchema). */
  record(spec: SoakSpec): SoakRecord {
    return {
      spec,
      summary: this.summary(),
      timeline: this.timeline(),
      unstable: { count: this.unstable, listed: this.side.size, codes: this.unstableCodes() },
    };
  }
}

export interface SoakRecord {
  spec: SoakSpec;
  summary: SoakSummary;
  timeline: SoakTimelinePoint[];
  unstable: { count: number; listed: number; codes: UnstableCode[] };
}

function maxOf(a: number | null, b: number | null): number | null {
  if (a === null) return b;
  if (b === null) return a;
  return Math.max(a, b);
}

function mergePoints(a: SoakTimelinePoint, b: SoakTimelinePoint): SoakTimelinePoint {
  return {
    pass: a.pass,
    passes: a.passes + b.passes,
    atMs: a.atMs,
    elapsedMs: b.atMs + b.elapsedMs - a.atMs,
    answered: a.answered + b.answered,
    missing: a.missing + b.missing,
    mismatches: a.mismatches + b.mismatches,
    checkFailures: a.checkFailures + b.checkFailures,
    retries: a.retries + b.retries,
    linkErrors: a.linkErrors + b.linkErrors,
    newUnstable: a.newUnstable + b.newUnstable,
    unstableCodes: b.unstableCodes,
    maxAbsErrorLsb: maxOf(a.maxAbsErrorLsb, b.maxAbsErrorLsb),
  };
}
