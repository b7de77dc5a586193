import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runRunCommand } from '../../../cli/run';
import { scoreArchive } from '../../../cli/run-record';
import { defaultBoardSettings } from '../../../mock-device/board-session';
import { parseCoreFault } from '../../../mock-device/faulty-core';
import { startMockServer, type MockServer } from '../../../mock-device/ws-server';
import { replayArchive } from '../../../shared/link';
import { captureIo, cli, errorLines, mockSerialBoard } from './run-support';

// A healthy core is bit-exact with the model and loses nothing on a clean line; the sign fault
// turns iteration 5 the wrong way, so every answer past it differs from the model.
const LIMITS = JSON.stringify({ maxModelMismatches: 0, maxLinkErrors: 0, maxAbsErrorLsb: 4 });
const FAST = ['--baud', '12000000'];

let healthy: MockServer;
let faulty: MockServer;
const boardLog: string[] = [];
const dir = mkdtempSync(join(tmpdir(), 'anglebench-run-'));

beforeAll(async () => {
  const settings = { ...defaultBoardSettings(), baud: 12_000_000 };
  healthy = await startMockServer(settings, 0, '127.0.0.1', (l) => boardLog.push(l));
  faulty = await startMockServer({ ...settings, coreFault: parseCoreFault('sign:5') }, 0, '127.0.0.1', (l) => boardLog.push(l));
});
afterAll(async () => {
  await healthy.close();
  await faulty.close();
});

/** A stand-in server: GET /api/cores with one core, and whatever `upload` answers POST /api/sessions. */
async function fakeServer(token: string, upload: (res: import('node:http').ServerResponse) => void): Promise<{ url: string; server: Server }> {
  const server = createServer((req, res) => {
    if (req.headers.authorization !== `Bearer ${token}`) {
      res.writeHead(401, { 'content-type': 'application/json' }).end(JSON.stringify({ error: { code: 'bad_token', message: 'Unknown or revoked API token' } }));
      return;
    }
    if (req.method === 'GET' && req.url === '/api/cores') {
      const core = { id: 7, slug: 'reference-16', name: 'Reference 16', linkProfile: { baud: 12_000_000, crc: 'CRC-8/SMBUS' }, modelConfig: {}, limits: { maxModelMismatches: 0 } };
      res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify({ cores: [core] }));
      return;
    }
    req.resume();
    req.on('end', () => upload(res));
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  return { url: `http://127.0.0.1:${(server.address() as AddressInfo).port}`, server };
}

describe('the run command against the simulated board over WebSocket', { timeout: 30_000 }, () => {
  it('exits 0 and prints a JSON summary with every limit passing for a healthy core', async () => {
    const r = await cli(['run', '--device', healthy.url, ...FAST, '--plan', 'sweep:0,16,4096', '--core', 'reference-16', '--limits', LIMITS, '--json']);
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.results).toEqual({ total: 4096, answered: 4096, missing: 0 });
    expect(out.stats.mismatches.count).toBe(0);
    expect(out.verdict.passed).toBe(true);
    expect(out.verdict.checks.map((c: { outcome: string }) => c.outcome)).toEqual(['pass', 'pass', 'pass']);
    expect(r.stderr).toMatch(/^progress: 100% 4,096\/4,096 codes/m);
    expect(errorLines(r.stderr)).toEqual([]);
  });

  it('exits 1 with the model-mismatch limit failing for a board whose core has fault sign:5', async () => {
    const r = await cli(['run', '--device', faulty.url, ...FAST, '--plan', 'edges', '--core', 'reference-16', '--limits', LIMITS]);
    expect(r.status).toBe(1);
    expect(r.stdout).toMatch(/FAIL {2}maxModelMismatches/);
    expect(r.stdout).toMatch(/verdict: FAIL/);
  });

  it('exits 2 with one line naming the reason when the device is unreachable', async () => {
    const r = await cli(['run', '--device', 'ws://127.0.0.1:1/', '--plan', 'edges', '--core', 'reference-16']);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trimEnd().split('\n')).toEqual([expect.stringMatching(/^error: Cannot connect to ws:\/\/127\.0\.0\.1:1\/: .*ECONNREFUSED/)]);
  });

  it('exits 2 on a bad plan before touching the device', async () => {
    const r = await cli(['run', '--device', healthy.url, '--plan', 'spiral:3', '--core', 'reference-16']);
    expect(r.status).toBe(2);
    expect(r.stderr.trimEnd()).toMatch(/^error: --plan must be exhaustive, sweep:START,STEP,COUNT/);
  });

  it('writes an archive with --out that replays and scores to the same statistics', async () => {
    for (const plan of ['sweep:100,7,3000', 'random:2000,11']) {
      const out = join(dir, `${plan.replace(/[:,]/g, '-')}.abrc`);
      const r = await cli(['run', '--device', faulty.url, ...FAST, '--plan', plan, '--core', 'reference-16', '--out', out, '--json']);
      expect(r.status).toBe(0); // no limits given: nothing to fail
      const live = JSON.parse(r.stdout);
      const bytes = new Uint8Array(readFileSync(out));
      const replay = replayArchive(bytes);
      // Every request and every reply is in the capture (a SWEEP_END may land after the figures were taken).
      expect(replay.skips).toEqual([]);
      expect(replay.frames.filter((f) => f.direction === 'to-host').length).toBeGreaterThanOrEqual(live.link.framesReceived);
      expect(replay.frames.filter((f) => f.direction === 'to-device').length).toBe(live.link.framesSent);
      const again = scoreArchive(bytes);
      expect(again.label.plan.kind).toBe(plan.split(':')[0]);
      expect(again.score.answered).toBe(live.results.answered);
      for (const key of ['cos', 'sin', 'overall', 'magnitude', 'phase', 'mismatches', 'coverage'] as const) {
        expect(again.score.summary[key]).toEqual(live.stats[key]);
      }
      expect(live.stats.mismatches.count).toBeGreaterThan(0);
    }
  });
});

