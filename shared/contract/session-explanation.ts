// The session explanation API: what /api/sessions/:sessionId/explanation accepts and answers.
import { z } from 'zod';
import type { AnyExplanation } from '../explain';
import { modelConfigSchema } from '../numeric/model-config';
import { vectorConfigSchema } from '../vectoring/vector-config';
import { id, isoDate, named, typedObject } from './common';
import { coreRecord } from './cores';

export const explanationParams = z.strictObject({ sessionId: id });

/** POST …/explanation/decision: apply the configuration deviation to the core, or keep the core as declared. */
export const explanationDecisionBody = z.strictObject({ decision: z.enum(['apply', 'keep']) });
export type ExplanationDecisionBody = z.infer<typeof explanationDecisionBody>;

/**
 * GET and POST /api/sessions/:sessionId/explanation: the saved explanation, the server's own
 * search result, who saved it and any decision on it.
 */
export const explanationReply = z.object({
  sessionId: z.number().int(),
  savedAt: isoDate,
  savedBy: named.nullable(),
  decision: z.object({ choice: z.enum(['applied', 'kept']), by: named.nullable(), at: isoDate }).nullable(),
  /**
   * The configuration an engineer may still apply to the core, else null: a rotation model
   * configuration, or a vectoring one when the explanation's `mode` is `vectoring`.
   */
  applicableConfig: z.union([modelConfigSchema, vectorConfigSchema]).nullable(),
  /** A rotation explanation (no `mode`) or a vectoring one (`mode: 'vectoring'`), shared/explain's shape. */
  explanation: typedObject<AnyExplanation>('explanation'),
});
export type StoredExplanation = z.infer<typeof explanationReply>;
/** POST …/explanation/decision: the explanation with the decision, and the core as it now is. */
export const explanationDecisionReply = explanationReply.extend({ core: coreRecord });
