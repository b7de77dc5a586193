import request from 'supertest';
import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { loadConfig } from '../../server/config';
import { openDatabase } from '../../server/db/connection';
import { migrate } from '../../server/db/migrator';
import { BenchSession, Board, Build, Core, GoldenVectorSet, Review, SessionConditions, User } from '../../server/db/models';
import { conditionGrid } from '../../server/services/condition-grid';
import { unpackSamples } from '../../shared/link-engine/sample-pack';
import { ScoreAccumulator } from '../../shared/numeric/score';
import { unpackVectorSamples } from '../../shared/link-engine/vector-sample-pack';
import { VectorScoreAccumulator } from '../../shared/vectoring';
import { demoAccountsPresent, seedIfEmpty } from '../../server/db/seed';
import { modelConfigSchema } from '../../server/schemas/core';
import { tempDatabase } from '../support/temp-db';

const tmp = await tempDatabase();
const columns = (s: BenchSession) => {
  const u = unpackSamples(s.samples, 'turn');
  return [u.codes, u.cos, u.sin] as const;
};
let db: Sequelize;
let seeded: boolean;
// Seeded once for the whole file, so each test reads the same demo data in any order.
beforeAll(async () => {
  db = openDatabase(tmp.url);
  await migrate(db);
  seeded = await seedIfEmpty(db, 'demo-password', 4);
});
afterAll(async () => {
  await db.close();
  await tmp.cleanup();
});

