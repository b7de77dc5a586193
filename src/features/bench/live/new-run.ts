// A run as a plan asks for it: the request the link engine sends and the empty record its answers
// fill in, in request order.
import type { ResultBatch } from '../../../../shared/link-engine/link-engine';
import type { RunRequest } from '../../../../shared/link-engine/run-request';
import type { DeviceInfo } from '../../../../shared/link';
import { angleCodeRange, parseModelConfig, planCodes, type ModelConfig, type Plan } from '../../../../shared/numeric';
import type { RunRecord } from './unsaved-run';

/** Where the run happens, as the record keeps it. */
export interface RunContext {
  transportLabel: string | null;
  baud: number;
  info: DeviceInfo | null;
}

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
  const n = codes.length;
  const record: RunRecord = {
    codes,
    cos: new Int32Array(n),
    sin: new Int32Array(n),
    answered: new Uint8Array(n),
    plan,
    config,
    startedAt: new Date(),
    endedAt: null,
    ...at,
    archive: null,
    outcome: null,
    figures: null,
    soak: null,
  };
  return { request, record };
}

/** One batch of answers into the record. */
export function takeResults(record: RunRecord, b: ResultBatch) {
  for (let k = 0; k < b.indexes.length; k++) {
    const i = b.indexes[k];
    record.cos[i] = b.cos[k];
    record.sin[i] = b.sin[k];
    record.answered[i] = 1;
  }
}

/** Empty the answers for a soak's next pass (the arrays are reused: a soak's memory stays put). */
export function clearAnswers(record: RunRecord) {
  record.cos.fill(0);
  record.sin.fill(0);
  record.answered.fill(0);
}
