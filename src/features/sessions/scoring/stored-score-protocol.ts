import type { ModelConfigInput, ScoreSummary } from '../../../../shared/numeric';
import type { StoredChartData } from './plot-builder';

/** The one request: score these packed samples (shared/link-engine/sample-pack.ts) under this model. */
export interface StoredScoreRequest {
  bytes: ArrayBuffer;
  config: ModelConfigInput;
}

export type StoredScoreReply =
  | { type: 'progress'; done: number; total: number }
  | { type: 'done'; summary: ScoreSummary; charts: StoredChartData }
  | { type: 'error'; message: string };