describe('the demo seed', () => {
  it('fills an empty database once, with one account per role and the default reference core', async () => {
    expect(seeded).toBe(true);
    expect(await seedIfEmpty(db, 'demo-password', 4)).toBe(false);
    expect((await User.findAll()).map((u) => `${u.email} ${u.role}`).sort()).toEqual([
      'admin@anglebench.test admin',
      'engineer@anglebench.test engineer',
      'reviewer@anglebench.test reviewer',
    ]);
    const reference = await Core.findOne({ where: { slug: 'reference-16' } });
    expect(reference!.modelConfig).toEqual(modelConfigSchema.parse({}));
    expect((await Core.findAll({ order: [['id', 'ASC']] })).map((c) => `${c.slug} ${c.mode}`)).toEqual(['reference-16 rotation', 'mixer-nco-18 rotation', 'phase-detector-16 vectoring']);
    expect(await Board.count()).toBe(3);
    expect(await Build.count()).toBe(6);
    expect((await Review.findAll()).map((r) => r.decision)).toEqual(['approve']);
    expect(await demoAccountsPresent(db)).toHaveLength(3);
  });

  it('holds a dozen scored sessions from the model and the board’s faults: one regression, a passing baseline per core', async () => {
    // The thermal sweep's soaks and the vectoring core's sessions are checked on their own below.
    const vectoring = await Core.findOne({ where: { slug: 'phase-detector-16' } });
    const sessions = (await BenchSession.findAll({ order: [['startedAt', 'ASC']] })).filter((s) => !s.tags.includes('soak') && s.coreId !== vectoring!.id);
    expect(sessions).toHaveLength(12);
    const regressions = sessions.filter((s) => s.regression);
    expect(regressions).toHaveLength(1);
    const [regression] = regressions;
    const build = await Build.findByPk(regression.buildId!);
    expect(build?.label).toBe('ref16-r3');
    expect(regression.passed).toBe(false);
    for (const core of await Core.findAll({ where: { mode: 'rotation' } })) {
      const baseline = sessions.find((s) => s.id === core.baselineSessionId);
      expect(baseline?.passed).toBe(true);
      expect(baseline!.startedAt.getTime()).toBeLessThan(Date.now());
    }
    const reference = await Core.findOne({ where: { slug: 'reference-16' } });
    // The regression fails a limit the baseline met: both judged by the server's scoring of the
    // stored samples, recomputed here with the shared accumulator.
    const stats = new ScoreAccumulator(reference!.modelConfig!).add(...columns(regression)).summary();
    expect(regression.stats).toEqual(JSON.parse(JSON.stringify(stats)));
    expect((regression.verdict as Record<string, { pass: boolean }>).maxModelMismatches.pass).toBe(false);
    expect(stats.mismatches.count).toBeGreaterThan(0);
    expect(sessions.filter((s) => !s.passed).length).toBe(3);
    expect(sessions.filter((s) => s.archive).length).toBeGreaterThan(0);
    const golden = await GoldenVectorSet.findAll({ where: { coreId: reference!.id } });
    expect(golden).toHaveLength(1);
    const codes = unpackSamples(golden[0].codes, 'turn');
    expect(new ScoreAccumulator(reference!.modelConfig!).add(codes.codes, codes.cos, codes.sin).summary().mismatches.count).toBe(0);
    const approved = await Review.findOne({ where: { decision: 'approve' } });
    expect(sessions.find((s) => s.id === reference!.baselineSessionId)?.buildId).toBe(approved?.buildId);
  });

  it('holds a thermal sweep of soaks on ref16-r2 that passes at 25 and 55 °C and is unstable at 85 °C on the lowest supply', async () => {
    const build = await Build.findOne({ where: { label: 'ref16-r2' } });
    const grid = await conditionGrid({ buildId: build!.id, x: 'temperature_c', y: 'vccint_v' });
    expect(grid.xs).toEqual([25, 55, 85]);
    expect(grid.ys).toEqual([0.9, 0.95, 1.0]);
    const verdicts = Object.fromEntries(grid.cells.map((c) => [`${c.x}/${c.y}`, c.verdict]));
    expect(verdicts).toEqual({
      '25/0.9': 'pass', '55/0.9': 'pass', '85/0.9': 'unstable',
      '25/0.95': 'pass', '55/0.95': 'pass', '85/0.95': 'pass',
      '25/1': 'pass', '55/1': 'pass', '85/1': 'pass',
    });
    const hot = grid.sessions.find((s) => s.x === 85 && s.y === 0.9)!;
    expect(hot.unstableCodes).toBeGreaterThan(5);
    const row = await SessionConditions.findOne({ where: { sessionId: hot.id } });
    expect(row!.soak!.unstable.codes.every((u) => u.answers.length >= 2)).toBe(true);
    expect(row!.soak!.summary.passes).toBe(5);
  });

  it('holds a vectoring phase detector: a build without gain compensation that fails, a passing baseline, golden vectors', async () => {
    const core = await Core.findOne({ where: { slug: 'phase-detector-16' } });
    expect(core!.modelConfig).toBeNull();
    const sessions = await BenchSession.findAll({ where: { coreId: core!.id }, order: [['startedAt', 'ASC']] });
    expect(sessions.map((s) => s.passed)).toEqual([false, true, true]);
    expect(sessions.some((s) => s.regression)).toBe(false);
    expect(core!.baselineSessionId).toBe(sessions[1].id);
    // The server's stored score is the shared vectoring scorer's over the stored answers.
    for (const s of sessions) {
      const v = unpackVectorSamples(s.samples);
      const stats = new VectorScoreAccumulator(core!.vectorConfig!).add(v.xs, v.ys, v.angles, v.magnitudes).summary();
      expect(s.stats).toEqual(JSON.parse(JSON.stringify({ count: stats.count, vectoring: stats })));
    }
    // Without the compensating multiply every magnitude but the zero vector's carries the CORDIC growth (about 1.65).
    const defect = sessions[0].stats.vectoring!;
    expect(defect.mismatches.count).toBe(defect.count - 1);
    expect(sessions[0].verdict.maxMagnitudeErrorLsb?.pass).toBe(false);
    expect(sessions[0].verdict.maxAngleErrorLsb?.pass).toBe(true);
    const [golden] = await GoldenVectorSet.findAll({ where: { coreId: core!.id } });
    const g = unpackVectorSamples(golden.codes);
    expect(new VectorScoreAccumulator(core!.vectorConfig!).add(g.xs, g.ys, g.angles, g.magnitudes).summary().mismatches.count).toBe(0);
  });

  it('lets the demo accounts sign in with the demo password', async () => {
    const config = loadConfig({ NODE_ENV: 'test', DATABASE_URL: tmp.url, SESSION_SECRET: 'x'.repeat(32) }, `${tmp.dir}/secret`);
    const agent = request.agent(createApp({ config, db, bcryptCost: 4 }));
    const csrf = (await agent.get('/api/auth/csrf').expect(200)).body.token as string;
    const res = await agent.post('/api/auth/login').set('x-csrf-token', csrf).send({ email: 'reviewer@anglebench.test', password: 'demo-password' }).expect(200);
    expect(res.body.user.role).toBe('reviewer');
  });
});
