import type { ModelConfig, ModelConfigInput, ScoreSummary } from '../../../../shared/numeric';

/** Messages to the scoring worker. */
export type ScoreWorkerRequest =
  | { type: 'init'; config: ModelConfigInput | ModelConfig }
  | { type: 'batch'; firstIndex: number; codes: Float64Array; cos: Int32Array; sin: Int32Array }
  | { type: 'summary' };

/** Messages from it. Errors are in output LSB. */
export type ScoreWorkerReply =
  | { type: 'scored'; codes: Float64Array; cos: Int32Array; sin: Int32Array; errCos: Float32Array; errSin: Float32Array }
  | { type: 'summary'; summary: ScoreSummary }
  | { type: 'error'; message: string };
