// The session explanation API: what /api/sessions/:sessionId/explanation accepts.
import { z } from 'zod';
import { id } from './common';

export const explanationParams = z.strictObject({ sessionId: id });

/** POST …/explanation/decision: apply the configuration deviation to the core, or keep the core as declared. */
export const explanationDecisionBody = z.strictObject({ decision: z.enum(['apply', 'keep']) });
export type ExplanationDecisionBody = z.infer<typeof explanationDecisionBody>;
