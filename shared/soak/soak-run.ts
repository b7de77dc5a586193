// A soak on one link engine: the same request pass after pass until the spec is used up, each
// pass scored and put in the soak's books. The caller scores (it has the model) and hears about
// every pass, so the runner prints and the Bench page draws while the soak goes on.
import type { EngineClock, LinkEngine, RunHandle, RunHandlers, RunResult } from '../link-engine/link-engine';
import type { RunRequest } from '../link-engine/run-request';
import { ScoreAccumulator, type ModelConfig } from '../numeric';
import { SoakAccumulator, type SoakOptions, type SoakTimelinePoint } from './soak-accumulator';
import { soakWantsAnotherPass, type SoakSpec } from './soak-spec';

export interface PassScore {
  mismatches: number;
  maxAbsErrorLsb: number | null;
}

/** A pass's model mismatches and largest error, from its answered codes: what the books need of a score. */
export function scorePass(config: ModelConfig, result: Pick<RunResult, 'codes' | 'cos' | 'sin' | 'answered'>): PassScore {
  const acc = new ScoreAccumulator(config);
  const idx: number[] = [];
  for (let i = 0; i < result.codes.length; i++) if (result.answered[i]) idx.push(i);
  if (idx.length > 0) acc.add(idx.map((i) => result.codes[i]), idx.map((i) => result.cos[i]), idx.map((i) => result.sin[i]), 0);
  const s = acc.summary();
  return { mismatches: s.mismatches.count, maxAbsErrorLsb: s.count > 0 ? s.overall.maxAbsLsb : null };
}

/** What one pass's booking needs beyond the answers: its scores and link figures. */
export interface PassFigures {
  mismatches: number;
  maxAbsErrorLsb: number | null;
  checkFailures: number;
  retries: number;
  atMs: number;
  elapsedMs: number;
}

/**
 * The soak's pass loop, whatever a pass asks (angle codes or vectors): passes until the spec is
 * used up or `keepGoing` says stop, each whole pass scored and booked; a pass cut short ends the
 * soak unbooked (its missing answers would read as link errors).
 */
export interface SoakLoop<R extends { status: 'complete' | 'aborted' | 'failed'; message?: string; elapsedMs: number }, H extends { done: Promise<R> }, A, S extends PassScore> {
  engine: LinkEngine;
  spec: SoakSpec;
  clock: EngineClock;
  start: () => H;
  books: (first: R) => A;
  book: (acc: A, result: R, figures: PassFigures) => SoakTimelinePoint;
  score: (result: R, checkFailures: number) => S;
  onPassStart?: (pass: number, handle: H) => void;
  onPass?: (point: SoakTimelinePoint, acc: A, score: S, result: R) => void;
  keepGoing?: () => boolean;
}

export interface SoakLoopOutcome<R, A, S> {
  status: 'complete' | 'aborted' | 'failed';
  message?: string;
  acc: A;
  /** The last whole pass and its score: the session's samples and figures. */
  last: { result: R; score: S } | null;
  /** The pass that was cut short (aborted or failed), not booked. */
  cut: R | null;
}

export async function soakLoop<R extends { status: 'complete' | 'aborted' | 'failed'; message?: string; elapsedMs: number }, H extends { done: Promise<R> }, A, S extends PassScore>(
  o: SoakLoop<R, H, A, S>,
): Promise<SoakLoopOutcome<R, A, S>> {
  const t0 = o.clock.now();
  let acc: A | null = null;
  let last: { result: R; score: S } | null = null;
  const f = o.engine.figures;
  for (let pass = 1; ; pass++) {
    if (pass > 1 && (!soakWantsAnotherPass(o.spec, pass - 1, o.clock.now() - t0) || o.keepGoing?.() === false)) break;
    const before = { checkFailures: f.checkFailures, retries: f.retries };
    const atMs = o.clock.now() - t0;
    const handle = o.start();
    o.onPassStart?.(pass, handle);
    const result = await handle.done;
    if (result.status !== 'complete') return { status: result.status, message: result.message, acc: acc ?? o.books(result), last, cut: result };
    acc ??= o.books(result);
    const checkFailures = f.checkFailures - before.checkFailures;
    const score = o.score(result, checkFailures);
    const point = o.book(acc, result, { mismatches: score.mismatches, maxAbsErrorLsb: score.maxAbsErrorLsb, checkFailures, retries: f.retries - before.retries, atMs, elapsedMs: result.elapsedMs });
    last = { result, score };
    o.onPass?.(point, acc, score, result);
  }
  return { status: 'complete', acc: acc!, last, cut: null };
}

export interface SoakRunOptions<S extends PassScore> {
  engine: LinkEngine;
  request: RunRequest;
  spec: SoakSpec;
  clock: EngineClock;
  /** Score one finished pass; `checkFailures` is this pass's own count. */
  score: (result: RunResult, checkFailures: number) => S;
  handlers?: Omit<RunHandlers, 'onProgress'> & { onProgress?: RunHandlers['onProgress'] };
  /** A pass starts (1-based), with its handle so the caller can pause or abort it. */
  onPassStart?: (pass: number, handle: RunHandle) => void;
  /** A pass ended and was booked. */
  onPass?: (point: SoakTimelinePoint, acc: SoakAccumulator, score: S, result: RunResult) => void;
  accumulator?: SoakOptions;
  /** Asked before each pass after the first: false stops the soak early (the user stopped it). */
  keepGoing?: () => boolean;
}

export type SoakOutcome<S extends PassScore> = SoakLoopOutcome<RunResult, SoakAccumulator, S>;

export function runSoak<S extends PassScore>(o: SoakRunOptions<S>): Promise<SoakOutcome<S>> {
  return soakLoop({
    ...o,
    start: () => o.engine.run(o.request, o.handlers ?? {}),
    books: (first) => new SoakAccumulator(first.codes, o.accumulator),
    book: (acc, r, figures) => acc.addPass({ codes: r.codes, cos: r.cos, sin: r.sin, answered: r.answered, ...figures }),
  });
}
