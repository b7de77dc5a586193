// From the plan as typed to the plan as saved (planSchema) and to the engine's run request.
// Exhaustive runs and sweeps become SWEEP requests (the device makes the codes at line rate);
// every other plan is an explicit list of codes.
import type { RunRequest } from '../shared/link-engine/run-request';
import { angleCodeRange, assertAngleCode, bindPlan, planCodes, PlanError, type AngleFormat, type Plan } from '../shared/numeric';
import { parseInteger, UsageError, type PlanSpec } from './run-options';

/** The plan to save with the session, checked against the core's angle format. */
export function resolvePlan(spec: PlanSpec, format: AngleFormat, readFile: (path: string) => string): Plan {
  let plan: unknown;
  switch (spec.kind) {
    case 'file':
      plan = { kind: 'list', codes: readCodeFile(spec.path, format, readFile) };
      break;
    default:
      plan = spec;
  }
  try {
    return bindPlan(plan, format).plan;
  } catch (e) {
    if (e instanceof PlanError) throw new UsageError(`--plan: ${e.message}`);
    throw e;
  }
}

/** Angle codes from a file: one a line or comma-separated, decimal or 0x hex; # starts a comment. */
function readCodeFile(path: string, format: AngleFormat, readFile: (path: string) => string): number[] {
  let text: string;
  try {
    text = readFile(path);
  } catch (e) {
    throw new UsageError(`--plan file: cannot read ${path} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
  const codes: number[] = [];
  text.split(/\r?\n/).forEach((line, i) => {
    for (const part of line.replace(/#.*/, '').split(',')) {
      if (part.trim() === '') continue;
      const where = `${path} line ${i + 1}`;
      const code = parseInteger(part, where);
      try {
        assertAngleCode(format, code);
      } catch (e) {
        throw new UsageError(`${where}: ${(e as Error).message}`);
      }
      codes.push(code);
    }
  });
  if (codes.length === 0) throw new UsageError(`--plan file: ${path} holds no angle codes`);
  return codes;
}

/** The engine's request for a saved plan; the same mapping serves the run and its replay. */
export function planToRequest(plan: Plan, format: AngleFormat): RunRequest {
  if (plan.kind === 'exhaustive') {
    const r = angleCodeRange(format);
    return { kind: 'sweep', start: r.min, step: 1, count: r.count };
  }
  if (plan.kind === 'sweep') return { kind: 'sweep', start: plan.start, step: plan.step, count: plan.count };
  try {
    return { kind: 'codes', codes: planCodes(plan, format) };
  } catch (e) {
    if (e instanceof PlanError) throw new UsageError(`--plan: ${e.message}`);
    throw e;
  }
}
