// A vectoring run's plan: from `--plan` as typed to the plan as saved (vectorPlanSchema) and to the
// engine's request (shared/link-engine/vector-plan-request.ts: VEC_GRID for the regular grids).
import type { VectorRunRequest } from '../shared/link-engine/run-request';
import { vectorPlanRequest } from '../shared/link-engine/vector-plan-request';
import { bindVectorPlan, inputRange, PlanError, type BoundVectorPlan, type VectorConfig } from '../shared/vectoring';
import { parseInteger, parsePlanArg, UsageError, type PlanArgs } from './run-options';

/** The plan as typed for a vectoring core. */
export type VectorPlanSpec =
  | { kind: 'exhaustive' }
  | { kind: 'edges' }
  | { kind: 'grid'; target: number }
  | { kind: 'circle'; radius: number; points: number }
  | { kind: 'random'; count: number; seed: number }
  | { kind: 'file'; path: string };

export const VECTOR_PLAN_SPELLINGS = 'exhaustive, grid:TARGET, circle:RADIUS,POINTS, random:COUNT,SEED, edges or file:PATH';

/** The plans of a vectoring core, as --plan spells them. */
const VECTOR_PLANS: Record<VectorPlanSpec['kind'], PlanArgs> = {
  exhaustive: 'none',
  edges: 'none',
  grid: { fields: ['target'], spelled: 'TARGET (about how many vectors)' },
  circle: { fields: ['radius', 'points'], spelled: 'RADIUS,POINTS' },
  random: { fields: ['count', 'seed'], spelled: 'COUNT,SEED' },
  file: 'path',
};

/** Parse --plan for a vectoring core; ranges are checked once the input format is known. */
export function parseVectorPlanSpec(text: string): VectorPlanSpec {
  return parsePlanArg(text, VECTOR_PLANS, `--plan for a vectoring core must be ${VECTOR_PLAN_SPELLINGS}`) as VectorPlanSpec;
}

/** Vectors from a file: one "x,y" a line, decimal or 0x hex; # starts a comment. */
function readVectorFile(path: string, c: VectorConfig, readFile: (path: string) => string): Array<[number, number]> {
  let text: string;
  try {
    text = readFile(path);
  } catch (e) {
    throw new UsageError(`--plan file: cannot read ${path} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
  const { min, max } = inputRange(c);
  const points: Array<[number, number]> = [];
  text.split(/\r?\n/).forEach((raw, i) => {
    const line = raw.replace(/#.*/, '').trim();
    if (line === '') return;
    const where = `${path} line ${i + 1}`;
    const parts = line.split(',');
    if (parts.length !== 2) throw new UsageError(`${where}: a vector is "x,y", got "${line}"`);
    const [x, y] = parts.map((p) => parseInteger(p, where));
    for (const [name, v] of [['x', x], ['y', y]] as const) {
      if (v < min || v > max) throw new UsageError(`${where}: ${name} ${v} is not an input code ${min}..${max} (${c.inBits} bits)`);
    }
    points.push([x, y]);
  });
  if (points.length === 0) throw new UsageError(`--plan file: ${path} holds no vectors`);
  return points;
}

/** What `f` returns, a plan error as a usage error naming --plan. */
function asUsage<T>(f: () => T): T {
  try {
    return f();
  } catch (e) {
    if (e instanceof PlanError) throw new UsageError(`--plan: ${e.message}`);
    throw e;
  }
}

/** The plan to record, bound to the core's input format. */
export function resolveVectorPlan(spec: VectorPlanSpec, c: VectorConfig, readFile: (path: string) => string): BoundVectorPlan {
  const plan: unknown = spec.kind === 'file' ? { kind: 'list', points: readVectorFile(spec.path, c, readFile) } : spec;
  return asUsage(() => bindVectorPlan(plan, c));
}

/** The engine's request for a bound plan (shared/link-engine/vector-plan-request.ts). */
export function vectorPlanToRequest(bound: BoundVectorPlan, c: VectorConfig): VectorRunRequest {
  return asUsage(() => vectorPlanRequest(bound, c));
}
