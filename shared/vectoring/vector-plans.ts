// Plans for vectoring cores: which (x, y) pairs to ask, as plain data that a session saves and a
// runner replays. Every plan gives its i-th pair directly, so long runs are made in chunks.
import { z } from 'zod';
import { PlanError } from '../numeric/errors';
import { exactSinCosOfTurns } from '../numeric/exact-reference';
import { roundHalfAwayFromZero } from '../numeric/formats';
import { hash32 } from '../numeric/plans';
import { inputRange, type VectorConfig } from './vector-config';

/** Pairs planVectors holds at once; longer plans go through vectorPlanInto in chunks. */
export const MAX_VECTOR_PLAN_POINTS = 2 ** 24;
/** The widest input an exhaustive plan takes: 8 + 8 bits, 65,536 pairs. */
export const MAX_EXHAUSTIVE_IN_BITS = 8;

const code = z.number().int();
const count = z.number().int().min(1).max(2 ** 32);

/** The zod schema of a vectoring plan. */
export const vectorPlanSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('list'), points: z.array(z.tuple([code, code])).min(1) }),
  // `points` pairs evenly round a circle of `radius` input codes, from angle 0 counter-clockwise.
  z.strictObject({ kind: z.literal('circle'), radius: z.number().int().min(1), points: z.number().int().min(1).max(MAX_VECTOR_PLAN_POINTS) }),
  // A square grid of at most `target` pairs: every pair when they fit, else every stride-th code of each axis.
  z.strictObject({ kind: z.literal('grid'), target: z.number().int().min(1).max(2 ** 32) }),
  z.strictObject({ kind: z.literal('random'), seed: z.number().int().min(0).max(2 ** 32 - 1), count }),
  z.strictObject({ kind: z.literal('edges') }),
  z.strictObject({ kind: z.literal('exhaustive') }),
]);

/** A vectoring plan, as saved. */
export type VectorPlan = z.infer<typeof vectorPlanSchema>;

/** A plan bound to an input format: how many pairs it has, and the i-th pair written into arrays. */
export interface BoundVectorPlan {
  readonly plan: VectorPlan;
  readonly length: number;
  /** Writes pair i into xs[k], ys[k]. */
  pointInto(i: number, xs: Int32Array, ys: Int32Array, k: number): void;
}

/**
 * The axes, the diagonals, the zero vector, the largest magnitudes (the corners), the smallest
 * (one code from the origin), every pair within two codes of the origin (where angle resolution
 * collapses), and pairs one code either side of the negative x axis (where the angle jumps by a
 * turn and the pre-rotation changes side). Sorted by x, then y; each pair once.
 */
export function edgePairs(c: Pick<VectorConfig, 'inBits'>): [number, number][] {
  const { min, max } = inputRange(c);
  const raw: [number, number][] = [];
  const axis = [min, min + 1, -2, -1, 0, 1, 2, max - 1, max];
  for (const v of axis) raw.push([v, 0], [0, v], [v, v], [v, -v]);
  for (const v of [min, min + 1, -2, -1]) raw.push([v, 1], [v, -1]);
  raw.push([min, min], [min, max], [max, min], [max, max]);
  for (let x = -2; x <= 2; x++) for (let y = -2; y <= 2; y++) raw.push([x, y]);
  const seen = new Set<number>();
  const out: [number, number][] = [];
  for (const [x, y] of raw) {
    if (x < min || x > max || y < min || y > max) continue;
    const key = (x - min) * (max - min + 1) + (y - min);
    if (seen.has(key)) continue;
    seen.add(key);
    out.push([x, y]);
  }
  return out.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
}

/**
 * Validates a plan against an input format.
 * @throws PlanError naming the field at fault.
 */
