import { Router } from 'express';
import { z } from 'zod';
import { requireRole } from '../auth';
import { BenchSession, Build, Core } from '../db/models';
import { notFound } from '../http-error';
import { validate } from '../middleware/validate';
import { diffSessions } from '../services/session-diff';
import { decodeSamples, type DecodedSamples } from '../services/session-scoring';
import type { RouteDeps } from './deps';
import { queryOf } from './params';

const compareQuery = z.strictObject({
  ids: z
    .string()
    .regex(/^\d+(,\d+)*$/, 'a comma-separated list of session ids')
    .transform((s) => s.split(',').map(Number))
    .pipe(z.array(z.number().int().positive()).min(2, 'at least 2 session ids').max(6, 'at most 6 session ids'))
    .refine((ids) => new Set(ids).size === ids.length, 'each session at most once'),
});
type CompareQuery = z.infer<typeof compareQuery>;

interface StoredStats {
  count?: number;
  overall?: { maxAbsLsb?: number; rmsLsb?: number };
  cos?: { meanLsb?: number };
  sin?: { meanLsb?: number };
  mismatches?: { count?: number };
  coverage?: { share?: number };
}

/** The figures a comparison shows beside each session, read from its stored score. */
function keyStats(stats: unknown) {
  const s = (stats ?? {}) as StoredStats;
  return {
    count: s.count ?? null,
    maxAbsErrorLsb: s.overall?.maxAbsLsb ?? null,
    rmsErrorLsb: s.overall?.rmsLsb ?? null,
    cosBiasLsb: s.cos?.meanLsb ?? null,
    sinBiasLsb: s.sin?.meanLsb ?? null,
    modelMismatches: s.mismatches?.count ?? null,
    coveragePct: s.coverage?.share === undefined ? null : s.coverage.share * 100,
  };
}

/** /api/compare: sessions side by side, the first against each other bit for bit. */
export function compareRouter(_deps: RouteDeps) {
  const router = Router();

  router.get('/', requireRole('reviewer'), validate({ query: compareQuery }), async (req, res) => {
    const { ids } = queryOf<CompareQuery>(req);
    const rows = await BenchSession.findAll({ where: { id: ids } });
    const byId = new Map(rows.map((r) => [r.id, r]));
    const missing = ids.find((i) => !byId.has(i));
    if (missing !== undefined) throw notFound(`Session ${missing}`);
    const sessions = ids.map((i) => byId.get(i) as BenchSession);

    const cores = new Map((await Core.findAll({ where: { id: [...new Set(sessions.map((s) => s.coreId))] } })).map((c) => [c.id, c]));
    const buildIds = [...new Set(sessions.map((s) => s.buildId).filter((b): b is number => b !== null))];
    const builds = new Map((buildIds.length ? await Build.findAll({ where: { id: buildIds } }) : []).map((b) => [b.id, b]));

    const decoded: DecodedSamples[] = sessions.map((s) => {
      const model = (cores.get(s.coreId)?.modelConfig ?? {}) as { angleFormat?: 'turn' | 'rad' };
      return decodeSamples(s.samples, model.angleFormat ?? 'turn');
    });

    res.json({
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
        };
      }),
      pairs: sessions.slice(1).map((s, k) => ({ a: sessions[0].id, b: s.id, ...diffSessions(decoded[0], decoded[k + 1]) })),
    });
  });

  return router;
}
