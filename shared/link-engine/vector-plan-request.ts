// A vectoring plan as the engine asks it. Grid and exhaustive plans are regular grids walked
// y fastest, exactly a VEC_GRID, so the board makes their vectors at line rate; every other plan
// goes out as its (x, y) pairs. The Bench page and the runner both build their request here.
import type { VectorGrid } from '../link/payloads';
import { planVectors, type BoundVectorPlan, type VectorConfig } from '../vectoring';

/** The request of a bound plan (a VectorRunRequest; listed pairs as the plan's own columns). @throws PlanError for a list too long to ask at once */
export function vectorPlanRequest(bound: BoundVectorPlan, c: Pick<VectorConfig, 'inBits'>): { kind: 'vectors'; xs: Int32Array; ys: Int32Array } | ({ kind: 'grid' } & VectorGrid) {
  const plan = bound.plan;
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
  const { xs, ys } = planVectors(plan, c);
  return { kind: 'vectors', xs, ys };
}
