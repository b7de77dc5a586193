import { Router } from 'express';
import { compareQuery, compareReply, type CompareQuery } from '../../shared/contract/compare';
import type { StoredStats } from '../../shared/contract/sessions';
import { requireRole } from '../auth';
import { BenchSession, Build, Core, SessionEnvelope } from '../db/models';
import { HttpError, notFound } from '../http-error';
import type { CoreMode } from '../../shared/link-engine/limits';
import type { VectorSamples } from '../../shared/link-engine/vector-sample-pack';
import { modeOf, vectorConfigOf } from '../services/core-mode';
import { diffVectorSessions } from '../services/vector-diff';
import { decodeVectorSamples, scoreVectorSamples, vectorEnvelopeFromBounds } from '../services/vector-scoring';
import { validate } from '../middleware/validate';
import { codeBinner, ENVELOPE_BINS, envelopeFromBounds, errorEnvelope, type EnvelopeBounds } from '../services/error-envelope';
import { diffPacked, diffSessions } from '../services/session-diff';
import { decodeSamples, type DecodedSamples } from '../services/session-scoring';
import type { RouteDeps } from './deps';
import { queryOf } from './params';
import { reply } from './reply';

const NO_VECTOR_FIGURES = { angleMaxAbsLsb: null, angleRmsLsb: null, angleBiasLsb: null, magnitudeMaxAbsLsb: null, magnitudeRmsLsb: null, magnitudeMaxAbsPpm: null };

/** The figures a comparison shows beside each session, read from its stored score. */
function keyStats(s: StoredStats) {
  const v = s.vectoring;
  if (v) {
    return {
      count: v.count,
      maxAbsErrorLsb: null,
      rmsErrorLsb: null,
      cosMaxAbsLsb: null,
      sinMaxAbsLsb: null,
      cosBiasLsb: null,
      sinBiasLsb: null,
      magnitudeMaxAbs: null,
      phaseMaxAbsRad: null,
      modelMismatches: v.mismatches.count,
      coveragePct: v.coverage.cells.share * 100,
      angleMaxAbsLsb: v.angleLsb.maxAbs,
      angleRmsLsb: v.angleLsb.rms,
      angleBiasLsb: v.angleLsb.mean,
      magnitudeMaxAbsLsb: v.magnitudeLsb.maxAbs,
      magnitudeRmsLsb: v.magnitudeLsb.rms,
      magnitudeMaxAbsPpm: v.magnitudePpm.maxAbs,
    };
  }
  return {
    ...NO_VECTOR_FIGURES,
    count: s.count ?? null,
    maxAbsErrorLsb: s.overall?.maxAbsLsb ?? null,
    rmsErrorLsb: s.overall?.rmsLsb ?? null,
    cosMaxAbsLsb: s.cos?.maxAbsLsb ?? null,
    sinMaxAbsLsb: s.sin?.maxAbsLsb ?? null,
    cosBiasLsb: s.cos?.meanLsb ?? null,
    sinBiasLsb: s.sin?.meanLsb ?? null,
    magnitudeMaxAbs: s.magnitude?.maxAbs ?? null,
    phaseMaxAbsRad: s.phase?.maxAbsRad ?? null,
    modelMismatches: s.mismatches?.count ?? null,
    coveragePct: s.coverage?.share === undefined ? null : s.coverage.share * 100,
  };
}

const EMPTY: DecodedSamples = { codes: new Float64Array(0), cos: new Int32Array(0), sin: new Int32Array(0) };

/** The stored error histogram, cos and sin counts added together (null when the score has none). */
function histogramOf(stats: StoredStats) {
  const v = stats.vectoring?.histogram;
  if (v) return { binsPerLsb: v.binsPerLsb, edgesLsb: v.edgesLsb, counts: v.angle.map((c, i) => c + (v.magnitude[i] ?? 0)), below: v.below, above: v.above };
  const h = stats.histogram;
  if (!h) return null;
  return { binsPerLsb: h.binsPerLsb, edgesLsb: h.edgesLsb, counts: h.cos.map((c, i) => c + (h.sin[i] ?? 0)), below: h.below, above: h.above };
}

type Kept = Map<number, EnvelopeBounds>;
type CoresById = Map<number, Core>;

/** Rotation sessions: the envelope from the codes' bins, pairs diffed code by code. */
function rotationPairs(sessions: BenchSession[], cores: CoresById, kept: Kept) {
  const modelOf = (s: BenchSession) => (cores.get(s.coreId)?.modelConfig ?? {}) as { angleFormat?: 'turn' | 'rad' };
  // The diff's bins and angles are those of the first session's core.
  const binner = codeBinner(modelOf(sessions[0]));
  return {
    // The envelope kept at intake; a session stored without one (older rows) is scored here.
    envelopeOf: (s: BenchSession) => {
      const bounds = kept.get(s.id);
      return bounds ? envelopeFromBounds(modelOf(s), bounds) : errorEnvelope(modelOf(s), decodeSamples(s.samples, modelOf(s).angleFormat ?? 'turn'));
    },
    // Codes of another core stand for other angles and values: such a pair is not diffed.
    pairs: (_core0: Core | null) =>
      sessions.slice(1).map((s) => {
        if (s.coreId !== sessions[0].coreId) return { a: sessions[0].id, b: s.id, sameCore: false, ...diffSessions(EMPTY, EMPTY, undefined, binner), firstDiffering: [], vector: null };
        const diff = diffPacked(sessions[0].samples, s.samples, modelOf(sessions[0]).angleFormat ?? 'turn', undefined, binner);
        const firstDiffering = diff.firstDiffering.map((d) => ({ ...d, degrees: binner.degreesOf(d.code) }));
        return { a: sessions[0].id, b: s.id, sameCore: true, ...diff, firstDiffering, vector: null };
      }),
  };
}

