import { Router } from 'express';
import { compareQuery, compareReply, type CompareQuery } from '../../shared/contract/compare';
import type { StoredStats } from '../../shared/contract/sessions';
import { requireRole } from '../auth';
import { BenchSession, Build, Core, SessionEnvelope } from '../db/models';
import { notFound } from '../http-error';
import { validate } from '../middleware/validate';
import { codeBinner, envelopeFromBounds, errorEnvelope } from '../services/error-envelope';
import { diffPacked, diffSessions } from '../services/session-diff';
import { decodeSamples, type DecodedSamples } from '../services/session-scoring';
import type { RouteDeps } from './deps';
import { queryOf } from './params';
import { reply } from './reply';

/** The figures a comparison shows beside each session, read from its stored score. */
function keyStats(s: StoredStats) {
  return {
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
  const h = stats.histogram;
  if (!h) return null;
  return { binsPerLsb: h.binsPerLsb, edgesLsb: h.edgesLsb, counts: h.cos.map((c, i) => c + (h.sin[i] ?? 0)), below: h.below, above: h.above };
}

/** /api/compare: sessions side by side, the first against each other of its core bit for bit. */
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

    const modelOf = (s: BenchSession) => (cores.get(s.coreId)?.modelConfig ?? {}) as { angleFormat?: 'turn' | 'rad' };
    // The envelope kept at intake; a session stored without one (the demo, older rows) is scored here.
    const kept = new Map((await SessionEnvelope.findAll({ where: { sessionId: ids } })).map((e) => [e.sessionId, e.bounds]));
    const envelopeOf = (s: BenchSession) => {
      const bounds = kept.get(s.id);
      return bounds ? envelopeFromBounds(modelOf(s), bounds) : errorEnvelope(modelOf(s), decodeSamples(s.samples, modelOf(s).angleFormat ?? 'turn'));
    };
    // The diff's bins and angles are those of the first session's core.
    const binner = codeBinner(modelOf(sessions[0]));

    reply(res, compareReply, {
      sessions: sessions.map((s) => {
        const core = cores.get(s.coreId);
        const build = s.buildId !== null ? builds.get(s.buildId) : undefined;
        return {
          id: s.id,
          core: core ? { id: core.id, name: core.name, slug: core.slug } : { id: s.coreId },
          build: build ? { id: build.id, label: build.label } : null,
          startedAt: s.startedAt,
          sampleCount: s.sampleCount,
          passed: s.passed,
          regression: s.regression,
          verdict: s.verdict,
          stats: keyStats(s.stats),
          histogram: histogramOf(s.stats),
          errorEnvelope: envelopeOf(s),
        };
      }),
      // Codes of another core stand for other angles and values: such a pair is not diffed.
      pairs: sessions.slice(1).map((s) => {
        if (s.coreId !== sessions[0].coreId) return { a: sessions[0].id, b: s.id, sameCore: false, ...diffSessions(EMPTY, EMPTY, undefined, binner), firstDiffering: [] };
        const diff = diffPacked(sessions[0].samples, s.samples, modelOf(sessions[0]).angleFormat ?? 'turn', undefined, binner);
        const firstDiffering = diff.firstDiffering.map((d) => ({ ...d, degrees: binner.degreesOf(d.code) }));
        return { a: sessions[0].id, b: s.id, sameCore: true, ...diff, firstDiffering };
      }),
    });
  });

  return router;
}
