// Explaining a stored session on the server: its packed samples are decoded and searched with the
// shared explain() under the core's own model configuration, so a saved explanation is always the
// server's own result, never a client's. Also: which configuration deviation, if any, an engineer
// may apply to the core in one step.
import { explain, explainVectors, ExplainInputError, type AnyExplanation } from '../../shared/explain';
import { parseModelConfig, type ModelConfig } from '../../shared/numeric';
import { parseVectorConfig, type VectorConfig } from '../../shared/vectoring';
import type { BenchSession, Core, SessionExplanation } from '../db/models';
import { HttpError } from '../http-error';
import { decodeSamples } from './session-scoring';
import { decodeVectorSamples } from './vector-scoring';
import { modeOf, rotationConfigOf, vectorConfigOf } from './core-mode';

type CoreConfigs = Pick<Core, 'mode' | 'slug' | 'modelConfig' | 'vectorConfig'>;

/**
 * The explanation of `session`'s answers under `core`'s configuration: the rotation search for a
 * rotating core, the vectoring search (its samples in the vectoring record layout) for a vectoring one.
 * @throws HttpError 400 `no_samples` for a session that holds no answers, `bad_samples` for
 * answers the core's configuration cannot take.
 */
export function explainStoredSession(session: Pick<BenchSession, 'id' | 'samples'>, core: CoreConfigs): AnyExplanation {
  const none = () => new HttpError(400, 'no_samples', `Session ${session.id} holds no answers to explain`);
  try {
    if (modeOf(core) === 'vectoring') {
      const declared = vectorConfigOf(core, 'explaining a session');
      const s = decodeVectorSamples(session.samples);
      if (s.xs.length === 0) throw none();
      return explainVectors(declared, { x: s.xs, y: s.ys, angle: s.angles, magnitude: s.magnitudes });
    }
    const declared = rotationConfigOf(core, 'explaining a session');
    const samples = decodeSamples(session.samples, declared.angleFormat);
    if (samples.codes.length === 0) throw none();
    return explain(declared, { angle: samples.codes, cos: samples.cos, sin: samples.sin });
  } catch (err) {
    // A code outside the core's range: the core's formats changed since the session was stored.
    if (err instanceof ExplainInputError) throw new HttpError(400, 'bad_samples', `samples: ${err.message}`);
    throw err;
  }
}

const isVectoring = (e: AnyExplanation): e is Extract<AnyExplanation, { mode: 'vectoring' }> => e.mode === 'vectoring';
const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

/** The explanation's declared configuration and a candidate one, both read through their mode's schema. */
function sameConfig(e: AnyExplanation, a: unknown, b: unknown): boolean {
  return isVectoring(e) ? same(parseVectorConfig(a), parseVectorConfig(b)) : same(parseModelConfig(a as ModelConfig), parseModelConfig(b as ModelConfig));
}

/**
 * The configuration an engineer may apply to the core: the best hypothesis's, when it is a pure
 * configuration deviation (no defect) that reproduces every answer. Null otherwise. A vectoring
 * explanation's is a vectoring configuration (the core's `vectorConfig`).
 */
export function applicableConfig(e: AnyExplanation): ModelConfig | VectorConfig | null {
  const best = e.hypotheses[0];
  if (!best || best.fault !== null || e.answered === 0 || best.exact !== e.answered) return null;
  return sameConfig(e, best.config, e.declared) ? null : best.config;
}

/** Whether the core's configuration of the explanation's mode is still the one the explanation was computed under. */
export function coreStillDeclared(core: Pick<Core, 'modelConfig' | 'vectorConfig'>, e: AnyExplanation): boolean {
  const current = isVectoring(e) ? core.vectorConfig : core.modelConfig;
  return current !== null && current !== undefined && sameConfig(e, current, e.declared);
}

/** The core's key an applied configuration goes to: `vectorConfig` for a vectoring explanation, else `modelConfig`. */
export const configKeyOf = (e: AnyExplanation): 'modelConfig' | 'vectorConfig' => (isVectoring(e) ? 'vectorConfig' : 'modelConfig');

const person = (u: { id: number; name: string } | null | undefined) => (u ? { id: u.id, name: u.name } : null);

/** The API's shape of a stored explanation (explanationReply in shared/contract, docs/api.md). */
export function storedExplanation(row: SessionExplanation) {
  const explanation = row.explanation as unknown as AnyExplanation;
  return {
    sessionId: row.sessionId,
    savedAt: row.updatedAt,
    savedBy: person(row.savedBy),
    // decision, decidedById and decidedAt are written together (the decision route's one update).
    decision: row.decision ? { choice: row.decision, by: person(row.decidedBy), at: row.decidedAt! } : null,
    applicableConfig: row.decision ? null : applicableConfig(explanation),
    explanation,
  };
}
