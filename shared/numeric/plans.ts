// Plans: what to ask a core, as plain data that a session saves and a runner replays. Every plan
// gives its i-th code directly (codeAt), so long runs are generated in chunks, never held whole.
import { z } from 'zod';
import { PlanError } from './errors';
import { angleCodeRange, assertAngleCode, roundHalfAwayFromZero, wrapOrSaturateAngleCode, type AngleFormat } from './formats';
import { gcd, isPowerOfTwo } from './spectral';

/** Codes planCodes will hold in one array; longer plans go through planCodesInto in chunks. */
export const MAX_PLAN_CODES = 2 ** 24;

const code = z.number().int();
const count = z.number().int().min(1).max(2 ** 32);

/** The zod schema of a plan; plans are saved with sessions and posted by the runner. */
export const planSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('one'), code }),
  z.strictObject({ kind: z.literal('list'), codes: z.array(code).min(1) }),
  // SWEEP semantics of the bench link: start + i·step, wrapped (turn) or saturated (rad).
  z.strictObject({ kind: z.literal('sweep'), start: code, step: z.number().int().min(-(2 ** 31)).max(2 ** 31 - 1), count }),
  z.strictObject({ kind: z.literal('exhaustive') }),
  z.strictObject({ kind: z.literal('random'), seed: z.number().int().min(0).max(2 ** 32 - 1), count }),
  z.strictObject({ kind: z.literal('edges') }),
  // M cycles in N samples; N a power of two so the spectrum needs no window or resampling.
  z.strictObject({ kind: z.literal('tone'), cycles: z.number().int().min(1), samples: z.number().int().min(8).max(2 ** 24) }),
]);

/** A plan, as saved. */
export type Plan = z.infer<typeof planSchema>;

/**
 * A 32-bit integer hash of (seed, index), so random plans are reproducible and random-access.
 * Multiply–xorshift finaliser with constants published for low bias (common practice, no source).
 */
export function hash32(seed: number, index: number): number {
  let x = (seed ^ Math.imul(index >>> 0, 0x9e3779b9) ^ Math.imul(Math.floor(index / 2 ** 32), 0x85ebca6b)) >>> 0;
  x ^= x >>> 16;
  x = Math.imul(x, 0x7feb352d);
  x ^= x >>> 15;
  x = Math.imul(x, 0x846ca68b);
  x ^= x >>> 16;
  return x >>> 0;
}

/** (a · b) mod m for a < 2^32, |b| < 2^31, m ≤ 2^32, exact: i · step overflows 2^53 on long sweeps. */
function mulMod(a: number, b: number, m: number): number {
  const bm = ((b % m) + m) % m;
  const hi = Math.floor(a / 65536);
  const lo = a % 65536;
  return (((hi * ((bm * 65536) % m)) % m) + lo * bm) % m;
}

/** 0, ±quarter, ±half turn with ±1-code neighbours, octant boundaries, and the format's ends. */
function edgeCodes(f: AngleFormat): number[] {
  const r = angleCodeRange(f);
  // One eighth of a turn in codes: exact for `turn`, rounded for `rad`.
  const eighth = f.angleFormat === 'turn' ? r.count / 8 : (Math.PI / 4) * 2 ** f.angleFrac;
  const raw: number[] = [];
  for (let k = -8; k <= 8; k++) {
    const c = roundHalfAwayFromZero(k * eighth);
    raw.push(c - 1, c, c + 1);
  }
  raw.push(r.min, r.min + 1, r.max - 1, r.max);
  const seen = new Set<number>();
  for (const c of raw) {
    // Binary angles wrap, so −quarter is 3/4 turn; rad codes past the ends do not exist.
    const v = f.angleFormat === 'turn' ? wrapOrSaturateAngleCode(f, c) : c;
    if (v >= r.min && v <= r.max) seen.add(v);
  }
  return [...seen].sort((a, b) => a - b);
}

