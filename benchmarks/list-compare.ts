// list-compare: the sessions table and the compare view against a database holding 100,000
// sessions (seeded straight through the models in one transaction, small samples blobs), called
// as the page calls them (signed-in cookie) — on SQLite and on PostgreSQL in the same run. Beside
// the list: the same SELECT … LIMIT 25 that Sequelize generates, run by that database's bare
// driver (sqlite3 or pg) on the same database. Beside the compare: a bare loop over the two
// sessions' typed arrays.
import { Op, type WhereOptions } from 'sequelize';
import { ScoreAccumulator } from '../shared/numeric';
import { packSamples } from '../shared/link-engine/sample-pack';
import { BenchSession, Board, Build, Core, SessionEnvelope } from '../server/db/models';
import { modelConfigSchema } from '../server/schemas/core';
import { BENCH_DIALECTS, bareDriver, type BenchDialect } from './bare-driver';
import type { BenchResult } from './report';
import { decodeSamples, scoreSamples } from '../server/services/session-scoring';
import type { StoredStats } from '../shared/contract/sessions';
import { BIG_CORE_CONFIG, bigExhaustiveSamples, startBenchServer, type BenchServer } from './server-fixture';
import { median, quantile, timeMs } from './timing';

const SESSIONS = 100_000;
const SEED_BATCH = 500;
const LIST_CALLS = 200;
const COMPARE_RUNS = 5;
const DAY_MS = 86_400_000;
const EPOCH = Date.UTC(2026, 0, 1);

/** Deterministic pseudo-random numbers (a 32-bit LCG, Numerical Recipes constants). */
function lcg(seed: number) {
  let s = seed >>> 0;
  return (n: number) => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s % n;
  };
}

interface Seeded {
  coreIds: number[];
  buildIds: number[];
  boardIds: number[];
  operatorIds: number[];
}

export async function seed(server: BenchServer): Promise<Seeded> {
  const { t } = server;
  const config = modelConfigSchema.parse({});
  const rnd = lcg(7);
  // One real score of 64 results, so each row's stats JSON is the size a stored session's is.
  const codes = Array.from({ length: 64 }, (_, i) => i * 1024);
  const score = new ScoreAccumulator(config);
  const model = score.model;
  const cos = codes.map((c) => model.evaluate(c).cos);
  const sin = codes.map((c) => model.evaluate(c).sin);
  const stats = score.add(codes, cos, sin).summary() as unknown as Record<string, unknown>;
  const samples = Buffer.from(packSamples(codes, cos, sin, new Uint8Array(64).fill(1)));
  return t.db.transaction(async (transaction) => {
    const cores = await Core.bulkCreate(
      Array.from({ length: 4 }, (_, i) => ({ name: `Seeded core ${i}`, slug: `seeded-${i}`, linkProfile: {}, modelConfig: config, limits: { maxAbsErrorLsb: 4 }, baselineSessionId: null })),
      { transaction },
    );
    const builds = await Build.bulkCreate(
      cores.flatMap((c) => Array.from({ length: 5 }, (_, i) => ({ coreId: c.id, label: `b${i}`, sourceRevision: `r${i}`, toolVersion: 'v1', clockMHz: 100, notes: '' }))),
      { transaction },
    );
    const boards = await Board.bulkCreate(
      Array.from({ length: 5 }, (_, i) => ({ name: `Board ${i}`, serial: `S${i}`, fpgaPart: 'part', adapter: 'usb', location: 'lab' })),
      { transaction },
    );
    const operatorIds = Object.values(t.users).map((u) => u.id);
    // Straight into the table, each JSON written once: model instances and a JSON.stringify of the
    // same statistics per row made seeding take minutes; the rows are the same either way.
    const json = (v: unknown) => JSON.stringify(v);
    const statsJson = json(stats);
    const transportJson = json({ kind: 'websocket', device: 'seeded', baud: 3_000_000 });
    const verdictJson = (pass: boolean) => json({ maxAbsErrorLsb: { limit: 4, measured: 3.3, pass } });
    const tagsJson = json(['seeded']);
    const now = new Date();
    const qi = t.db.getQueryInterface();
    for (let done = 0; done < SESSIONS; done += SEED_BATCH) {
      const rows = Array.from({ length: SEED_BATCH }, () => {
        const build = builds[rnd(builds.length)];
        const passed = rnd(10) > 1;
        return {
          coreId: build.coreId,
          buildId: build.id,
          boardId: boards[rnd(boards.length)].id,
          operatorId: operatorIds[rnd(operatorIds.length)],
          startedAt: new Date(EPOCH + rnd(300) * DAY_MS + rnd(DAY_MS)),
          endedAt: null,
          plan: json({ kind: 'random', seed: rnd(1000), count: 64 }),
          transport: transportJson,
          deviceInfo: null,
          stats: statsJson,
          verdict: verdictJson(passed),
          passed,
          regression: !passed && rnd(4) === 0,
          sampleCount: 64,
          samples,
          archive: null,
          notes: '',
          tags: tagsJson,
          createdAt: now,
          updatedAt: now,
        };
      });
      await qi.bulkInsert('sessions', rows, { transaction });
    }
    return { coreIds: cores.map((c) => c.id), buildIds: builds.map((b) => b.id), boardIds: boards.map((b) => b.id), operatorIds };
  });
}

