// The explain search (docs/explain.md): which configuration deviation or catalogue defect
// reproduces the board's answers bit-exactly. Hypotheses are screened on a small spread of the
// answered codes, then on a larger sample, and only the survivors are run on every answer; a stage
// that finds a full explanation ends the search. Hypotheses with identical answers on every
// answered code are one explanation, listed together.
import { angleCodeRange, parseModelConfig, type ModelConfig } from '../numeric';
import { deviationCandidates, defectCandidates, estimateAngleOffset, Remoteness, type Candidate } from './catalogue';
import type { Fault } from './fault';
import { createFaultyModel, type FaultyModel } from './faulty-model';
import { faultLabel } from './labels';
import { classifyRest, type Rest } from './rest';
import { pickScreen } from './screen';

/** The board's answers: angle code k was answered with cos[k], sin[k]. */
export interface ExplainSamples {
  angle: ArrayLike<number>;
  cos: ArrayLike<number>;
  sin: ArrayLike<number>;
}

export interface HypothesisRef {
  label: string;
  config: ModelConfig;
  fault: Fault | null;
}

export interface Hypothesis extends HypothesisRef {
  /** Answers it reproduces exactly (cos and sin both). */
  exact: number;
  /** The largest |board − hypothesis| left, in output LSB, over both channels. */
  maxDiffLsb: number;
  /** Other hypotheses giving identical answers on every answered code. */
  equivalent: HypothesisRef[];
}

export interface Explanation {
  declared: ModelConfig;
  answered: number;
  /** Best first, at most MAX_HYPOTHESES. */
  hypotheses: Hypothesis[];
  outcome: 'matches-model' | 'explained' | 'partly-explained' | 'unexplained';
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

/** Codes and the board's answers at one screening level. */
interface Level {
  codes: Float64Array;
  cos: Int32Array;
  sin: Int32Array;
  outCos: Int32Array;
  outSin: Int32Array;
}

interface Tried extends Candidate {
  order: number;
  exact: number;
  maxDiffLsb: number;
  /** A digest of its answers on every code, to find identical ones. */
  digest: string;
}

function level(codes: Float64Array, cos: Int32Array, sin: Int32Array, pick: Int32Array | null): Level {
  const n = pick ? pick.length : codes.length;
  const l: Level = { codes: new Float64Array(n), cos: new Int32Array(n), sin: new Int32Array(n), outCos: new Int32Array(n), outSin: new Int32Array(n) };
  for (let k = 0; k < n; k++) {
    const i = pick ? pick[k] : k;
    l.codes[k] = codes[i];
    l.cos[k] = cos[i];
    l.sin[k] = sin[i];
  }
  return l;
}

function modelOf(c: Candidate): FaultyModel {
  return createFaultyModel(c.config, c.fault);
}

function countExact(m: FaultyModel, l: Level): number {
  m.evaluateInto(l.codes, l.outCos, l.outSin);
  let exact = 0;
  for (let k = 0; k < l.codes.length; k++) if (l.outCos[k] === l.cos[k] && l.outSin[k] === l.sin[k]) exact++;
  return exact;
}

// FNV-1a over both channels, twice with different seeds: a 64-bit digest of the answers.
function digest(cos: Int32Array, sin: Int32Array): string {
  let a = 0x811c9dc5;
  let b = 0x01000193 ^ 0x5bd1e995;
  for (let k = 0; k < cos.length; k++) {
    a = Math.imul(a ^ cos[k], 0x01000193);
    a = Math.imul(a ^ sin[k], 0x01000193);
    b = Math.imul(b ^ (cos[k] + 0x9e3779b9), 0x01000193);
    b = Math.imul(b ^ (sin[k] - 0x7f4a7c15), 0x01000193);
  }
  return `${(a >>> 0).toString(16)}:${(b >>> 0).toString(16)}`;
}

function fullRun(m: FaultyModel, l: Level): { exact: number; maxDiffLsb: number; digest: string } {
  m.evaluateInto(l.codes, l.outCos, l.outSin);
  let exact = 0;
  let maxDiff = 0;
  for (let k = 0; k < l.codes.length; k++) {
    const dc = Math.abs(l.outCos[k] - l.cos[k]);
    const ds = Math.abs(l.outSin[k] - l.sin[k]);
    if (dc === 0 && ds === 0) exact++;
    else maxDiff = Math.max(maxDiff, dc, ds);
  }
  return { exact, maxDiffLsb: maxDiff, digest: digest(l.outCos, l.outSin) };
}

/** Indices of the `keep` best by score, plus every one that scored `perfect`. */
function survivors(scores: number[], perfect: number, keep: number): number[] {
  const order = scores.map((_, i) => i).sort((a, b) => scores[b] - scores[a] || a - b);
  return order.filter((i, rank) => rank < keep || scores[i] === perfect);
}

const fmt = (n: number) => n.toLocaleString('en-US');

/**
 * Explains a board's answers against its declared configuration: ranks the declared model, every
 * configuration deviation and every catalogue defect by how many answers each reproduces exactly.
 * @throws ExplainInputError for samples it cannot take; ExplainStopped when asked to stop
 */
export function explain(declaredInput: ModelConfig, samples: ExplainSamples, options: ExplainOptions = {}): Explanation {
  const declared = parseModelConfig(declaredInput);
  const n = samples.angle.length;
  if (n === 0) throw new ExplainInputError('no answered samples to explain');
  if (samples.cos.length !== n || samples.sin.length !== n) throw new ExplainInputError(`the columns differ in length: ${n} angles, ${samples.cos.length} cos, ${samples.sin.length} sin`);
  const { min, max } = angleCodeRange(declared);
  const codes = new Float64Array(n);
  const cos = new Int32Array(n);
  const sin = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    const a = samples.angle[k];
    if (!(Number.isInteger(a) && a >= min && a <= max)) throw new ExplainInputError(`sample ${k}: angle code ${a} is not an integer ${min}..${max} for this core`);
    if (!Number.isInteger(samples.cos[k]) || !Number.isInteger(samples.sin[k])) throw new ExplainInputError(`sample ${k}: cos and sin must be integer codes`);
    codes[k] = a;
    cos[k] = samples.cos[k];
    sin[k] = samples.sin[k];
  }

