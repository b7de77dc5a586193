// A run as a plan asks for it: the request the link engine sends and the empty record its answers
// fill in, in request order (run-record.ts).
import type { RunRequest } from '../../../../shared/link-engine/run-request';
import { angleCodeRange, parseModelConfig, planCodes, type ModelConfig, type Plan } from '../../../../shared/numeric';
import { openRecord, ROTATION_COLUMNS, type RunContext } from './run-record';
import type { RunRecord } from './unsaved-run';

/** Throws for a plan or core profile that does not parse. */
export function newRun(plan: Plan, configInput: unknown, at: RunContext): { request: RunRequest; record: RunRecord } {
  const config: ModelConfig = parseModelConfig(configInput);
  const codes = planCodes(plan, config);
  const r = angleCodeRange(config);
  // Sweeps go out as SWEEP requests (a few bytes per segment); anything else as its codes.
  const request: RunRequest =
    plan.kind === 'exhaustive'
      ? { kind: 'sweep', start: r.min, step: 1, count: r.count }
      : plan.kind === 'sweep'
        ? { kind: 'sweep', start: plan.start, step: plan.step, count: plan.count }
        : { kind: 'codes', codes };
  const record: RunRecord = openRecord(ROTATION_COLUMNS, codes.length, { codes, plan, config, ...at, soak: null });
  return { request, record };
}
