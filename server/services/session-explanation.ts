// Explaining a stored session on the server: its packed samples are decoded and searched with the
// shared explain() under the core's own model configuration, so a saved explanation is always the
// server's own result, never a client's. Also: which configuration deviation, if any, an engineer
// may apply to the core in one step.
import { explain, ExplainInputError, type Explanation } from '../../shared/explain';
import { parseModelConfig, type ModelConfig } from '../../shared/numeric';
import type { BenchSession, Core, SessionExplanation } from '../db/models';
import { HttpError } from '../http-error';
import { decodeSamples } from './session-scoring';
import { modeOf, rotationConfigOf } from './core-mode';

/**
 * The explanation of `session`'s answers under `core`'s model configuration.
 * @throws HttpError 400 `no_samples` for a session that holds no answers, `bad_samples` for
 * answers the core's configuration cannot take.
 */
export function explainStoredSession(session: Pick<BenchSession, 'id' | 'samples'>, core: Pick<Core, 'mode' | 'slug' | 'modelConfig' | 'vectorConfig'>): Explanation {
  // The defect search runs the rotation model's faults; vectoring cores have no catalogue yet.
  if (modeOf(core) === 'vectoring') throw new HttpError(422, 'not_available', `Explanations are not available for vectoring cores yet (core ${core.slug})`);
  const declared = rotationConfigOf(core, 'explaining a session');
  const samples = decodeSamples(session.samples, declared.angleFormat);
  if (samples.codes.length === 0) throw new HttpError(400, 'no_samples', `Session ${session.id} holds no answers to explain`);
  try {
    return explain(declared, { angle: samples.codes, cos: samples.cos, sin: samples.sin });
  } catch (err) {
    // A code outside the core's range: the core's formats changed since the session was stored.
    if (err instanceof ExplainInputError) throw new HttpError(400, 'bad_samples', `samples: ${err.message}`);
    throw err;
  }
}

const sameConfig = (a: ModelConfig, b: ModelConfig) => JSON.stringify(parseModelConfig(a)) === JSON.stringify(parseModelConfig(b));

/**
 * The configuration an engineer may apply to the core: the best hypothesis's, when it is a pure
 * configuration deviation (no defect) that reproduces every answer. Null otherwise.
 */
export function applicableConfig(e: Explanation): ModelConfig | null {
  const best = e.hypotheses[0];
  if (!best || best.fault !== null || e.answered === 0 || best.exact !== e.answered) return null;
  return sameConfig(best.config, e.declared) ? null : best.config;
}

/** Whether the core's model configuration is still the one the explanation was computed under. */
export function coreStillDeclared(core: Pick<Core, 'modelConfig'>, e: Explanation): boolean {
  return core.modelConfig !== null && sameConfig(parseModelConfig(core.modelConfig), e.declared);
}

const person = (u: { id: number; name: string } | null | undefined) => (u ? { id: u.id, name: u.name } : null);

/** The API's shape of a stored explanation (docs/api.md). */
export function explanationReply(row: SessionExplanation) {
  const explanation = row.explanation as unknown as Explanation;
  return {
    sessionId: row.sessionId,
    savedAt: row.updatedAt,
    savedBy: person(row.savedBy),
    decision: row.decision ? { choice: row.decision, by: person(row.decidedBy), at: row.decidedAt } : null,
    applicableConfig: row.decision ? null : applicableConfig(explanation),
    explanation,
  };
}
