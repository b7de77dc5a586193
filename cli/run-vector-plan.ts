// A vectoring run's plan: from `--plan` as typed to the plan as saved (vectorPlanSchema) and to the
// engine's request (shared/link-engine/vector-plan-request.ts: VEC_GRID for the regular grids).
import type { VectorRunRequest } from '../shared/link-engine/run-request';
import { vectorPlanRequest } from '../shared/link-engine/vector-plan-request';
import { bindVectorPlan, inputRange, PlanError, type BoundVectorPlan, type VectorConfig } from '../shared/vectoring';
import { parseInteger, UsageError } from './run-options';

/** The plan as typed for a vectoring core. */
export type VectorPlanSpec =
  | { kind: 'exhaustive' }
  | { kind: 'edges' }
  | { kind: 'grid'; target: number }
  | { kind: 'circle'; radius: number; points: number }
  | { kind: 'random'; count: number; seed: number }
  | { kind: 'file'; path: string };

export const VECTOR_PLAN_SPELLINGS = 'exhaustive, grid:TARGET, circle:RADIUS,POINTS, random:COUNT,SEED, edges or file:PATH';

function ints(text: string, n: number, name: string, names: string): number[] {
  const parts = text.split(',');
  if (parts.length !== n) throw new UsageError(`--plan ${name} needs ${names}, got "${text}"`);
  return parts.map((p) => parseInteger(p, `--plan ${name}`));
}

/** Parse --plan for a vectoring core; ranges are checked once the input format is known. */
export function parseVectorPlanSpec(text: string): VectorPlanSpec {
  const [name, ...rest] = text.split(':');
  const arg = rest.join(':');
  switch (name) {
    case 'exhaustive':
    case 'edges':
      if (arg !== '') throw new UsageError(`--plan ${name} takes no arguments`);
      return { kind: name };
    case 'grid':
      return { kind: 'grid', target: ints(arg, 1, 'grid', 'TARGET (about how many vectors)')[0] };
    case 'circle': {
      const [radius, points] = ints(arg, 2, 'circle', 'RADIUS,POINTS');
      return { kind: 'circle', radius, points };
    }
    case 'random': {
      const [count, seed] = ints(arg, 2, 'random', 'COUNT,SEED');
      return { kind: 'random', count, seed };
    }
    case 'file':
      if (arg === '') throw new UsageError('--plan file needs a path: file:PATH');
      return { kind: 'file', path: arg };
    default:
      throw new UsageError(`--plan for a vectoring core must be ${VECTOR_PLAN_SPELLINGS}, got "${text}"`);
  }
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
