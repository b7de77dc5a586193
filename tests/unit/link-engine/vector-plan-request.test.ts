import { describe, expect, it } from 'vitest';
import { expandVectorRequest } from '../../../shared/link-engine/run-request';
import { vectorPlanRequest } from '../../../shared/link-engine/vector-plan-request';
import { bindVectorPlan, parseVectorConfig, planVectors } from '../../../shared/vectoring';

const profile = (inBits: number) => ({ angleFormat: 'turn', angleBits: 16, outBits: 16, vector: { inBits, angleFormat: 'turn', angleBits: 16, magBits: 18 } }) as const;

describe('a vectoring plan as the engine asks it', () => {
  it('asks grid and exhaustive plans, a one-point grid too, as one VEC_GRID walking the plan’s own pairs in order', () => {
    for (const [plan, inBits] of [[{ kind: 'grid', target: 1 }, 8], [{ kind: 'grid', target: 300 }, 12], [{ kind: 'exhaustive' }, 5]] as const) {
      const c = parseVectorConfig({ inBits });
      const req = vectorPlanRequest(bindVectorPlan(plan, c), c);
      expect(req.kind).toBe('grid');
      expect(expandVectorRequest(req, profile(inBits))).toEqual(planVectors(plan, c));
    }
  });

  it('asks every other plan as its pairs', () => {
    const c = parseVectorConfig({ inBits: 8 });
    const plan = { kind: 'circle', radius: 90, points: 12 } as const;
    const req = vectorPlanRequest(bindVectorPlan(plan, c), c);
    expect(req).toEqual({ kind: 'vectors', ...planVectors(plan, c) });
  });
});
