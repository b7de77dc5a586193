import type { Explanation, HypothesisRef } from '../../../../shared/explain';
import type { ModelConfig } from '../../../../shared/numeric';
import type { DiffCurves } from './diff-curves';

/**
 * Packed samples (shared/link-engine/sample-pack.ts) and the core's declared configuration. With
 * no `hypothesis` the worker searches for one; with one (a saved explanation's best), it only
 * draws the differences.
 */
export interface ExplainRequest {
  bytes: ArrayBuffer;
  declared: ModelConfig;
  hypothesis: HypothesisRef | null;
}

export type ExplainReply =
  | { type: 'progress'; done: number; total: number }
  | { type: 'done'; explanation: Explanation | null; curves: DiffCurves; elapsedMs: number }
  | { type: 'error'; message: string };
