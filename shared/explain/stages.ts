// The explain search's engine, whatever the core's mode (docs/explain.md "The search"): stages of
// hypotheses, each screened on a small spread of the answers, then on a larger sample, and only the
// survivors run on every answer; a stage that finds a full explanation ends the search. The result
// ranks by answers reproduced exactly, then by remoteness; hypotheses with identical answers on
// every answered input are one explanation, listed together. A mode supplies its levels (inputs
// and the board's two output channels), how to run a hypothesis on a level and its words.
import type { Candidate } from './catalogue';
import { Remoteness } from './catalogue';
import { classifyRest, type Rest } from './rest';

export interface HypothesisRef<C, F> {
  label: string;
  config: C;
  fault: F | null;
}

export interface HypothesisOf<C, F> extends HypothesisRef<C, F> {
  /** Answers it reproduces exactly (both channels). */
  exact: number;
  /** The largest |board − hypothesis| left, in output LSB, over both channels. */
  maxDiffLsb: number;
  /** Other hypotheses giving identical answers on every answered input. */
  equivalent: HypothesisRef<C, F>[];
}

export type Outcome = 'matches-model' | 'explained' | 'partly-explained' | 'unexplained';

export interface ExplanationOf<C, F> {
  declared: C;
  answered: number;
  /** Best first, at most MAX_HYPOTHESES. */
  hypotheses: HypothesisOf<C, F>[];
  outcome: Outcome;
  /** For a partial explanation: what the best leaves unexplained looks like. */
  rest: Rest | null;
  summary: string;
}

export interface ExplainOptions {
  /**
   * Called now and then with hypotheses handled so far and the planned total; the last call has
   * done = total = the hypotheses actually tried (fewer than planned when a stage explained all).
   */
  onProgress?(done: number, total: number): void;
  /** Asked between hypotheses; true ends the search with ExplainStopped. */
  shouldStop?(): boolean;
}

export const MAX_HYPOTHESES = 10;
/** Hypotheses kept after the small screen (besides every one that reproduced all of it). */
const KEEP_AFTER_SMALL = 32;
/** Hypotheses run on every answer after the large screen (besides every perfect one there). */
const KEEP_AFTER_LARGE = 6;
/** The best must reproduce at least this share to count as a partial explanation (rule of thumb, no source). */
export const PARTLY_SHARE = 0.9;

/** Answers the search cannot take (no samples, columns of different lengths, a code out of range). */
export class ExplainInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ExplainInputError';
  }
}

/** The search was asked to stop (shouldStop). */
export class ExplainStopped extends Error {
  constructor() {
    super('the explain search was stopped');
    this.name = 'ExplainStopped';
  }
}

/** The board's answers at one screening level, in two channels, and room for a hypothesis's. */
export interface Level {
  a: Int32Array;
  b: Int32Array;
  outA: Int32Array;
  outB: Int32Array;
}

/** Runs a hypothesis on a level: its answers into outA, outB. */
export type Runner<L extends Level> = (l: L) => void;

export interface Tried<C, F> extends Candidate<C, F> {
  order: number;
  exact: number;
  maxDiffLsb: number;
  /** A digest of its answers on every input, to find identical ones. */
  digest: string;
}

/** What a mode hands the engine. */
export interface Search<C, F, L extends Level> {
  declared: C;
  /** Every answer, the small screen and the large one. */
  full: L;
  small: L;
  large: L;
  runnerOf(c: Candidate<C, F>): Runner<L>;
  label(config: C, fault: F | null): string;
  /** The stages in order; each may look at what was tried before it. */
  stages: ((tried: readonly Tried<C, F>[]) => Candidate<C, F>[])[];
  /** Hypotheses planned, for progress. */
  total: number;
  /** Channel a wraps with this period (a binary angle), for the difference left; 0: it does not. */
  periodA: number;
  /** Neighbour order of the inputs of `full`, for the rest's classification (docs/explain.md). */
  restOrder: ArrayLike<number>;
  /** What one answered input is called in the summary: "code" (an angle code), "input" (a vector). */
  inputWord: string;
}

