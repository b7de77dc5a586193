import type { VectorCharts } from '../../../components/charts/vector-plot-data';
import type { VectorConfig, VectorScoreSummary } from '../../../../shared/vectoring';

/** The one request: score these packed vectoring samples (shared/link-engine/vector-sample-pack.ts) under this configuration. */
export interface VectorStoredScoreRequest {
  bytes: ArrayBuffer;
  config: VectorConfig;
}

export type VectorStoredScoreReply =
  | { type: 'progress'; done: number; total: number }
  | { type: 'done'; summary: VectorScoreSummary; charts: VectorCharts }
  | { type: 'error'; message: string };
