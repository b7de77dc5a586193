import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { AuditEntry, Core, GoldenVectorSet } from '../../server/db/models';
import { modelConfigSchema } from '../../server/schemas/core';
import { createCordicModel } from '../../shared/numeric';
import { testApp, type Agent, type TestApp } from '../support/test-app';

const config = modelConfigSchema.parse({});
const model = createCordicModel(config);

/** Golden vectors for `codes` as the model computes them, with `edit` applied to the rows. */
function csv(codes: number[], edit: (row: [number, number, number], i: number) => void = () => {}) {
  const rows = codes.map((c, i) => {
    const { cos, sin } = model.evaluate(c);
    const row: [number, number, number] = [c, cos, sin];
    edit(row, i);
    return row.join(',');
  });
  return Buffer.from(['angle_code,cos_code,sin_code', ...rows].join('\n'));
}

let t: TestApp;
let engineer: Agent;
let reviewer: Agent;
let core: Core;
const url = () => `/api/cores/${core.id}/golden-vectors`;
const post = (agent: Agent, file: Buffer, name = 'rtl sim, seed 1') => agent.post(url()).field('name', name).attach('file', file, 'vectors.csv');

beforeAll(async () => {
  t = await testApp({ uploadLimitBytes: 128 * 1024 });
  core = await Core.create({ name: 'Golden core', slug: 'golden-core', linkProfile: {}, modelConfig: config, limits: {}, baselineSessionId: null });
  engineer = await t.signInAs('engineer');
  reviewer = await t.signInAs('reviewer');
});
afterAll(() => t.close());
// Each test starts with no sets, so the list it reads is its own in any order.
beforeEach(() => GoldenVectorSet.destroy({ where: {} }));

describe('golden vectors of a core', () => {
  it('are uploaded as CSV and summarised: count, distinct codes, coverage of the code range, agreement with the model', async () => {
    // Every 16th code of the 16-bit range, one of them twice: 4096 distinct codes of 65,536.
    const codes = [...Array.from({ length: 4096 }, (_, i) => i * 16), 32];
    const res = await post(engineer, csv(codes)).expect(201);
    expect(res.body.set).toMatchObject({ name: 'rtl sim, seed 1', count: 4097, distinctCodes: 4096, coverageShare: 4096 / 65536, modelMismatches: 0, firstMismatches: [] });
    expect(await AuditEntry.count({ where: { entity: 'golden-vectors', entityId: res.body.set.id } })).toBe(1);
    const list = await reviewer.get(url()).expect(200);
    expect(list.body.sets).toHaveLength(1);
    expect(list.body.sets[0]).toMatchObject({ id: res.body.set.id, count: 4097 });
  });

  it('report the rows that differ from the model with their CSV line', async () => {
    const res = await post(engineer, csv([0, 1000, 2000], (row, i) => i === 1 && (row[2] += 1)), 'off by one').expect(201);
    expect(res.body.set.modelMismatches).toBe(1);
    expect(res.body.set.firstMismatches).toEqual([{ line: 3, code: 1000, cos: model.evaluate(1000).cos, sin: model.evaluate(1000).sin + 1, modelCos: model.evaluate(1000).cos, modelSin: model.evaluate(1000).sin }]);
  });

  it.each([
    ['a malformed row', csv([0, 1, 2], (row, i) => i === 2 && (row[1] = 0.5)), /^file: line 4: cos_code "0.5" is not an integer/],
    ['an angle code outside the core’s format', csv([0, 5], (row, i) => i === 1 && (row[0] = 65536)), /^file: line 3: angle_code 65536 is outside/],
    ['an output code outside the core’s format', csv([0, 5], (row, i) => i === 0 && (row[1] = 40000)), /^file: line 2: cos_code 40000 is outside/],
  ])('refuse %s with 400 naming the line, storing nothing', async (_what, file, message) => {
    const before = await GoldenVectorSet.count();
    const res = await post(engineer, file).expect(400);
    expect(res.body.error.message).toMatch(message);
    expect(await GoldenVectorSet.count()).toBe(before);
  });

  it('need a name and a file, stay under the upload limit, and are for engineers to upload', async () => {
    const before = await GoldenVectorSet.count();
    expect((await post(engineer, csv([0]), '').expect(400)).body.error.message).toMatch(/^name:/);
    await engineer.post(url()).field('name', 'x').expect(400);
    await post(engineer, Buffer.alloc(200 * 1024, 0x31)).expect(413);
    await post(reviewer, csv([0])).expect(403);
    await engineer.post('/api/cores/999999/golden-vectors').field('name', 'x').attach('file', csv([0]), 'v.csv').expect(404);
    expect(await GoldenVectorSet.count()).toBe(before);
  });

  it('are deleted by an engineer, and only through their own core', async () => {
    const other = await Core.create({ name: 'Other', slug: 'other-golden', linkProfile: {}, modelConfig: config, limits: {}, baselineSessionId: null });
    const set = (await post(engineer, csv([0, 1])).expect(201)).body.set;
    await engineer.delete(`/api/cores/${other.id}/golden-vectors/${set.id}`).expect(404);
    await reviewer.delete(`${url()}/${set.id}`).expect(403);
    await engineer.delete(`${url()}/${set.id}`).expect(204);
    expect(await GoldenVectorSet.findByPk(set.id)).toBeNull();
  });
});
