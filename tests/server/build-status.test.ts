import { createHash, randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Build, Core } from '../../server/db/models';
import { modelConfigSchema } from '../../server/schemas/core';
import { deriveBuildStatus, type ReviewFacts, type SessionFacts } from '../../server/services/build-status';
import { packSamples } from '../../shared/link-engine/sample-pack';
import { createCordicModel } from '../../shared/numeric';
import { testApp, type Agent, type TestApp } from '../support/test-app';

// A build's status follows the rules written at the top of server/services/build-status.ts; each
// rule has its own test here, through the API, plus the pure function's tie-breaks.
const config = modelConfigSchema.parse({});
const model = createCordicModel(config);

/** 64 codes answered by the model; `faulty` adds 1 LSB to one cos answer (a model mismatch). */
function samples(faulty: boolean) {
  const codes = Int32Array.from({ length: 64 }, (_, i) => i * 1024);
  const cos = new Int32Array(64);
  const sin = new Int32Array(64);
  model.evaluateInto(codes, cos, sin);
  if (faulty) cos[5] += 1;
  return Buffer.from(packSamples(codes, cos, sin, new Uint8Array(64).fill(1)));
}

let t: TestApp;
let engineer: Agent;
let reviewer: Agent;
let core: Core;
let label = 0;

const newBuild = async (): Promise<number> => {
  const res = await engineer.post('/api/builds').send({ coreId: core.id, label: `b${++label}`, sourceRevision: 'abc', toolVersion: 't', clockMHz: 100 }).expect(201);
  return res.body.build.id as number;
};
/** Post a session on `buildId`; resolves to whether the server judged it passing. */
const postSession = async (buildId: number, faulty: boolean, startedAt = new Date().toISOString()): Promise<boolean> => {
  const session = { coreId: core.id, buildId, startedAt, plan: { kind: 'sweep' }, transport: { kind: 'serial' } };
  const res = await engineer.post('/api/sessions').field('session', JSON.stringify(session)).attach('samples', samples(faulty), 'samples.bin').expect(201);
  return res.body.passed as boolean;
};
const review = (buildId: number, decision: 'approve' | 'reject', note = '') => reviewer.post(`/api/builds/${buildId}/reviews`).send({ decision, note }).expect(201);
const statusOf = async (buildId: number) => (await reviewer.get(`/api/builds/${buildId}`).expect(200)).body.build.status as string;

beforeAll(async () => {
  t = await testApp();
  core = await Core.create({ name: 'Status core', slug: 'status-core', linkProfile: {}, modelConfig: config, limits: { maxModelMismatches: 0 }, baselineSessionId: null });
  engineer = await t.signInAs('engineer');
  reviewer = await t.signInAs('reviewer');
});
afterAll(() => t.close());

describe('a build’s status', () => {
  it('is untested with no sessions and no review', async () => {
    const id = await newBuild();
    const res = await reviewer.get(`/api/builds/${id}`).expect(200);
    expect(res.body.build).toMatchObject({ status: 'untested', sessionCount: 0, lastSessionAt: null });
  });

  it('is passing or failing after the latest session as run, whatever order they were uploaded in', async () => {
    const id = await newBuild();
    expect(await postSession(id, false)).toBe(true);
    expect(await statusOf(id)).toBe('passing');
    expect(await postSession(id, true)).toBe(false);
    expect(await statusOf(id)).toBe('failing');
    // Uploaded last but run a year earlier: the later run still decides.
    expect(await postSession(id, false, '2025-01-01T00:00:00.000Z')).toBe(true);
    expect(await statusOf(id)).toBe('failing');
    expect(await postSession(id, false)).toBe(true);
    expect(await statusOf(id)).toBe('passing');
  });

  it('follows the latest review over session results: a failing build approved is approved, a passing one rejected is rejected', async () => {
    const failing = await newBuild();
    await postSession(failing, true);
    await review(failing, 'approve', 'the mismatch is a known board fault');
    expect(await statusOf(failing)).toBe('approved');

    const passing = await newBuild();
    await postSession(passing, false);
    await review(passing, 'reject', 'timing not closed');
    expect(await statusOf(passing)).toBe('rejected');
    // A passing session does not lift a rejection, nor change an approval.
    await postSession(passing, false);
    expect(await statusOf(passing)).toBe('rejected');
    await postSession(failing, false);
    expect(await statusOf(failing)).toBe('approved');
  });

  it('takes a review given before any session', async () => {
    const id = await newBuild();
    await review(id, 'reject');
    expect(await statusOf(id)).toBe('rejected');
  });

  it('turns failing when a session uploaded after the latest review fails, until a new review', async () => {
    const id = await newBuild();
    await postSession(id, false);
    await review(id, 'approve');
    expect(await statusOf(id)).toBe('approved');
    await postSession(id, true);
    expect(await statusOf(id)).toBe('failing');
    // A pass afterwards does not clear the unseen failure…
    await postSession(id, false);
    expect(await statusOf(id)).toBe('failing');
    // …a new review does.
    await review(id, 'approve', 'the failure was a loose cable');
    expect(await statusOf(id)).toBe('approved');

    const rejected = await newBuild();
    await review(rejected, 'reject');
    await postSession(rejected, true);
    expect(await statusOf(rejected)).toBe('failing');
  });

  it('is listed with each build, with its session count and when its latest session ran', async () => {
    const id = await newBuild();
    await postSession(id, false, '2026-02-01T10:00:00.000Z');
    await postSession(id, true, '2026-02-03T10:00:00.000Z');
    await postSession(id, false, '2026-02-02T10:00:00.000Z');
    const res = await reviewer.get(`/api/builds?coreId=${core.id}`).expect(200);
    const row = res.body.builds.find((b: { id: number }) => b.id === id);
    expect(row).toMatchObject({ status: 'failing', sessionCount: 3, lastSessionAt: '2026-02-03T10:00:00.000Z', core: { id: core.id, slug: 'status-core' }, createdBy: { name: 'Test engineer' } });
    expect(row.createdBy).not.toHaveProperty('passwordHash');
    expect(res.body.builds.every((b: { coreId: number; status: string }) => b.coreId === core.id && typeof b.status === 'string')).toBe(true);
  });
});