  const full = level(codes, cos, sin, null);
  const { small, large } = pickScreen(declared, codes);
  const l1 = level(codes, cos, sin, small);
  const l2 = level(codes, cos, sin, large);
  const offset = estimateAngleOffset(declared, l2.codes, l2.cos, l2.sin);

  const tried: Tried[] = [];
  const stages: (() => Candidate[])[] = [
    () => [{ config: declared, fault: null, remoteness: Remoteness.Declared }],
    () => deviationCandidates(declared),
    () => defectCandidates(declared, Remoteness.Defect, offset),
    () => {
      // Defects on the best configuration deviation, when one beats the declared model.
      const base = tried.find((t) => t.remoteness === Remoteness.Declared)!;
      const best = tried.filter((t) => t.remoteness === Remoteness.Deviation && t.fault === null).sort((a, b) => b.exact - a.exact || a.order - b.order)[0];
      return best && best.exact > base.exact ? defectCandidates(best.config, Remoteness.DefectOnDeviation, offset) : [];
    },
  ];
  const defectsPerCore = defectCandidates(declared, Remoteness.Defect, offset).length;
  const total = 1 + deviationCandidates(declared).length + 2 * defectsPerCore;
  let done = 0;
  const stop = () => {
    if (options.shouldStop?.()) throw new ExplainStopped();
  };

  for (const stage of stages) {
    stop();
    const candidates = stage();
    if (candidates.length === 0) continue;
    const models = candidates.map(modelOf);
    // Run on every answer: first those that reproduced all of the large screen, then, unless one
    // of them reproduces every answer, the best of the rest (for the ranking of partial ones).
    let chosen = candidates.map((_, i) => i);
    let perfect = chosen;
    if (candidates.length > 1) {
      const s1: number[] = [];
      for (let i = 0; i < models.length; i++) {
        if (i % 32 === 0) {
          stop();
          options.onProgress?.(done + i, total);
        }
        s1.push(countExact(models[i], l1));
      }
      const keep1 = survivors(s1, l1.codes.length, KEEP_AFTER_SMALL);
      const s2 = keep1.map((i) => countExact(models[i], l2));
      chosen = survivors(s2, l2.codes.length, KEEP_AFTER_LARGE).map((j) => keep1[j]);
      perfect = keep1.filter((_, j) => s2[j] === l2.codes.length);
    }
    const confirm = (i: number) => {
      stop();
      tried.push({ ...candidates[i], order: tried.length, ...fullRun(models[i], full) });
    };
    perfect.forEach(confirm);
    if (!tried.some((t) => t.exact === n)) chosen.filter((i) => !perfect.includes(i)).forEach(confirm);
    done += candidates.length;
    options.onProgress?.(done, total);
    if (tried.some((t) => t.exact === n)) break;
  }
  options.onProgress?.(done, done);
  return summarise(declared, n, tried, full);
}

function refOf(t: Tried, declared: ModelConfig): HypothesisRef {
  return { label: faultLabel(t.config, declared, t.fault), config: t.config, fault: t.fault };
}

function summarise(declared: ModelConfig, n: number, tried: Tried[], full: Level): Explanation {
  // Simplest first among equals, so each class is named by its least remote member.
  const ranked = [...tried].sort((a, b) => b.exact - a.exact || a.remoteness - b.remoteness || a.maxDiffLsb - b.maxDiffLsb || a.order - b.order);
  const classes = new Map<string, Tried[]>();
  for (const t of ranked) {
    const key = `${t.exact} ${t.digest}`;
    const members = classes.get(key);
    if (members) members.push(t);
    else classes.set(key, [t]);
  }
  const hypotheses: Hypothesis[] = [...classes.values()].slice(0, MAX_HYPOTHESES).map(([head, ...others]) => ({
    ...refOf(head, declared),
    exact: head.exact,
    maxDiffLsb: head.maxDiffLsb,
    equivalent: others.map((o) => refOf(o, declared)),
  }));
  const best = hypotheses[0];
  const bestTried = classes.values().next().value![0];
  const declaredMatches = best.exact === n && bestTried.remoteness === Remoteness.Declared;
  let outcome: Explanation['outcome'];
  if (best.exact === n) outcome = declaredMatches ? 'matches-model' : 'explained';
  else outcome = best.exact >= PARTLY_SHARE * n ? 'partly-explained' : 'unexplained';
  let rest: Rest | null = null;
  if (outcome === 'partly-explained') {
    createFaultyModel(best.config, best.fault).evaluateInto(full.codes, full.outCos, full.outSin);
    rest = classifyRest(full.codes, full.cos, full.sin, full.outCos, full.outSin);
  }
  const others = best.equivalent.length;
  const alike = others > 0 ? ` ${others === 1 ? 'One other hypothesis gives' : `${others} other hypotheses give`} the same answers on every code.` : '';
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
  return { declared, answered: n, hypotheses, outcome, rest, summary };
}
