// The server under load on loopback: concurrent session uploads and list reads against a real
// listening server on a temporary SQLite file. Nothing may fail and no session may go missing.
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BenchSession } from '../../server/db/models';
import { benchFixtures } from '../support/fixtures';
import { testApp, TEST_PASSWORD, type TestApp } from '../support/test-app';
import { modelSamples, sessionForm, sessionPart, signInOverHttp, type HttpSession } from './support/http-session';

let t: TestApp;
let server: Server;
let baseUrl: string;
let engineer: HttpSession;
let reviewer: HttpSession;
let ids: { coreId: number; buildId: number; boardId: number };

beforeAll(async () => {
  t = await testApp();
  server = createServer(t.app);
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const f = await benchFixtures(t.users.engineer);
  ids = { coreId: f.core.id, buildId: f.build.id, boardId: f.board.id };
  engineer = await signInOverHttp(baseUrl, t.users.engineer.email, TEST_PASSWORD);
  reviewer = await signInOverHttp(baseUrl, t.users.reviewer.email, TEST_PASSWORD);
});

afterAll(async () => {
  server?.closeAllConnections();
  await new Promise((r) => server?.close(r));
  await t?.close();
});

describe('the server under load', () => {
  it('takes 20 concurrent session uploads while 200 list reads run, with no error and no session lost', async () => {
    const before = await BenchSession.count();
    const samples = modelSamples(4096);
    const uploads = Array.from({ length: 20 }, (_, i) =>
      engineer.fetch('/api/sessions', { method: 'POST', body: sessionForm(sessionPart(ids, `load run ${i}`), samples) }).then(async (res) => ({
        status: res.status,
        body: (await res.json()) as { id?: number; message?: string },
      })),
    );
    const reads = Array.from({ length: 200 }, (_, i) =>
      reviewer.fetch(`/api/sessions?pageSize=${1 + (i % 100)}`).then(async (res) => ({ status: res.status, body: (await res.json()) as { items?: unknown[]; total?: number } })),
    );
    const [up, rd] = await Promise.all([Promise.all(uploads), Promise.all(reads)]);

    expect(up.filter((u) => u.status !== 201)).toEqual([]);
    expect(rd.filter((r) => r.status !== 200)).toEqual([]);
    const newIds = up.map((u) => u.body.id);
    expect(new Set(newIds).size).toBe(20);
    // Every read saw a consistent table: a total between before and after, never more items than asked.
    expect(rd.every((r, i) => r.body.total! >= before && r.body.total! <= before + 20 && r.body.items!.length <= 1 + (i % 100))).toBe(true);

    expect(await BenchSession.count()).toBe(before + 20);
    const rows = await BenchSession.findAll({ where: { id: newIds as number[] }, attributes: ['id', 'notes', 'sampleCount'] });
    expect(rows.map((r) => r.notes).sort()).toEqual(Array.from({ length: 20 }, (_, i) => `load run ${i}`).sort());
    expect(rows.every((r) => r.sampleCount === 4096)).toBe(true);
    const listed = await reviewer.fetch('/api/sessions?pageSize=100');
    expect(((await listed.json()) as { total: number }).total).toBe(before + 20);
  });

  it('serves a second wave of 200 reads of the list and of single sessions after the uploads, all 200 OK', async () => {
    const some = await BenchSession.findAll({ attributes: ['id'], limit: 20 });
    const reads = Array.from({ length: 200 }, (_, i) =>
      reviewer.fetch(i % 2 ? `/api/sessions/${some[i % some.length].id}` : '/api/sessions').then(
        (r) => r.status,
        (e: Error) => `${i}: ${e.message} (${String((e.cause as Error | undefined)?.message)})`,
      ),
    );
    const statuses = await Promise.all(reads);
    expect(statuses.filter((s) => s !== 200)).toEqual([]);
  });
});