export type ListFilter = Partial<Record<'coreId' | 'buildId' | 'boardId' | 'operatorId', number>> & { passed?: boolean; from?: Date; to?: Date; sort: '-startedAt' | 'startedAt' | 'id'; page: number };

export function filters(s: Seeded): ListFilter[] {
  const rnd = lcg(11);
  const pick = <T>(xs: T[]) => xs[rnd(xs.length)];
  return Array.from({ length: LIST_CALLS }, (_, i) => {
    const f: ListFilter = { sort: pick(['-startedAt', '-startedAt', 'startedAt', 'id'] as const), page: 1 + rnd(i % 4 === 0 ? 400 : 10) };
    const kind = i % 8;
    if (kind === 1) f.coreId = pick(s.coreIds);
    if (kind === 2) f.buildId = pick(s.buildIds);
    if (kind === 3) Object.assign(f, { boardId: pick(s.boardIds), passed: rnd(2) === 0 });
    if (kind === 4) f.operatorId = pick(s.operatorIds);
    if (kind === 5) f.passed = false;
    if (kind === 6) {
      f.from = new Date(EPOCH + rnd(200) * DAY_MS);
      f.to = new Date(f.from.getTime() + 60 * DAY_MS);
    }
    if (kind === 7) Object.assign(f, { coreId: pick(s.coreIds), passed: true });
    if (f.page > 1 && kind !== 0) f.page = 1 + rnd(4);
    return f;
  });
}

export const queryString = (f: ListFilter) =>
  new URLSearchParams(Object.entries(f).map(([k, v]) => [k, v instanceof Date ? v.toISOString() : String(v)])).toString();

/** The SELECT Sequelize sends for this filter (the route's where, order and page), captured once. */
export async function selectSql(f: ListFilter): Promise<string> {
  const where: Record<string | symbol, unknown> = {};
  for (const key of ['coreId', 'buildId', 'boardId', 'operatorId', 'passed'] as const) if (f[key] !== undefined) where[key] = f[key];
  if (f.from || f.to) where.startedAt = { ...(f.from ? { [Op.gte]: f.from } : {}), ...(f.to ? { [Op.lte]: f.to } : {}) };
  let sql = '';
  const column = f.sort.replace('-', '');
  await BenchSession.findAll({
    where: where as WhereOptions,
    attributes: { exclude: ['samples', 'archive'] },
    // The route's order (server/services/session-listing.ts): ties by id, none when sorted by id.
    order: column === 'id' ? [['id', f.sort.startsWith('-') ? 'DESC' : 'ASC']] : [[column, f.sort.startsWith('-') ? 'DESC' : 'ASC'], ['id', 'DESC']],
    limit: 25,
    offset: (f.page - 1) * 25,
    logging: (text) => (sql = text.replace(/^Execut(?:ing|ed) \([^)]*\): /, '')),
  });
  return sql;
}

export async function listCompareBench(): Promise<BenchResult[]> {
  const big = bigExhaustiveSamples();
  const results: BenchResult[] = [];
  for (const dialect of BENCH_DIALECTS) results.push(...(await listCompareOn(dialect, big)));
  return results;
}

