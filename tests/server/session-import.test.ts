import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BenchSession, Build, Core, type OutboxMessage } from '../../server/db/models';
import { modelConfigSchema } from '../../server/schemas/core';
import { packColumns } from '../../shared/link-engine/sample-pack';
import { Recorder } from '../../shared/link/recorder';
import { createCordicModel, errorProfile, PROFILE_BINS } from '../../shared/numeric';
import { ScoreAccumulator } from '../../shared/numeric/score';
import { listCapture } from '../support/capture';
import { testApp, type Agent, type TestApp } from '../support/test-app';

// Imports are scored like uploads: the expected figures are the shared accumulator's over the
// same codes, computed here.
const config = modelConfigSchema.parse({});
const model = createCordicModel(config);
const CODES = Array.from({ length: 512 }, (_, i) => i * 128);

function answers(cosDelta = 0) {
  const codes = Float64Array.from(CODES);
  const cos = new Int32Array(codes.length);
  const sin = new Int32Array(codes.length);
  model.evaluateInto(codes, cos, sin);
  for (let i = 0; i < cos.length; i++) cos[i] += cosDelta;
  return { codes, cos, sin };
}
const toCsv = (a: ReturnType<typeof answers>) => ['angle_code,cos_code,sin_code', ...Array.from(a.codes, (c, i) => `${c},${a.cos[i]},${a.sin[i]}`)].join('\n') + '\n';
const expectedStats = (a: ReturnType<typeof answers>) => JSON.parse(JSON.stringify(new ScoreAccumulator(config).add(a.codes, a.cos, a.sin).summary())) as unknown;

/** An empty capture's header, then a CHUNK record whose length is ten 0xFF bytes. */
function overlongVarintArchive() {
  const empty = new Recorder().toArchive();
  const headerEnd = 7 + (empty[5] | (empty[6] << 8));
  return Buffer.from([...empty.subarray(0, headerEnd), 0x01, ...new Array<number>(8).fill(0), ...new Array<number>(10).fill(0xff), 0x01]);
}

let t: TestApp;
let engineer: Agent;
let reviewer: Agent;
let admin: Agent;
let core: Core;
let watched: Core;
let build: Build;

const importFile = (agent: Agent, bytes: Buffer | string, name: string, session: Record<string, unknown> = { coreId: core.id }) =>
  agent.post('/api/sessions/import').field('session', JSON.stringify(session)).attach('file', Buffer.from(bytes), name);

beforeAll(async () => {
  t = await testApp({ uploadLimitBytes: 256 * 1024 });
  const limits = { maxAbsErrorLsb: 4, maxModelMismatches: 0 };
  core = await Core.create({ name: 'Import core', slug: 'import-core', linkProfile: {}, modelConfig: config, limits, baselineSessionId: null });
  watched = await Core.create({ name: 'Watched core', slug: 'watched-core', linkProfile: {}, modelConfig: config, limits, baselineSessionId: null });
  build = await Build.create({ coreId: core.id, label: 'imp-1', sourceRevision: 'beef', toolVersion: 't', clockMHz: 100, createdById: t.users.engineer.id });
  engineer = await t.signInAs('engineer');
  reviewer = await t.signInAs('reviewer');
  admin = await t.signInAs('admin');
});
afterAll(() => t.close());