/** A level over the picked answers (all of them when `pick` is null). */
export function pickAnswers(a: ArrayLike<number>, b: ArrayLike<number>, pick: Int32Array | null): Level {
  const n = pick ? pick.length : a.length;
  const l: Level = { a: new Int32Array(n), b: new Int32Array(n), outA: new Int32Array(n), outB: new Int32Array(n) };
  for (let k = 0; k < n; k++) {
    const i = pick ? pick[k] : k;
    l.a[k] = a[i];
    l.b[k] = b[i];
  }
  return l;
}

function countExact<L extends Level>(run: Runner<L>, l: L): number {
  run(l);
  let exact = 0;
  for (let k = 0; k < l.a.length; k++) if (l.outA[k] === l.a[k] && l.outB[k] === l.b[k]) exact++;
  return exact;
}

// FNV-1a over both channels, twice with different seeds: a 64-bit digest of the answers.
function digest(a: Int32Array, b: Int32Array): string {
  let h = 0x811c9dc5;
  let g = 0x01000193 ^ 0x5bd1e995;
  for (let k = 0; k < a.length; k++) {
    h = Math.imul(h ^ a[k], 0x01000193);
    h = Math.imul(h ^ b[k], 0x01000193);
    g = Math.imul(g ^ (a[k] + 0x9e3779b9), 0x01000193);
    g = Math.imul(g ^ (b[k] - 0x7f4a7c15), 0x01000193);
  }
  return `${(h >>> 0).toString(16)}:${(g >>> 0).toString(16)}`;
}

function fullRun<L extends Level>(run: Runner<L>, l: L, periodA: number): { exact: number; maxDiffLsb: number; digest: string } {
  run(l);
  let exact = 0;
  let maxDiff = 0;
  for (let k = 0; k < l.a.length; k++) {
    let da = Math.abs(l.outA[k] - l.a[k]);
    const db = Math.abs(l.outB[k] - l.b[k]);
    if (da === 0 && db === 0) {
      exact++;
      continue;
    }
    // A binary angle's difference goes the short way round the turn.
    if (periodA > 0) da = Math.min(da % periodA, periodA - (da % periodA));
    maxDiff = Math.max(maxDiff, da, db);
  }
  return { exact, maxDiffLsb: maxDiff, digest: digest(l.outA, l.outB) };
}

/** Indices of the `keep` best by score, plus every one that scored `perfect`. */
function survivors(scores: number[], perfect: number, keep: number): number[] {
  const order = scores.map((_, i) => i).sort((a, b) => scores[b] - scores[a] || a - b);
  return order.filter((i, rank) => rank < keep || scores[i] === perfect);
}

const fmt = (n: number) => n.toLocaleString('en-US');

/**
 * Runs the stages and ranks what was run on every answer.
 * @throws ExplainStopped when asked to stop
 */
export function runSearch<C, F, L extends Level>(s: Search<C, F, L>, options: ExplainOptions = {}): ExplanationOf<C, F> {
  const n = s.full.a.length;
  const tried: Tried<C, F>[] = [];
  let done = 0;
  const stop = () => {
    if (options.shouldStop?.()) throw new ExplainStopped();
  };

  for (const stage of s.stages) {
    stop();
    const candidates = stage(tried);
    if (candidates.length === 0) continue;
    const runners = candidates.map((c) => s.runnerOf(c));
    // Run on every answer: first those that reproduced all of the large screen, then, unless one
    // of them reproduces every answer, the best of the rest (for the ranking of partial ones).
    let chosen = candidates.map((_, i) => i);
    let perfect = chosen;
    if (candidates.length > 1) {
      const s1: number[] = [];
      for (let i = 0; i < runners.length; i++) {
        if (i % 32 === 0) {
          stop();
          options.onProgress?.(done + i, s.total);
        }
        s1.push(countExact(runners[i], s.small));
      }
      const keep1 = survivors(s1, s.small.a.length, KEEP_AFTER_SMALL);
      const s2 = keep1.map((i) => countExact(runners[i], s.large));
      chosen = survivors(s2, s.large.a.length, KEEP_AFTER_LARGE).map((j) => keep1[j]);
      perfect = keep1.filter((_, j) => s2[j] === s.large.a.length);
    }
    const confirm = (i: number) => {
      stop();
      tried.push({ ...candidates[i], order: tried.length, ...fullRun(runners[i], s.full, s.periodA) });
    };
    perfect.forEach(confirm);
    if (!tried.some((t) => t.exact === n)) chosen.filter((i) => !perfect.includes(i)).forEach(confirm);
    done += candidates.length;
    options.onProgress?.(done, s.total);
    if (tried.some((t) => t.exact === n)) break;
  }
  options.onProgress?.(done, done);
  return summarise(s, n, tried);
}