export function bindVectorPlan(input: unknown, c: Pick<VectorConfig, 'inBits'>): BoundVectorPlan {
  const parsed = vectorPlanSchema.safeParse(input);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new PlanError(issue.path.length ? issue.path.map(String).join('.') : 'plan', issue.message);
  }
  const plan = parsed.data;
  const { min, max } = inputRange(c);
  const span = max - min + 1;
  const list = (pairs: readonly (readonly [number, number])[]): BoundVectorPlan => ({
    plan,
    length: pairs.length,
    pointInto(i, xs, ys, k) {
      xs[k] = pairs[i][0];
      ys[k] = pairs[i][1];
    },
  });
  switch (plan.kind) {
    case 'list':
      plan.points.forEach(([x, y], i) => {
        if (x < min || x > max) throw new PlanError(`points.${i}.0`, `x ${x} is not an input code ${min}..${max} (${c.inBits} bits)`);
        if (y < min || y > max) throw new PlanError(`points.${i}.1`, `y ${y} is not an input code ${min}..${max} (${c.inBits} bits)`);
      });
      return list(plan.points);
    case 'circle': {
      if (plan.radius > max) throw new PlanError('radius', `must be at most ${max}, the largest ${c.inBits}-bit input`);
      const { radius, points } = plan;
      return {
        plan,
        length: points,
        pointInto(i, xs, ys, k) {
          // Reduced by octant, so points on the axes and diagonals land exactly.
          const e = exactSinCosOfTurns(i / points);
          xs[k] = roundHalfAwayFromZero(radius * e.cos);
          ys[k] = roundHalfAwayFromZero(radius * e.sin);
        },
      };
    }
    case 'grid': {
      // A power-of-two stride keeps 0 and the most negative code on the grid (the axes and the zero vector).
      const perAxis = Math.min(span, Math.floor(Math.sqrt(plan.target)));
      const stride = 2 ** Math.ceil(Math.log2(span / perAxis) - 1e-12);
      const n = span / stride;
      return {
        plan,
        length: n * n,
        pointInto(i, xs, ys, k) {
          xs[k] = min + Math.floor(i / n) * stride;
          ys[k] = min + (i % n) * stride;
        },
      };
    }
    case 'random': {
      const drop = 2 ** (32 - c.inBits);
      return {
        plan,
        length: plan.count,
        pointInto(i, xs, ys, k) {
          xs[k] = min + Math.floor(hash32(plan.seed, 2 * i) / drop);
          ys[k] = min + Math.floor(hash32(plan.seed, 2 * i + 1) / drop);
        },
      };
    }
    case 'edges':
      return list(edgePairs(c));
    case 'exhaustive':
      if (c.inBits > MAX_EXHAUSTIVE_IN_BITS) {
        throw new PlanError('kind', `exhaustive plans take inputs of at most ${MAX_EXHAUSTIVE_IN_BITS} bits (${span}² pairs is too many to ask); use grid or random for ${c.inBits}-bit inputs`);
      }
      return {
        plan,
        length: span * span,
        pointInto(i, xs, ys, k) {
          xs[k] = min + Math.floor(i / span);
          ys[k] = min + (i % span);
        },
      };
  }
}

/** Writes pairs start .. start + xs.length − 1 of a bound plan; returns how many. */
export function vectorPlanInto(bound: BoundVectorPlan, start: number, xs: Int32Array, ys: Int32Array): number {
  const n = Math.max(0, Math.min(xs.length, ys.length, bound.length - start));
  for (let k = 0; k < n; k++) bound.pointInto(start + k, xs, ys, k);
  return n;
}

/**
 * All pairs of a plan, in request order, as x and y columns.
 * @throws PlanError for a bad plan or one longer than MAX_VECTOR_PLAN_POINTS.
 */
export function planVectors(plan: unknown, c: Pick<VectorConfig, 'inBits'>): { xs: Int32Array; ys: Int32Array } {
  const bound = bindVectorPlan(plan, c);
  if (bound.length > MAX_VECTOR_PLAN_POINTS) {
    throw new PlanError('plan', `has ${bound.length} pairs, more than ${MAX_VECTOR_PLAN_POINTS} at once; read it in chunks with vectorPlanInto`);
  }
  const xs = new Int32Array(bound.length);
  const ys = new Int32Array(bound.length);
  vectorPlanInto(bound, 0, xs, ys);
  return { xs, ys };
}