describe('POST /api/sessions/import', () => {
  it('scores a CSV of codes on the server and keeps the samples in the stored format', async () => {
    const a = answers();
    const res = await importFile(engineer, toCsv(a), 'capture.csv', { coreId: core.id, buildId: build.id, tags: ['rtl-sim'] }).expect(201);
    expect(res.body.stats).toEqual(expectedStats(a));
    expect(res.body.passed).toBe(true);
    const row = await BenchSession.findByPk(res.body.id);
    expect(row).toMatchObject({ coreId: core.id, buildId: build.id, sampleCount: CODES.length, archive: null, tags: ['rtl-sim'] });
    expect(row?.plan).toMatchObject({ kind: 'imported', from: 'csv', fileName: 'capture.csv' });
    expect(Buffer.compare(row!.samples, Buffer.from(packColumns(a)))).toBe(0);
  });

  it('scores a recorder archive and keeps the archive with the session', async () => {
    const archive = listCapture(CODES, config, 5);
    const res = await importFile(engineer, Buffer.from(archive), 'bench.abrc').expect(201);
    expect(res.body.stats).toEqual(expectedStats(answers(5)));
    expect(res.body.passed).toBe(false);
    expect(res.body.verdict.maxModelMismatches).toMatchObject({ measured: CODES.length, pass: false });
    const back = await reviewer.get(`/api/sessions/${res.body.id}/archive`).buffer(true).expect(200);
    expect(Buffer.compare(back.body as Buffer, Buffer.from(archive))).toBe(0);
  });

  it.each([
    ['a CSV with a bad row, naming its line', () => toCsv(answers()).replace('256,', '256;'), 'bad.csv', /^file: line 4: expected 3 values/],
    ['a CSV without the header', () => '0,1,2\n', 'bad.csv', /^file: line 1: the header/],
    ['a truncated archive', () => Buffer.from(listCapture(CODES)).subarray(0, 300), 'cut.abrc', /^file: not a readable recorder archive/],
    ['an archive with an over-long varint', () => overlongVarintArchive(), 'crafted.abrc', /^file: not a readable recorder archive \(archive is corrupt/],
    ['binary that is neither', () => Buffer.from([0x7f, 0x45, 0x4c, 0x46, 0, 1, 2]), 'tool.bin', /neither a recorder archive nor CSV/],
  ])('refuses %s with 400 and stores nothing', async (_what, bytes, name, message) => {
    const before = await BenchSession.count();
    const res = await importFile(engineer, bytes(), name).expect(400);
    expect(res.body.error.message).toMatch(message);
    expect(await BenchSession.count()).toBe(before);
  });

  it('refuses codes outside the core’s formats, a missing file, an unknown core and a reviewer', async () => {
    const before = await BenchSession.count();
    await importFile(engineer, 'angle_code,cos_code,sin_code\n70000,0,0\n', 'wide.csv').expect(400);
    await engineer.post('/api/sessions/import').field('session', JSON.stringify({ coreId: core.id })).expect(400);
    const unknown = await importFile(engineer, toCsv(answers()), 'a.csv', { coreSlug: 'no-such-core' }).expect(400);
    expect(unknown.body.error.message).toBe('session.coreSlug: no such core');
    await importFile(reviewer, toCsv(answers()), 'a.csv').expect(403);
    await importFile(engineer, 'x'.repeat(300 * 1024), 'big.csv').expect(413);
    expect(await BenchSession.count()).toBe(before);
  });

  it('flags a regression against the baseline and mails the core’s watchers (read back from the outbox)', async () => {
    await reviewer.put(`/api/cores/${watched.id}/watch`).expect(204);
    const base = await importFile(engineer, toCsv(answers()), 'good.csv', { coreId: watched.id }).expect(201);
    await engineer.patch(`/api/sessions/${base.body.id}`).send({ baseline: true }).expect(200);
    const worse = await importFile(engineer, toCsv(answers(7)), 'worse.csv', { coreId: watched.id }).expect(201);
    expect(worse.body).toMatchObject({ passed: false, regression: true });
    const messages: OutboxMessage[] = (await admin.get('/api/outbox').expect(200)).body.messages;
    const mail = messages.find((m) => m.text.includes(`/sessions/${worse.body.id}`));
    expect(mail?.to).toContain('reviewer@lab.test');
    expect(mail?.subject).toMatch(/Watched core/);
    expect(mail?.text).toMatch(/maxAbsErrorLsb|maxModelMismatches/);
  });
});

describe('GET /api/sessions list items', () => {
  // A core and two imports of their own (a tagged CSV, then an archive), so these tests read the
  // same rows whatever ran before them.
  let listCore: Core;
  let listBuild: Build;
  beforeAll(async () => {
    listCore = await Core.create({ name: 'Listed core', slug: 'listed-core', linkProfile: {}, modelConfig: config, limits: { maxAbsErrorLsb: 4 }, baselineSessionId: null });
    listBuild = await Build.create({ coreId: listCore.id, label: 'imp-2', sourceRevision: 'cafe', toolVersion: 't', clockMHz: 100, createdById: t.users.engineer.id });
    await importFile(engineer, toCsv(answers()), 'listed.csv', { coreId: listCore.id, buildId: listBuild.id, tags: ['listed-rtl-sim'] }).expect(201);
    await importFile(engineer, Buffer.from(listCapture(CODES, config, 5)), 'listed.abrc', { coreId: listCore.id }).expect(201);
  });

  it('name their core, build, board and operator, say whether an archive is kept and carry the error profile', async () => {
    const res = await reviewer.get(`/api/sessions?coreId=${listCore.id}&sort=id`).expect(200);
    expect(res.body.total).toBe(2);
    const [csv, archived] = res.body.items;
    expect(csv).toMatchObject({ core: { id: listCore.id, name: 'Listed core', slug: 'listed-core' }, build: { id: listBuild.id, label: 'imp-2' }, board: null, operator: { name: 'Test engineer' }, hasArchive: false });
    expect(archived.hasArchive).toBe(true);
    const a = answers();
    expect(csv.profile).toHaveLength(PROFILE_BINS);
    expect(csv.profile).toEqual(errorProfile(config, a.codes, a.cos, a.sin));
    const detail = await reviewer.get(`/api/sessions/${archived.id}`).expect(200);
    expect(detail.body.session).toMatchObject({ hasArchive: true, core: { slug: 'listed-core' } });
  });

  it('filter by tag, exactly', async () => {
    const tagged = await reviewer.get('/api/sessions?tag=listed-rtl-sim').expect(200);
    expect(tagged.body.total).toBe(1);
    expect(tagged.body.items[0].core.id).toBe(listCore.id);
    expect((await reviewer.get('/api/sessions?tag=listed-rtl').expect(200)).body.total).toBe(0);
    expect((await reviewer.get(`/api/sessions?tag=${encodeURIComponent("x' OR 1=1 --")}`).expect(200)).body.total).toBe(0);
  });
});
