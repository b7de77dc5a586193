import type { VectorConfig, VectorScoreSummary } from '../../../../shared/vectoring';

/** Messages to the vectoring scoring worker. */
export type VectorScoreRequest =
  | { type: 'init'; config: VectorConfig }
  /** Answers with their exact request indexes (any order, gaps allowed). */
  | { type: 'batch'; indexes: Uint32Array; xs: Int32Array; ys: Int32Array; angle: Int32Array; magnitude: Int32Array }
  | { type: 'summary' };

/** Messages from it. Errors are in output LSB (angle error NaN for the zero vector). `final` answers a 'summary' request. */
export type VectorScoreReply =
  | { type: 'scored'; xs: Int32Array; ys: Int32Array; angleErr: Float32Array; magErr: Float32Array }
  | { type: 'summary'; summary: VectorScoreSummary; final: boolean }
  | { type: 'error'; message: string };
