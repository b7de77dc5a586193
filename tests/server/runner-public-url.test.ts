// PUBLIC_URL reaches the runner: the upload's reply names the session at the address people use,
// and the runner prints that, not the (internal) address it was given with --server.
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Core } from '../../server/db/models';
import { modelConfigSchema } from '../../server/schemas/core';
import { defaultBoardSettings } from '../../mock-device/board-session';
import { startMockServer, type MockServer } from '../../mock-device/ws-server';
import { cli } from '../unit/cli/run-support';
import { testApp, type TestApp } from '../support/test-app';

const PUBLIC_URL = 'https://anglebench.lab.example';

let t: TestApp;
let http: Server;
let board: MockServer;

beforeAll(async () => {
  t = await testApp({ env: { PUBLIC_URL } });
  http = createServer(t.app);
  await new Promise<void>((r) => http.listen(0, '127.0.0.1', r));
  await Core.create({ name: 'Runner core', slug: 'runner-16', linkProfile: { baud: 12_000_000 }, modelConfig: modelConfigSchema.parse({}), limits: { maxAbsErrorLsb: 4 }, baselineSessionId: null });
  board = await startMockServer({ ...defaultBoardSettings(), baud: 12_000_000 }, 0, '127.0.0.1', () => undefined);
});
afterAll(async () => {
  await board?.close();
  await new Promise((r) => http?.close(r));
  await t?.close();
});

describe('the runner with a server that has PUBLIC_URL', () => {
  it("prints the uploaded session's address under PUBLIC_URL", async () => {
    const engineer = await t.signInAs('engineer');
    const token = (await engineer.post('/api/tokens').send({ name: 'ci' }).expect(201)).body.token;
    const serverUrl = `http://127.0.0.1:${(http.address() as AddressInfo).port}`;
    const r = await cli(['run', '--device', board.url, '--baud', '12000000', '--plan', 'edges', '--core', 'runner-16', '--server', serverUrl, '--token', token], 60_000);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(new RegExp(`session uploaded: ${PUBLIC_URL.replace(/\./g, '\\.')}/sessions/\\d+\\n`));
  });
});