/** Vectoring sessions: the envelope of the angle error by direction, pairs diffed vector by vector. */
function vectorPairs(sessions: BenchSession[], cores: CoresById, kept: Kept) {
  const decoded = new Map<number, VectorSamples>();
  const samplesOf = (s: BenchSession) => decoded.get(s.id) ?? decoded.set(s.id, decodeVectorSamples(s.samples)).get(s.id)!;
  return {
    envelopeOf: (s: BenchSession) => {
      const bounds = kept.get(s.id);
      const core = cores.get(s.coreId);
      if (bounds) return vectorEnvelopeFromBounds(bounds);
      // Without its core there is no configuration to score against: an empty envelope.
      if (!core) return vectorEnvelopeFromBounds({ lo: new Array(ENVELOPE_BINS).fill(null), hi: new Array(ENVELOPE_BINS).fill(null) });
      return vectorEnvelopeFromBounds(scoreVectorSamples(vectorConfigOf(core), samplesOf(s)).envelope);
    },
    pairs: (core0: Core | null) =>
      sessions.slice(1).map((s) => {
        const empty = { differing: new Array<number>(ENVELOPE_BINS).fill(0), maxAbsDiffLsb: new Array<number>(ENVELOPE_BINS).fill(0) };
        if (s.coreId !== sessions[0].coreId || !core0) return { a: sessions[0].id, b: s.id, sameCore: false, common: 0, differing: 0, maxAbsDiffLsb: 0, firstDiffering: [], byBin: empty, vector: null };
        const { firstDiffering, maxAbsAngleDiffLsb, maxAbsMagnitudeDiffLsb, ...diff } = diffVectorSessions(vectorConfigOf(core0), samplesOf(sessions[0]), samplesOf(s), ENVELOPE_BINS);
        return { a: sessions[0].id, b: s.id, sameCore: true, ...diff, firstDiffering: [], vector: { maxAbsAngleDiffLsb, maxAbsMagnitudeDiffLsb, firstDiffering } };
      }),
  };
}

/**
 * /api/compare: sessions side by side, the first against each other of its core bit for bit.
 * All of one mode: rotation sessions by angle code, vectoring sessions by (x, y) vector.
 */
export function compareRouter(_deps: RouteDeps) {
  const router = Router();

  router.get('/', requireRole('reviewer'), validate({ query: compareQuery }), async (req, res) => {
    const { ids } = queryOf<CompareQuery>(req);
    const rows = await BenchSession.findAll({ where: { id: ids }, attributes: { exclude: ['archive'] } });
    const byId = new Map(rows.map((r) => [r.id, r]));
    const missing = ids.find((i) => !byId.has(i));
    if (missing !== undefined) throw notFound(`Session ${missing}`);
    const sessions = ids.map((i) => byId.get(i) as BenchSession);

    const cores = new Map((await Core.findAll({ where: { id: [...new Set(sessions.map((s) => s.coreId))] } })).map((c) => [c.id, c]));
    const buildIds = [...new Set(sessions.map((s) => s.buildId).filter((b): b is number => b !== null))];
    const builds = new Map((buildIds.length ? await Build.findAll({ where: { id: buildIds } }) : []).map((b) => [b.id, b]));

    // Sessions of a vectoring and of a rotation core measure different things: refused, not half-compared.
    const modeOfSession = (s: BenchSession): CoreMode => {
      const core = cores.get(s.coreId);
      return core ? modeOf(core) : s.stats.vectoring ? 'vectoring' : 'rotation';
    };
    const mode = modeOfSession(sessions[0]);
    const other = sessions.find((s) => modeOfSession(s) !== mode);
    if (other) {
      throw new HttpError(400, 'mixed_modes', `ids: session ${sessions[0].id} is of a ${mode} core and session ${other.id} of a ${modeOfSession(other)} core: sessions of vectoring and rotation cores cannot be compared`);
    }
    const kept = new Map((await SessionEnvelope.findAll({ where: { sessionId: ids } })).map((e) => [e.sessionId, e.bounds]));
    const core0 = cores.get(sessions[0].coreId);
    const pairs = mode === 'vectoring' ? vectorPairs(sessions, cores, kept) : rotationPairs(sessions, cores, kept);

    reply(res, compareReply, {
      sessions: sessions.map((s) => {
        const core = cores.get(s.coreId);
        const build = s.buildId !== null ? builds.get(s.buildId) : undefined;
        return {
          id: s.id,
          mode,
          core: core ? { id: core.id, name: core.name, slug: core.slug } : { id: s.coreId },
          build: build ? { id: build.id, label: build.label } : null,
          startedAt: s.startedAt,
          sampleCount: s.sampleCount,
          passed: s.passed,
          regression: s.regression,
          verdict: s.verdict,
          stats: keyStats(s.stats),
          histogram: histogramOf(s.stats),
          errorEnvelope: pairs.envelopeOf(s),
        };
      }),
      pairs: pairs.pairs(core0 ?? null),
    });
  });

  return router;
}