/** A plan bound to a format: how many codes it has and the i-th of them. */
export interface BoundPlan {
  readonly plan: Plan;
  readonly length: number;
  codeAt(i: number): number;
}

/**
 * Validates a plan against an angle format.
 * @throws PlanError naming the field at fault.
 */
export function bindPlan(input: unknown, f: AngleFormat): BoundPlan {
  const parsed = planSchema.safeParse(input);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new PlanError(issue.path.length ? issue.path.map(String).join('.') : 'plan', issue.message);
  }
  const plan = parsed.data;
  const r = angleCodeRange(f);
  const checkCode = (c: number, key: string) => {
    try {
      assertAngleCode(f, c);
    } catch (e) {
      throw new PlanError(key, (e as Error).message);
    }
  };
  switch (plan.kind) {
    case 'one':
      checkCode(plan.code, 'code');
      return { plan, length: 1, codeAt: () => plan.code };
    case 'list':
      plan.codes.forEach((c, i) => checkCode(c, `codes.${i}`));
      return { plan, length: plan.codes.length, codeAt: (i) => plan.codes[i] };
    case 'sweep':
      checkCode(plan.start, 'start');
      if (f.angleFormat === 'rad') return { plan, length: plan.count, codeAt: (i) => wrapOrSaturateAngleCode(f, plan.start + i * plan.step) };
      return { plan, length: plan.count, codeAt: (i) => (plan.start + mulMod(i, plan.step, r.count)) % r.count };
    case 'exhaustive':
      return { plan, length: r.count, codeAt: (i) => r.min + i };
    case 'random': {
      const drop = 32 - f.angleBits;
      return { plan, length: plan.count, codeAt: (i) => r.min + Math.floor(hash32(plan.seed, i) / 2 ** drop) };
    }
    case 'edges': {
      const codes = edgeCodes(f);
      return { plan, length: codes.length, codeAt: (i) => codes[i] };
    }
    case 'tone': {
      if (!isPowerOfTwo(plan.samples)) throw new PlanError('samples', `must be a power of two, got ${plan.samples}`);
      if (plan.cycles >= plan.samples / 2) throw new PlanError('cycles', `must be below samples / 2 (${plan.samples / 2})`);
      if (gcd(plan.cycles, plan.samples) !== 1) throw new PlanError('cycles', `${plan.cycles} and ${plan.samples} must be coprime`);
      const n = plan.samples;
      // Sample j sits at phase (j·M mod N)/N of a turn; taking the remainder first keeps it exact.
      const codeAt = (j: number) => {
        const p = (j * plan.cycles) % n;
        if (f.angleFormat === 'turn') return wrapOrSaturateAngleCode(f, roundHalfAwayFromZero((p * r.count) / n));
        const signedTurns = p >= n / 2 ? p / n - 1 : p / n;
        return wrapOrSaturateAngleCode(f, roundHalfAwayFromZero(signedTurns * 2 * Math.PI * 2 ** f.angleFrac));
      };
      return { plan, length: n, codeAt };
    }
  }
}

/** Writes codes start .. start+out.length−1 of a bound plan into `out`; returns how many. */
export function planCodesInto(bound: BoundPlan, start: number, out: Float64Array): number {
  const n = Math.max(0, Math.min(out.length, bound.length - start));
  for (let i = 0; i < n; i++) out[i] = bound.codeAt(start + i);
  return n;
}

/**
 * All codes of a plan, in request order.
 * @throws PlanError for a bad plan or one longer than MAX_PLAN_CODES.
 */
export function planCodes(plan: unknown, f: AngleFormat): Float64Array {
  const bound = bindPlan(plan, f);
  if (bound.length > MAX_PLAN_CODES) throw new PlanError('plan', `has ${bound.length} codes, more than ${MAX_PLAN_CODES} at once; read it in chunks with planCodesInto`);
  const out = new Float64Array(bound.length);
  planCodesInto(bound, 0, out);
  return out;
}
