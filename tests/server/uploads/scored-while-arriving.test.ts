// An upload's samples are scored while its body arrives (server/services/upload-scoring.ts), and
// the stored score is the one scoring them all at the end would give, to the last bit; when the
// samples come before the session part, they are scored at the end as before.
import { createServer, request, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { BenchSession, Core } from '../../../server/db/models';
import { modelConfigSchema } from '../../../server/schemas/core';
import { PackedScoring, scorePackedSamples } from '../../../server/services/session-scoring';
import { UploadScoring } from '../../../server/services/upload-scoring';
import { packSamples } from '../../../shared/link-engine/sample-pack';
import { createCordicModel } from '../../../shared/numeric';
import { testApp, type TestApp } from '../../support/test-app';

const config = modelConfigSchema.parse({ angleBits: 18 });
const BATCH_BYTES = 65_536 * 12;

let t: TestApp;
let http: Server;
let port: number;
let token: string;

/** 2.5 scoring batches in a scrambled order, some answers off: the statistics must see them. */
function samples(): Uint8Array {
  const n = 163_840;
  const codes = Float64Array.from({ length: n }, (_, i) => (i * 104_729) % 2 ** 18);
  const cos = new Int32Array(n);
  const sin = new Int32Array(n);
  createCordicModel(config).evaluateInto(codes, cos, sin);
  for (let i = 0; i < n; i += 1009) sin[i] -= (i % 5) + 1;
  return packSamples(codes, cos, sin, new Uint8Array(n).fill(1));
}

beforeAll(async () => {
  t = await testApp();
  http = createServer(t.app);
  await new Promise<void>((r) => http.listen(0, '127.0.0.1', r));
  port = (http.address() as AddressInfo).port;
  await Core.create({ name: 'Streamed core', slug: 'streamed-18', linkProfile: {}, modelConfig: config, limits: { maxAbsErrorLsb: 4 }, baselineSessionId: null });
  const engineer = await t.signInAs('engineer');
  token = (await engineer.post('/api/tokens').send({ name: 'ci' }).expect(201)).body.token;
});

afterAll(async () => {
  await new Promise((r) => http?.close(r));
  await t?.close();
});

const BOUNDARY = 'scored-while-arriving';
const session = JSON.stringify({ coreSlug: 'streamed-18', startedAt: '2026-12-02T10:00:00.000Z', plan: { kind: 'random', count: 163_840, seed: 1 }, transport: { kind: 'websocket' } });
const field = (name: string, value: string) => `--${BOUNDARY}\r\nContent-Disposition: form-data; name="${name}"\r\n\r\n${value}\r\n`;
const fileHead = `--${BOUNDARY}\r\nContent-Disposition: form-data; name="samples"; filename="samples.bin"\r\nContent-Type: application/octet-stream\r\n\r\n`;

/** POST /api/sessions written by hand: `write` decides when each piece goes. */
function post(write: (send: (chunk: string | Uint8Array) => void) => Promise<void>): Promise<{ status: number; body: { id?: number } }> {
  return new Promise((resolve, reject) => {
    const req = request({ host: '127.0.0.1', port, path: '/api/sessions', method: 'POST', headers: { authorization: `Bearer ${token}`, 'content-type': `multipart/form-data; boundary=${BOUNDARY}` } }, (res) => {
      let text = '';
      res.setEncoding('utf8');
      res.on('data', (c) => (text += c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body: JSON.parse(text) }));
    });
    req.on('error', reject);
    write((chunk) => req.write(chunk)).then(() => req.end(), reject);
  });
}

async function storedStats(id: number | undefined) {
  const row = await BenchSession.findByPk(id);
  return JSON.stringify(row!.stats);
}

describe('an upload scored while it arrives', () => {
  it('scores whole batches before the body has ended, and stores the score of all the samples to the last bit', async () => {
    const bytes = samples();
    const feed = vi.spyOn(PackedScoring.prototype, 'feed');
    const take = vi.spyOn(UploadScoring.prototype, 'take');
    try {
      const res = await post(async (send) => {
        send(field('session', session));
        send(fileHead);
        // Two whole batches and a bit, then wait until the server has begun scoring them.
        send(bytes.subarray(0, 2 * BATCH_BYTES + 100));
        await vi.waitFor(() => expect(feed.mock.calls.some(([, size]) => size >= 2 * BATCH_BYTES)).toBe(true), { timeout: 10_000 });
        send(bytes.subarray(2 * BATCH_BYTES + 100));
        send(`\r\n--${BOUNDARY}--\r\n`);
      });
      expect(res.status).toBe(201);
      // The handler finished the scoring begun while the body arrived.
      expect(take).toHaveBeenCalledTimes(1);
      expect(take.mock.results[0].value).toBeInstanceOf(PackedScoring);
      expect(await storedStats(res.body.id)).toBe(JSON.stringify(scorePackedSamples(config, bytes, 'turn').stats));
    } finally {
      feed.mockRestore();
      take.mockRestore();
    }
  });

  it('scores the samples at the end when they come before the session part, with the same result', async () => {
    const bytes = samples();
    const take = vi.spyOn(UploadScoring.prototype, 'take');
    try {
      const res = await post(async (send) => {
        send(fileHead);
        send(bytes);
        send(`\r\n`);
        send(field('session', session));
        send(`--${BOUNDARY}--\r\n`);
      });
      expect(res.status).toBe(201);
      expect(take.mock.results[0].value).toBeNull();
      expect(await storedStats(res.body.id)).toBe(JSON.stringify(scorePackedSamples(config, bytes, 'turn').stats));
    } finally {
      take.mockRestore();
    }
  });

  it('answers an unknown core with the same 400 as before, whatever arrived first', async () => {
    const res = await post(async (send) => {
      send(field('session', session.replace('streamed-18', 'no-such-core')));
      send(fileHead);
      send(samples());
      send(`\r\n--${BOUNDARY}--\r\n`);
    });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body)).toContain('session.coreSlug: no such core');
  });
});
