// How a vectoring core's limits are measured from its score: one table the server (session
// intake) and the runner (its own verdict) both judge by, so the two never disagree on a session.
import type { VectorScoreSummary } from '../vectoring';
import type { LimitKey } from './limits';

/** What a vectoring judgement knows besides the samples: link errors happen on the wire. */
export interface VectorJudgeContext {
  /** Frames that failed their CHECK during the run, as the bench or runner counted them. */
  checkFailures?: number;
}

export interface VectorMeasure {
  /** True when the measured value must stay at or below the limit. */
  max: boolean;
  /** The measured value; null when the context does not hold it. */
  value: (s: VectorScoreSummary, c: VectorJudgeContext) => number | null;
}

/** Every limit a vectoring core may set (VECTOR_LIMIT_KEYS) and how it is measured. */
export const VECTOR_MEASURES: Readonly<Partial<Record<LimitKey, VectorMeasure>>> = {
  maxAngleErrorLsb: { max: true, value: (s) => s.angleLsb.maxAbs },
  maxAngleRmsLsb: { max: true, value: (s) => s.angleLsb.rms },
  maxMagnitudeErrorLsb: { max: true, value: (s) => s.magnitudeLsb.maxAbs },
  maxMagnitudeErrorPpm: { max: true, value: (s) => s.magnitudePpm.maxAbs },
  maxModelMismatches: { max: true, value: (s) => s.mismatches.count },
  maxLinkErrors: { max: true, value: (_s, c) => c.checkFailures ?? null },
  minPlaneCoveragePct: { max: false, value: (s) => s.coverage.cells.share * 100 },
};