async function listCompareOn(dialect: BenchDialect, big: ReturnType<typeof bigExhaustiveSamples>): Promise<BenchResult[]> {
  const server = await startBenchServer(dialect);
  try {
    const t0 = performance.now();
    const seeded = await seed(server);
    console.log(`  ${dialect}: seeded ${SESSIONS.toLocaleString('en-US')} sessions in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
    const headers = await server.cookieHeaders();

    // --- the list
    const list = filters(seeded);
    const timeList = async () => {
      const ms: number[] = [];
      for (const f of list) {
        let status = 0;
        ms.push(await timeMs(async () => {
          const res = await fetch(`${server.url}/api/sessions?${queryString(f)}`, { headers });
          status = res.status;
          await res.json();
        }));
        if (status !== 200) throw new Error(`GET /api/sessions?${queryString(f)} answered ${status}`);
      }
      return ms;
    };
    // Straight after the bulk load PostgreSQL has no statistics and no visibility map for the new
    // rows, so each page's count scans the whole table. Its autovacuum vacuums and analyses such a
    // load by itself (measured: 60 s after the seed's commit, at the default one-minute naptime);
    // a lab's database lives in that state. Both are printed; the target reads the settled one.
    let freshMs: number[] | null = null;
    if (dialect === 'postgres') {
      freshMs = await timeList();
      await server.t.db.query('VACUUM ANALYZE sessions');
    }
    const listMs = await timeList();
    const sqls = await Promise.all(list.map(selectSql));
    const bare = await bareDriver(server.t.config.databaseUrl, { readOnly: true });
    const bareMs: number[] = [];
    try {
      for (const sql of sqls) bareMs.push(await timeMs(() => bare.query(sql)));
    } finally {
      await bare.close();
    }
    const p50 = quantile(listMs, 0.5);
    const p95 = quantile(listMs, 0.95);
    if (freshMs) console.log(`  ${dialect} list straight after the bulk load (before autovacuum): p50 ${quantile(freshMs, 0.5).toFixed(1)} ms, p95 ${quantile(freshMs, 0.95).toFixed(1)} ms`);
    console.log(`  ${dialect} list: p50 ${p50.toFixed(1)} ms, p95 ${p95.toFixed(1)} ms, max ${Math.max(...listMs).toFixed(1)} ms; bare ${bare.name} SELECT p50 ${quantile(bareMs, 0.5).toFixed(2)} ms, p95 ${quantile(bareMs, 0.95).toFixed(2)} ms`);

    // --- the compare: two 1,048,576-sample sessions; the second answers 1 LSB high on every 97th code
    const cosB = big.cos.slice();
    for (let i = 0; i < cosB.length; i += 97) cosB[i] = Math.min(cosB[i] + 1, 32767);
    const ones = new Uint8Array(big.codes.length).fill(1);
    // Stored as an upload stores them: with the score, and the envelope the compare reads.
    const stored = async (samples: Uint8Array, passed: boolean) => {
      const { stats, profile, envelope } = scoreSamples(BIG_CORE_CONFIG, decodeSamples(samples, 'turn'));
      const session = await BenchSession.create({
        coreId: server.bigCore.id, buildId: null, boardId: null, operatorId: server.t.users.engineer.id, startedAt: new Date(), endedAt: null,
        plan: { kind: 'exhaustive' }, transport: { kind: 'websocket' }, deviceInfo: null, stats: stats as unknown as StoredStats, verdict: {}, profile, passed,
        sampleCount: big.codes.length, samples: Buffer.from(samples), archive: null,
      });
      await SessionEnvelope.create({ sessionId: session.id, bounds: envelope });
      return session;
    };
    const a = await stored(big.packed, true);
    const b = await stored(packSamples(big.codes, cosB, big.sin, ones), false);
    const compareMs: number[] = [];
    let differing = -1;
    const cpu0 = process.cpuUsage();
    for (let i = 0; i < COMPARE_RUNS; i++) {
      compareMs.push(await timeMs(async () => {
        const res = await fetch(`${server.url}/api/compare?ids=${a.id},${b.id}`, { headers });
        if (res.status !== 200) throw new Error(`GET /api/compare answered ${res.status}: ${await res.text()}`);
        differing = ((await res.json()) as { pairs: { differing: number }[] }).pairs[0].differing;
      }));
    }
    const cpu = process.cpuUsage(cpu0);
    const compareCpuMs = (cpu.user + cpu.system) / 1000 / COMPARE_RUNS;
    const expected = Math.ceil(big.codes.length / 97);
    if (differing !== expected) throw new Error(`compare found ${differing} differing codes, ${expected} expected`);
    let sink = 0;
    const loopMs: number[] = [];
    for (let i = 0; i < COMPARE_RUNS; i++) {
      loopMs.push(await timeMs(() => {
        let n = 0;
        let worst = 0;
        for (let k = 0; k < big.cos.length; k++) {
          const d = Math.max(Math.abs(big.cos[k] - cosB[k]), Math.abs(big.sin[k] - big.sin[k]));
          if (d === 0) continue;
          n++;
          worst = Math.max(worst, d);
        }
        sink += n + worst;
      }));
    }
    if (sink !== COMPARE_RUNS * (expected + 1)) throw new Error('bare diff loop miscounted');
    // What no compare can skip: the two sessions' sample blobs read by the bare driver. On this
    // machine that read alone is far above the loop (fresh memory is slow to touch the first time).
    const readMs = await bareSampleReads(server.t.config.databaseUrl, [a.id, b.id], big.packed.length * 2);
    const cmp = median(compareMs);
    console.log(`  ${dialect} compare: ${compareMs.map((m) => m.toFixed(0)).join(', ')} ms (${compareCpuMs.toFixed(0)} ms CPU each, server and client in this process); bare diff loop ${median(loopMs).toFixed(2)} ms; bare read of the two blobs ${readMs.map((m) => m.toFixed(0)).join(', ')} ms`);

    const bareP95 = quantile(bareMs, 0.95);
    // SQLite's figures keep the names outside scripts read; PostgreSQL's are marked.
    const named = (figure: string) => (dialect === 'sqlite' ? figure : `${figure}@${dialect}`);
    return [
      { name: named('list-p50'), value: p50, unit: 'ms per GET /api/sessions', ratio: p50 / quantile(bareMs, 0.5), ratioOf: `p50 ÷ bare ${bare.name} SELECT … LIMIT 25 p50`, target: null, met: null },
      { name: named('list-p95'), value: p95, unit: 'ms per GET /api/sessions', ratio: p95 / bareP95, ratioOf: `p95 ÷ bare ${bare.name} SELECT … LIMIT 25 p95`, target: 'ratio ≤ 3', met: p95 / bareP95 <= 3 },
      ...(freshMs
        ? [{ name: named('list-p95-before-autovacuum'), value: quantile(freshMs, 0.95), unit: 'ms per GET /api/sessions, straight after the bulk load', ratio: quantile(freshMs, 0.95) / bareP95, ratioOf: `p95 ÷ bare ${bare.name} SELECT … LIMIT 25 p95 (after the vacuum)`, target: null, met: null }]
        : []),
      { name: named('compare'), value: cmp, unit: 'ms per GET /api/compare (2 × 1,048,576 samples)', ratio: cmp / median(loopMs), ratioOf: 'compare time ÷ bare typed-array diff loop', target: 'ratio ≤ 20', met: cmp / median(loopMs) <= 20 },
      { name: named('compare-bare-read'), value: median(readMs), unit: 'ms to read the two sessions\' samples (2 × 12 MiB) with the bare driver', ratio: cmp / median(readMs), ratioOf: 'compare time ÷ this read', target: null, met: null },
    ];
  } finally {
    await server.close();
  }
}

/** Milliseconds per bare read of the `samples` of sessions `ids` (median of COMPARE_RUNS), checking the bytes came. */
async function bareSampleReads(databaseUrl: string, ids: number[], bytes: number): Promise<number[]> {
  const db = await bareDriver(databaseUrl, { readOnly: true });
  const sql = databaseUrl.startsWith('sqlite:') ? `SELECT samples FROM sessions WHERE id IN (${ids.join(', ')})` : `SELECT samples FROM sessions WHERE id IN (${ids.map((_, i) => `$${i + 1}`).join(', ')})`;
  const params = databaseUrl.startsWith('sqlite:') ? [] : ids;
  try {
    const times: number[] = [];
    for (let i = 0; i < COMPARE_RUNS; i++) {
      let got = 0;
      times.push(await timeMs(async () => {
        const rows = (await db.query(sql, params)) as { samples: Uint8Array }[];
        got = rows.reduce((sum, r) => sum + r.samples.length, 0);
      }));
      if (got !== bytes) throw new Error(`the bare read returned ${got} bytes of samples, ${bytes} expected`);
    }
    return times;
  } finally {
    await db.close();
  }
}
