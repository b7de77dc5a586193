import type { ModelConfig, ModelConfigInput, ScoreSummary, ToneFigures } from '../../../../shared/numeric';

/** A coherent tone's figures per channel, or why there are none yet. */
export type ToneResult = { cos: ToneFigures; sin: ToneFigures } | { unavailable: string };

/** Messages to the scoring worker. */
export type ScoreWorkerRequest =
  | { type: 'init'; config: ModelConfigInput | ModelConfig; tone: { cycles: number; samples: number } | null }
  /** Results with their exact request indexes (any order, gaps allowed). */
  | { type: 'batch'; indexes: Uint32Array; codes: Float64Array; cos: Int32Array; sin: Int32Array }
  | { type: 'summary' };

/** Messages from it. Errors are in output LSB. `final` marks the summary that answers a 'summary' request. */
export type ScoreWorkerReply =
  | { type: 'scored'; codes: Float64Array; cos: Int32Array; sin: Int32Array; errCos: Float32Array; errSin: Float32Array }
  | { type: 'summary'; summary: ScoreSummary; tone: ToneResult | null; final: boolean }
  | { type: 'error'; message: string };
