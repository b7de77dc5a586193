// A vectoring run's plan: from `--plan` as typed to the plan as saved (vectorPlanSchema) and to the
// engine's request. Grid and exhaustive plans are regular grids walked y fastest, exactly a
// VEC_GRID, so the board makes their vectors at line rate; every other plan is a list.
import type { VectorRunRequest } from '../shared/link-engine/run-request';
import { bindVectorPlan, inputRange, planVectors, PlanError, type BoundVectorPlan, type VectorConfig, type VectorPlan } from '../shared/vectoring';
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

/** The plan to record, bound to the core's input format. */
export function resolveVectorPlan(spec: VectorPlanSpec, c: VectorConfig, readFile: (path: string) => string): BoundVectorPlan {
  const plan: unknown = spec.kind === 'file' ? { kind: 'list', points: readVectorFile(spec.path, c, readFile) } : spec;
  try {
    return bindVectorPlan(plan, c);
  } catch (e) {
    if (e instanceof PlanError) throw new UsageError(`--plan: ${e.message}`);
    throw e;
  }
}

/** The engine's request for a bound plan: VEC_GRID for the regular grids, VEC_LIST for the rest. */
export function vectorPlanToRequest(bound: BoundVectorPlan, c: VectorConfig): VectorRunRequest {
  const plan: VectorPlan = bound.plan;
  if (plan.kind === 'grid' || plan.kind === 'exhaustive') {
    // Both walk min + i·stride, min + j·stride with y fastest; the stride is where point 1 lands.
    const side = Math.round(Math.sqrt(bound.length));
    const xs = new Int32Array(2);
    const ys = new Int32Array(2);
    bound.pointInto(0, xs, ys, 0);
    bound.pointInto(Math.min(1, bound.length - 1), xs, ys, 1);
    const stride = side > 1 ? ys[1] - ys[0] : 1;
    return { kind: 'grid', x0: xs[0], dx: stride, nx: side, y0: ys[0], dy: stride, ny: side };
  }
  try {
    const { xs, ys } = planVectors(plan, c);
    return { kind: 'vectors', xs, ys };
  } catch (e) {
    if (e instanceof PlanError) throw new UsageError(`--plan: ${e.message}`);
    throw e;
  }
}
