import { createHash, randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEntry, Build, Core } from '../../server/db/models';
import { benchFixtures } from '../support/fixtures';
import { testApp, type Agent, type TestApp } from '../support/test-app';

const UPLOAD_LIMIT = 64 * 1024;
let t: TestApp;
let engineer: Agent;
let buildId: number;

beforeAll(async () => {
  t = await testApp({ uploadLimitBytes: UPLOAD_LIMIT });
  buildId = (await benchFixtures(t.users.engineer)).build.id;
  engineer = await t.signInAs('engineer');
});
afterAll(() => t.close());

/** Row counts that must not move when a request is refused. */
const counts = async () => ({ cores: await Core.count(), audit: await AuditEntry.count() });

describe('a refused core leaves the database as it was', () => {
  const goodCore = { name: 'Mixer core', slug: 'mixer-core' };

  it('refuses malformed JSON', async () => {
    const before = await counts();
    const res = await engineer.post('/api/cores').set('content-type', 'application/json').send('{"name": "x",').expect(400);
    expect(res.body.error.code).toBe('bad_json');
    expect(await counts()).toEqual(before);
  });

  it('refuses a wrong type and names the field', async () => {
    const before = await counts();
    const res = await engineer.post('/api/cores').send({ ...goodCore, name: 5 }).expect(400);
    expect(res.body.error.message).toMatch(/^body\.name: /);
    expect(res.body.error.details[0].path).toBe('body.name');
    expect(await counts()).toEqual(before);
  });

  it('refuses a model configuration out of range and names the key', async () => {
    const before = await counts();
    const res = await engineer.post('/api/cores').send({ ...goodCore, modelConfig: { iterations: 0 } }).expect(400);
    expect(res.body.error.message).toMatch(/^body\.modelConfig\.iterations: /);
    expect(await counts()).toEqual(before);
  });

  it('refuses unknown fields, naming them', async () => {
    const before = await counts();
    const res = await engineer.post('/api/cores').send({ ...goodCore, colour: 'red' }).expect(400);
    expect(res.body.error.message).toContain('colour');
    const nested = await engineer.post('/api/cores').send({ ...goodCore, modelConfig: { gain: 1.6 } }).expect(400);
    expect(nested.body.error.message).toContain('gain');
    expect(await counts()).toEqual(before);
  });

  it('refuses a body over the limit with 413', async () => {
    const before = await counts();
    const res = await engineer.post('/api/cores').send({ ...goodCore, name: 'x'.repeat(2 * 1024 * 1024) }).expect(413);
    expect(res.body.error.code).toBe('too_large');
    expect(await counts()).toEqual(before);
  });

  it('refuses a slug that is taken with 409', async () => {
    await engineer.post('/api/cores').send(goodCore).expect(201);
    const before = await counts();
    const res = await engineer.post('/api/cores').send({ ...goodCore, name: 'Another' }).expect(409);
    expect(res.body.error.message).toContain('slug');
    expect(await counts()).toEqual(before);
  });

  it('accepts a good core, fills the default model configuration and audits it', async () => {
    const before = await counts();
    const res = await engineer.post('/api/cores').send({ name: 'Default core', slug: 'default-core' }).expect(201);
    expect(res.body.core.modelConfig).toEqual({
      angleFormat: 'turn', angleBits: 16, angleFrac: 0, outBits: 16, outFrac: 14, iterations: 16,
      guardBits: 2, zGuardBits: 2, shiftRounding: 'floor', outputRounding: 'nearest', fold: true,
    });
    expect(await counts()).toEqual({ cores: before.cores + 1, audit: before.audit + 1 });
  });
});

describe('bitstream uploads', () => {
  const files = () => fs.readdirSync(t.uploadDir);

  it('store the file with the SHA-256 that node:crypto computes for the same bytes', async () => {
    const bytes = randomBytes(40_000);
    const res = await engineer.post(`/api/builds/${buildId}/file`).attach('file', bytes, 'top_level.bit').expect(200);
    const expected = createHash('sha256').update(bytes).digest('hex');
    expect(res.body.build).toMatchObject({ fileName: 'top_level.bit', fileSize: bytes.length, sha256: expected });
    const download = await engineer.get(`/api/builds/${buildId}/file`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    }).expect(200);
    expect(createHash('sha256').update(download.body as Buffer).digest('hex')).toBe(expected);
  });

  it('replace the previous file on re-upload and clean a hostile file name', async () => {
    const bytes = randomBytes(1000);
    const res = await engineer.post(`/api/builds/${buildId}/file`).attach('file', bytes, '../../etc/passwd').expect(200);
    expect(res.body.build.fileName).toBe('passwd');
    expect(res.body.build.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
    expect(files()).toEqual([`build-${buildId}.bit`]);
    expect(fs.statSync(path.join(t.uploadDir, `build-${buildId}.bit`)).size).toBe(1000);
  });

  it('refuse a file over the limit with 413, keeping the previous file and record', async () => {
    const before = (await Build.findByPk(buildId))!.toJSON();
    const auditBefore = await AuditEntry.count();
    const res = await engineer.post(`/api/builds/${buildId}/file`).attach('file', randomBytes(UPLOAD_LIMIT + 1), 'big.bit').expect(413);
    expect(res.body.error.code).toBe('too_large');
    expect((await Build.findByPk(buildId))!.toJSON()).toEqual(before);
    expect(await AuditEntry.count()).toBe(auditBefore);
    expect(files()).toEqual([`build-${buildId}.bit`]);
  });

  it('refuse an upload to an unknown build with 404 and write nothing', async () => {
    await engineer.post('/api/builds/999999/file').attach('file', randomBytes(10), 'x.bit').expect(404);
    expect(files()).toEqual([`build-${buildId}.bit`]);
  });

  it('refuse a request without a file field', async () => {
    const res = await engineer.post(`/api/builds/${buildId}/file`).field('note', 'no file').expect(400);
    expect(res.body.error.message).toMatch(/^file: /);
  });
});