describe('the run command with a server', { timeout: 30_000 }, () => {
  it('exits 2 when the server refuses the token', async () => {
    const { url, server } = await fakeServer('good-token', (res) => res.writeHead(500).end());
    try {
      const r = await cli(['run', '--device', healthy.url, '--plan', 'edges', '--core', 'reference-16', '--server', url, '--token', 'wrong-token']);
      expect(r.status).toBe(2);
      expect(r.stderr.trimEnd()).toBe('error: the server refused the token: Unknown or revoked API token');
    } finally {
      server.close();
    }
  });

  it('takes the limits from the core, prints the verdict, and exits 2 when the server has no session upload yet', async () => {
    const notYet = (res: import('node:http').ServerResponse) =>
      res.writeHead(404, { 'content-type': 'application/json' }).end(JSON.stringify({ error: { code: 'not_found', message: 'No API route for POST /sessions' } }));
    const { url, server } = await fakeServer('good-token', notYet);
    try {
      const r = await cli(['run', '--device', healthy.url, '--plan', 'edges', '--core', 'reference-16', '--server', url, '--token', 'good-token']);
      expect(r.stdout).toMatch(/limits from the server:\n {2}PASS {2}maxModelMismatches/);
      expect(r.status).toBe(2);
      expect(errorLines(r.stderr)).toEqual(['error: session upload is not available on this server yet']);
    } finally {
      server.close();
    }
  });

  it('exits 2 with the server\u2019s reason when it refuses the upload', async () => {
    const refuse = (res: import('node:http').ServerResponse) =>
      res.writeHead(413, { 'content-type': 'application/json' }).end(JSON.stringify({ error: { code: 'too_large', message: 'The archive is too large' } }));
    const { url, server } = await fakeServer('good-token', refuse);
    try {
      const io = captureIo();
      const code = await runRunCommand(['--device', healthy.url, '--plan', 'edges', '--core', 'reference-16', '--server', url, '--token', 'good-token', '--json'], io);
      expect(code).toBe(2);
      expect(errorLines(io.err)).toEqual(['error: upload refused (413): The archive is too large']);
      expect(JSON.parse(io.out).verdict.passed).toBe(true);
    } finally {
      server.close();
    }
  });
});

describe('the run command on a serial port (@serialport/binding-mock)', { timeout: 30_000 }, () => {
  it('exits 0 for a healthy core and 1 for the sign:5 fault', async () => {
    const good = mockSerialBoard({ baud: 12_000_000 });
    const io = captureIo();
    expect(await runRunCommand(['--device', good.path, ...FAST, '--plan', 'exhaustive', '--core', 'reference-16', '--limits', LIMITS, '--json'], io, { serialBinding: good.binding })).toBe(0);
    expect(JSON.parse(io.out).results).toEqual({ total: 65_536, answered: 65_536, missing: 0 });

    const bad = mockSerialBoard({ baud: 12_000_000, coreFault: parseCoreFault('sign:5') });
    const io2 = captureIo();
    expect(await runRunCommand(['--device', bad.path, ...FAST, '--plan', 'tone:7,1024', '--core', 'reference-16', '--limits', LIMITS], io2, { serialBinding: bad.binding })).toBe(1);
    expect(io2.out).toMatch(/tone: SFDR cos/);
  });

  it('exits 2 naming the port when it does not exist', async () => {
    const io = captureIo();
    const { binding } = mockSerialBoard();
    expect(await runRunCommand(['--device', '/dev/ttyNOPE9', '--plan', 'edges', '--core', 'reference-16'], io, { serialBinding: binding })).toBe(2);
    expect(io.err.trimEnd()).toMatch(/^error: Cannot open \/dev\/ttyNOPE9: .*does not exist/);
  });
});