function summarise<C, F, L extends Level>(s: Search<C, F, L>, n: number, tried: Tried<C, F>[]): ExplanationOf<C, F> {
  const refOf = (t: Tried<C, F>): HypothesisRef<C, F> => ({ label: s.label(t.config, t.fault), config: t.config, fault: t.fault });
  // Simplest first among equals, so each class is named by its least remote member.
  const ranked = [...tried].sort((a, b) => b.exact - a.exact || a.remoteness - b.remoteness || a.maxDiffLsb - b.maxDiffLsb || a.order - b.order);
  const classes = new Map<string, Tried<C, F>[]>();
  for (const t of ranked) {
    const key = `${t.exact} ${t.digest}`;
    const members = classes.get(key);
    if (members) members.push(t);
    else classes.set(key, [t]);
  }
  const hypotheses: HypothesisOf<C, F>[] = [...classes.values()].slice(0, MAX_HYPOTHESES).map(([head, ...others]) => ({
    ...refOf(head),
    exact: head.exact,
    maxDiffLsb: head.maxDiffLsb,
    equivalent: others.map(refOf),
  }));
  const best = hypotheses[0];
  const bestTried = classes.values().next().value![0];
  const declaredMatches = best.exact === n && bestTried.remoteness === Remoteness.Declared;
  let outcome: Outcome;
  if (best.exact === n) outcome = declaredMatches ? 'matches-model' : 'explained';
  else outcome = best.exact >= PARTLY_SHARE * n ? 'partly-explained' : 'unexplained';
  let rest: Rest | null = null;
  if (outcome === 'partly-explained') {
    const full = s.full;
    s.runnerOf(bestTried)(full);
    rest = classifyRest(s.restOrder, full.a, full.b, full.outA, full.outB);
  }
  const others = best.equivalent.length;
  const alike = others > 0 ? ` ${others === 1 ? 'One other hypothesis gives' : `${others} other hypotheses give`} the same answers on every ${s.inputWord}.` : '';
  let summary: string;
  switch (outcome) {
    case 'matches-model':
      summary = `The core matches its declared model: it reproduces all ${fmt(n)} answers exactly.`;
      break;
    case 'explained':
      summary = `${best.label} — reproduces ${fmt(best.exact)} of ${fmt(n)} answers exactly.${alike}`;
      break;
    case 'partly-explained':
      summary =
        `No single hypothesis reproduces every answer. The best, ${best.label}, reproduces ${fmt(best.exact)} of ${fmt(n)} exactly (largest difference left ${fmt(best.maxDiffLsb)} LSB); ` +
        (rest === 'scattered' ? 'the rest looks scattered, as from a damaged line or an unstable core.' : 'the rest looks structured, as from a second defect.');
      break;
    default:
      summary = `Nothing in the catalogue explains the answers: the best, ${best.label}, reproduces only ${fmt(best.exact)} of ${fmt(n)} exactly (largest difference left ${fmt(best.maxDiffLsb)} LSB).`;
  }
  return { declared: s.declared, answered: n, hypotheses, outcome, rest, summary };
}
