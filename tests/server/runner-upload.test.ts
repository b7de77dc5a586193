import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BenchSession, Core } from '../../server/db/models';
import { modelConfigSchema } from '../../server/schemas/core';
import { defaultBoardSettings } from '../../mock-device/board-session';
import { parseCoreFault } from '../../mock-device/faulty-core';
import { startMockServer, type MockServer } from '../../mock-device/ws-server';
import { cli } from '../unit/cli/run-support';
import { testApp, type TestApp } from '../support/test-app';

let t: TestApp;
let http: Server;
let serverUrl: string;
let healthy: MockServer;
let faulty: MockServer;
let token: string;

beforeAll(async () => {
  t = await testApp();
  http = createServer(t.app);
  await new Promise<void>((r) => http.listen(0, '127.0.0.1', r));
  serverUrl = `http://127.0.0.1:${(http.address() as AddressInfo).port}`;
  await Core.create({
    name: 'Runner core',
    slug: 'runner-16',
    linkProfile: { baud: 12_000_000, crc: 'CRC-8/SMBUS' },
    modelConfig: modelConfigSchema.parse({}),
    // The default model reaches 3.3 LSB max over all codes: 4 passes a healthy board.
    limits: { maxAbsErrorLsb: 4, maxModelMismatches: 0 },
    baselineSessionId: null,
  });
  const engineer = await t.signInAs('engineer');
  token = (await engineer.post('/api/tokens').send({ name: 'ci' }).expect(201)).body.token;
  healthy = await startMockServer({ ...defaultBoardSettings(), baud: 12_000_000 }, 0, '127.0.0.1', () => undefined);
  faulty = await startMockServer({ ...defaultBoardSettings(), baud: 12_000_000, coreFault: parseCoreFault('sign:5') }, 0, '127.0.0.1', () => undefined);
});

afterAll(async () => {
  await healthy?.close();
  await faulty?.close();
  await new Promise((r) => http?.close(r));
  await t?.close();
});

const run = (device: string, tok = token) =>
  cli(['run', '--device', device, '--baud', '12000000', '--plan', 'exhaustive', '--core', 'runner-16', '--server', serverUrl, '--token', tok], 60_000);

describe('the runner uploading to the real server', () => {
  it('exits 0 for a healthy board, and the session is stored with its archive, passing', async () => {
    const before = await BenchSession.count();
    const r = await run(healthy.url);
    expect(r.status, r.stderr).toBe(0);
    expect(await BenchSession.count()).toBe(before + 1);
    const s = await BenchSession.findOne({ order: [['id', 'DESC']] });
    expect(s!.passed).toBe(true);
    expect(s!.sampleCount).toBe(65_536);
    expect(s!.archive?.length ?? 0).toBeGreaterThan(65_536 * 4);
  });

  it('exits 1 for a board whose iteration 5 turns the wrong way, and the stored session is failing', async () => {
    const r = await run(faulty.url);
    expect(r.status, r.stderr).toBe(1);
    const s = await BenchSession.findOne({ order: [['id', 'DESC']] });
    expect(s!.passed).toBe(false);
  });

  it('exits 2 with the reason for a wrong token, storing nothing', async () => {
    const before = await BenchSession.count();
    const r = await run(healthy.url, 'ab_not-a-real-token');
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/error:.*(token|401|sign)/i);
    expect(await BenchSession.count()).toBe(before);
  });
});