describe('deriveBuildStatus', () => {
  const at = (iso: string) => new Date(iso);
  const s = (id: number, passed: boolean, startedAt: string, createdAt = startedAt): SessionFacts => ({ id, passed, startedAt: at(startedAt), createdAt: at(createdAt) });
  const r = (id: number, decision: 'approve' | 'reject', createdAt: string): ReviewFacts => ({ id, decision, createdAt: at(createdAt) });

  it('breaks a tie in startedAt by the higher session id', () => {
    const same = '2026-01-01T00:00:00.000Z';
    expect(deriveBuildStatus([s(2, false, same), s(1, true, same)], []).status).toBe('failing');
    expect(deriveBuildStatus([s(1, false, same), s(2, true, same)], []).status).toBe('passing');
  });

  it('takes the newest review by creation, and counts a failure uploaded in the same millisecond as after it', () => {
    const reviews = [r(1, 'reject', '2026-01-02T00:00:00.000Z'), r(2, 'approve', '2026-01-03T00:00:00.000Z')];
    expect(deriveBuildStatus([], reviews).status).toBe('approved');
    expect(deriveBuildStatus([s(1, false, '2026-01-01T00:00:00.000Z', '2026-01-02T12:00:00.000Z')], reviews).status).toBe('approved');
    expect(deriveBuildStatus([s(1, false, '2026-01-01T00:00:00.000Z', '2026-01-03T00:00:00.000Z')], reviews).status).toBe('failing');
  });
});

describe('POST /api/builds/:id/file', () => {
  it('lists the other builds that hold the same bitstream, by SHA-256', async () => {
    const [a, b, c] = [await newBuild(), await newBuild(), await newBuild()];
    const bytes = randomBytes(4096);
    const first = await engineer.post(`/api/builds/${a}/file`).attach('file', bytes, 'top.bit').expect(200);
    expect(first.body.duplicates).toEqual([]);
    expect(first.body.build.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
    const second = await engineer.post(`/api/builds/${b}/file`).attach('file', bytes, 'copy.bit').expect(200);
    const labelA = (await Build.findByPk(a))!.label;
    expect(second.body.duplicates).toEqual([{ id: a, label: labelA }]);
    // The build page shows the same warning later, from either side.
    expect((await reviewer.get(`/api/builds/${a}`).expect(200)).body.build.duplicates.map((d: { id: number }) => d.id)).toEqual([b]);
    const other = await engineer.post(`/api/builds/${c}/file`).attach('file', randomBytes(4096), 'other.bit').expect(200);
    expect(other.body.duplicates).toEqual([]);
  });
});

describe('GET /api/builds/:id/reviews', () => {
  it('names each reviewer, newest first', async () => {
    const id = await newBuild();
    await review(id, 'reject', 'first look');
    await review(id, 'approve', 'second look');
    const res = await reviewer.get(`/api/builds/${id}/reviews`).expect(200);
    expect(res.body.reviews.map((x: { note: string; reviewer: { name: string } }) => [x.note, x.reviewer.name])).toEqual([
      ['second look', 'Test reviewer'],
      ['first look', 'Test reviewer'],
    ]);
  });
});
