// A soak of a vectoring plan: the same vectors pass after pass, booked by the soak's own
// accumulator (soak-accumulator.ts) with each vector's position as its key, so the summary and
// timeline are exactly a rotating soak's. Only the unstable list differs: a vector is two inputs
// and its answer an angle and a magnitude, which the rotating record's `code`, `cos` and `sin`
// cannot name, so it is listed under `unstable.vectors` with x, y and (angle, magnitude) answers.
import { z } from 'zod';
import type { EngineClock, LinkEngine, VectorRunHandle, VectorRunHandlers, VectorRunResult } from '../link-engine/link-engine';
import type { VectorRunRequest } from '../link-engine/run-request';
import { SoakAccumulator, type SoakOptions, type SoakRecord, type SoakTimelinePoint } from './soak-accumulator';
import { soakRecordSchema } from './soak-record';
import { soakLoop, type PassScore, type SoakLoopOutcome } from './soak-run';
import type { SoakSpec } from './soak-spec';

export interface VectorSoakAnswer {
  angle: number;
  magnitude: number;
  count: number;
}

export interface UnstableVector {
  x: number;
  y: number;
  /** Position in the plan. */
  index: number;
  /** The pass (1-based) whose answer first differed. */
  firstPass: number;
  /** Every distinct answer seen, in order of first appearance, with how often. */
  answers: VectorSoakAnswer[];
  otherAnswers: number;
}

/** A vectoring soak's books: a rotating soak's spec, summary and timeline; its unstable vectors. */
export interface VectorSoakRecord extends Omit<SoakRecord, 'unstable'> {
  mode: 'vectoring';
  unstable: { count: number; listed: number; vectors: UnstableVector[] };
}

const int = z.number().int();
const rotating = soakRecordSchema.shape;

/** The vectoring soak record, checked as the rotating one is (the runner's --json carries it). */
export const vectorSoakRecordSchema = z
  .strictObject({
    mode: z.literal('vectoring'),
    spec: rotating.spec,
    summary: rotating.summary,
    timeline: rotating.timeline,
    unstable: z
      .strictObject({
        count: int.min(0),
        listed: int.min(0),
        vectors: z
          .array(
            z.strictObject({
              x: int,
              y: int,
              index: int.min(0),
              firstPass: int.min(2),
              answers: z.array(z.strictObject({ angle: int, magnitude: int, count: int.min(1) })).min(2).max(64),
              otherAnswers: int.min(0),
            }),
          )
          .max(4096),
      })
      .refine((u) => u.vectors.length === u.listed && u.listed <= u.count, 'unstable.listed must be the number of vectors listed, at most unstable.count'),
  })
  .refine((r) => r.summary.unstableCodes === r.unstable.count, 'summary.unstableCodes must equal unstable.count');

/** One finished pass of a vectoring plan, with its scoring and this pass's own link figures. */
export interface VectorSoakPassInput {
  xs: ArrayLike<number>;
  ys: ArrayLike<number>;
  angle: ArrayLike<number>;
  magnitude: ArrayLike<number>;
  answered: ArrayLike<number>;
  mismatches: number;
  maxAbsErrorLsb: number | null;
  checkFailures: number;
  retries: number;
  atMs: number;
  elapsedMs: number;
}

export class VectorSoakAccumulator {
  private readonly books: SoakAccumulator;
  private readonly positions: Float64Array;
  private readonly xs: Int32Array;
  private readonly ys: Int32Array;

  constructor(xs: ArrayLike<number>, ys: ArrayLike<number>, options: SoakOptions = {}) {
    if (xs.length !== ys.length) throw new Error(`a vectoring plan has as many x as y inputs, got ${xs.length} and ${ys.length}`);
    this.xs = Int32Array.from(xs);
    this.ys = Int32Array.from(ys);
    // Each vector is booked under its position: the plan's order is the same every pass.
    this.positions = Float64Array.from({ length: xs.length }, (_, i) => i);
    this.books = new SoakAccumulator(this.positions, options);
  }

  get passes(): number {
    return this.books.passes;
  }

  get unstableCount(): number {
    return this.books.unstableCount;
  }

  addPass(p: VectorSoakPassInput): SoakTimelinePoint {
    const n = this.xs.length;
    if (p.xs.length !== n) throw new Error(`a soak pass has ${p.xs.length} vectors, the plan ${n}`);
    for (let i = 0; i < n; i++) {
      if (p.answered[i] && (p.xs[i] !== this.xs[i] || p.ys[i] !== this.ys[i])) throw new Error(`a soak pass asked (${p.xs[i]}, ${p.ys[i]}) at position ${i}, the plan (${this.xs[i]}, ${this.ys[i]})`);
    }
    return this.books.addPass({ ...p, codes: this.positions, cos: p.angle, sin: p.magnitude });
  }

  unstableVectors(): UnstableVector[] {
    return this.books.unstableCodes().map((u) => ({
      x: this.xs[u.index],
      y: this.ys[u.index],
      index: u.index,
      firstPass: u.firstPass,
      answers: u.answers.map((a) => ({ angle: a.cos, magnitude: a.sin, count: a.count })),
      otherAnswers: u.otherAnswers,
    }));
  }

  record(spec: SoakSpec): VectorSoakRecord {
    const r = this.books.record(spec);
    return { mode: 'vectoring', spec: r.spec, summary: r.summary, timeline: r.timeline, unstable: { count: r.unstable.count, listed: r.unstable.listed, vectors: this.unstableVectors() } };
  }
}

export interface VectorSoakRunOptions<S extends PassScore> {
  engine: LinkEngine;
  request: VectorRunRequest;
  spec: SoakSpec;
  clock: EngineClock;
  /** Score one finished pass; `checkFailures` is this pass's own count. */
  score: (result: VectorRunResult, checkFailures: number) => S;
  handlers?: VectorRunHandlers;
  onPassStart?: (pass: number, handle: VectorRunHandle) => void;
  onPass?: (point: SoakTimelinePoint, acc: VectorSoakAccumulator, score: S, result: VectorRunResult) => void;
  accumulator?: SoakOptions;
  keepGoing?: () => boolean;
}

export type VectorSoakOutcome<S extends PassScore> = SoakLoopOutcome<VectorRunResult, VectorSoakAccumulator, S>;

/** runSoak (soak-run.ts) for a vectoring plan: the same passes, books and stopping rules. */
export function runVectorSoak<S extends PassScore>(o: VectorSoakRunOptions<S>): Promise<VectorSoakOutcome<S>> {
  return soakLoop({
    ...o,
    start: () => o.engine.runVectors(o.request, o.handlers ?? {}),
    books: (first) => new VectorSoakAccumulator(first.xs, first.ys, o.accumulator),
    book: (acc, r, figures) => acc.addPass({ xs: r.xs, ys: r.ys, angle: r.angle, magnitude: r.magnitude, answered: r.answered, ...figures }),
  });
}
