// The runner saving vectoring sessions: a vectoring core created through the API, simulated
// vectoring boards (healthy, then with a sign slip) run with --server, and the stored session's
// verdict is the runner's own, limit by limit. --junit names the failing limit and the session.
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runRunCommand } from '../../cli/run';
import { createInterrupt } from '../../cli/interrupt';
import { BenchSession } from '../../server/db/models';
import { defaultBoardSettings } from '../../mock-device/board-session';
import { parseVectorCoreFault } from '../../mock-device/vector-core';
import { startMockServer, type MockServer } from '../../mock-device/ws-server';
import { VECTOR_SAMPLE_BYTES } from '../../shared/link-engine/vector-sample-pack';
import { captureIo } from '../unit/cli/run-support';
import { childrenNamed, parseXml } from '../support/xml';
import { testApp, type TestApp } from '../support/test-app';

// A 12-bit board and core: the server's configuration must be the board's (MODE_INFO is checked against it).
const CONFIG = { inBits: 12 };
const LIMITS = { maxModelMismatches: 0, maxLinkErrors: 0, minPlaneCoveragePct: 90 };

let t: TestApp;
let http: Server;
let serverUrl: string;
let token: string;
let healthy: MockServer;
let slipped: MockServer;
let rotating: MockServer;

beforeAll(async () => {
  t = await testApp();
  http = createServer(t.app);
  await new Promise<void>((r) => http.listen(0, '127.0.0.1', r));
  serverUrl = `http://127.0.0.1:${(http.address() as AddressInfo).port}`;
  const engineer = await t.signInAs('engineer');
  await engineer.post('/api/cores').send({ name: 'Phase detector', slug: 'phase-det', mode: 'vectoring', vectorConfig: CONFIG, limits: LIMITS, linkProfile: { baud: 12_000_000 } }).expect(201);
  await engineer.post('/api/cores').send({ name: 'Sine table', slug: 'sine-16', linkProfile: { baud: 12_000_000 }, limits: { maxModelMismatches: 0 } }).expect(201);
  token = (await engineer.post('/api/tokens').send({ name: 'ci' }).expect(201)).body.token;
  const settings = { ...defaultBoardSettings(), baud: 12_000_000 };
  const quiet = () => undefined;
  healthy = await startMockServer({ ...settings, vector: { core: CONFIG } }, 0, '127.0.0.1', quiet);
  slipped = await startMockServer({ ...settings, vector: { core: CONFIG, fault: parseVectorCoreFault('sign-slip:3') } }, 0, '127.0.0.1', quiet);
  rotating = await startMockServer(settings, 0, '127.0.0.1', quiet);
});

afterAll(async () => {
  await healthy?.close();
  await slipped?.close();
  await rotating?.close();
  await new Promise((r) => http?.close(r));
  await t?.close();
});

/** The runner in-process against the real server, keeping what it would write to files. */
async function run(device: string, core: string, extra: string[] = [], plan = 'grid:4096') {
  const files = new Map<string, Uint8Array>();
  const io = captureIo();
  const status = await runRunCommand(['--device', device, '--plan', plan, '--core', core, '--server', serverUrl, '--token', token, ...extra], io, {
    stderrIsTty: false,
    writeFile: (path, bytes) => files.set(path, bytes),
    interrupt: createInterrupt(),
  });
  return { status, out: io.out, err: io.err, files };
}

interface RunnerCheck {
  key: string;
  limit: number;
  value: number | null;
  outcome: 'pass' | 'fail' | 'skip';
}

/** The stored session's verdict equals the runner's, limit by limit. */
async function expectSameVerdict(sessionId: number, runner: { passed: boolean; checks: RunnerCheck[] }) {
  const stored = await BenchSession.findByPk(sessionId);
  expect(stored).not.toBeNull();
  expect(stored!.passed).toBe(runner.passed);
  const verdict = stored!.verdict as Record<string, { limit: number; measured: number | null; pass: boolean | null }>;
  expect(Object.keys(verdict).sort()).toEqual(runner.checks.map((c) => c.key).sort());
  for (const c of runner.checks) {
    expect(verdict[c.key].pass, c.key).toBe(c.outcome === 'skip' ? null : c.outcome === 'pass');
    expect(verdict[c.key].limit, c.key).toBe(c.limit);
    if (c.value === null) expect(verdict[c.key].measured, c.key).toBeNull();
    else expect(verdict[c.key].measured, c.key).toBeCloseTo(c.value, 9);
  }
  return stored!;
}

describe('the runner saving vectoring sessions', { timeout: 90_000 }, () => {
  it('uploads a healthy board\u2019s run with the core\u2019s configuration and limits; the stored verdict is the runner\u2019s', async () => {
    const r = await run(healthy.url, 'phase-det', ['--json', '--out', 'grid.abrc']);
    expect(r.err).not.toMatch(/^error/m);
    expect(r.status).toBe(0);
    // The progress line counts vectors, not codes.
    expect(r.err).toMatch(/^progress: .* vectors, /m);
    expect(r.err).not.toMatch(/ codes, /);
    const s = JSON.parse(r.out);
    expect(s).toMatchObject({ mode: 'vectoring', modelFrom: 'server', model: { inBits: 12, inFrac: 10 }, verdict: { passed: true, limitsFrom: 'server' } });
    expect(s.verdict.checks.map((c: RunnerCheck) => c.key)).toEqual(['maxModelMismatches', 'maxLinkErrors', 'minPlaneCoveragePct']);
    expect(s.upload.sessionId).toEqual(expect.any(Number));
    const stored = await expectSameVerdict(s.upload.sessionId, s.verdict);
    expect(stored.sampleCount).toBe(4096);
    expect(stored.samples?.length).toBe(4096 * VECTOR_SAMPLE_BYTES);
    // The capture uploaded is the one written with --out.
    expect(stored.archive && Buffer.compare(stored.archive, Buffer.from(r.files.get('grid.abrc')!))).toBe(0);
    expect((stored.stats as { vectoring: { mismatches: { count: number } } }).vectoring.mismatches.count).toBe(0);
  });

  it('prints the saved session\u2019s address after the table, as a rotation run does', async () => {
    const r = await run(healthy.url, 'phase-det');
    expect(r.status, r.err).toBe(0);
    expect(r.out).toMatch(/^model from the server$/m);
    expect(r.out).toMatch(/^verdict: PASS$/m);
    const m = new RegExp(`^session uploaded: ${serverUrl.replace(/\./g, '\\.')}/sessions/(\\d+)$`, 'm').exec(r.out);
    expect(m).not.toBeNull();
    expect((await BenchSession.findByPk(Number(m![1])))?.passed).toBe(true);
  });

  it('exits 1 for a sign slip, the stored session failing on the same limit; --junit names it and the session', async () => {
    const r = await run(slipped.url, 'phase-det', ['--json', '--junit', 'report.xml']);
    expect(r.status, r.err).toBe(1);
    const s = JSON.parse(r.out);
    expect(s.verdict.passed).toBe(false);
    const failing = s.verdict.checks.filter((c: RunnerCheck) => c.outcome === 'fail').map((c: RunnerCheck) => c.key);
    expect(failing).toEqual(['maxModelMismatches']);
    await expectSameVerdict(s.upload.sessionId, s.verdict);

    const root = parseXml(new TextDecoder().decode(r.files.get('report.xml')!));
    const [suite] = childrenNamed(root, 'testsuite');
    expect(suite.attributes).toMatchObject({ name: 'anglebench run: phase-det', tests: '3', failures: '1', skipped: '0' });
    const cases = childrenNamed(suite, 'testcase');
    expect(cases.map((c) => c.attributes.name)).toEqual(['maxModelMismatches: Model mismatches', 'maxLinkErrors: Link errors', 'minPlaneCoveragePct: Plane coverage']);
    const [failure] = childrenNamed(cases[0], 'failure');
    const mismatches = (s.stats.mismatches as { count: number }).count;
    expect(mismatches).toBeGreaterThan(0);
    expect(failure.attributes.message).toBe(`measured ${mismatches} results, allowed at most 0 results`);
    const props = Object.fromEntries(childrenNamed(childrenNamed(suite, 'properties')[0], 'property').map((p) => [p.attributes.name, p.attributes.value]));
    expect(props).toMatchObject({ session: `${serverUrl}/sessions/${s.upload.sessionId}`, core: 'phase-det', answered: '4096 of 4096' });
  });

  it('refuses a rotation core named for a vectoring board, and the reverse, in one line with exit 2, storing nothing', async () => {
    const before = await BenchSession.count();
    const rot = await run(healthy.url, 'sine-16');
    expect(rot.status).toBe(2);
    expect(rot.err).toMatch(/^error: core "sine-16" on the server is a rotation core, and the device at ws:\/\/127\.0\.0\.1:\d+\/ serves a vectoring core \(vectoring only\): is the right bitstream loaded, or the right --core named\?\n$/m);
    const vec = await run(rotating.url, 'phase-det');
    expect(vec.status).toBe(2);
    expect(vec.err).toMatch(/^error: core "phase-det" on the server is a vectoring core, and the device at ws:\/\/127\.0\.0\.1:\d+\/ serves a rotating core \(rotation only\)/m);
    const mode = await run(healthy.url, 'phase-det', ['--mode', 'rotation'], 'edges');
    expect(mode.status).toBe(2);
    expect(mode.err).toMatch(/^error: --mode rotation: core "phase-det" on the server is a vectoring core$/m);
    const limits = await run(healthy.url, 'phase-det', ['--limits', '{"maxRmsErrorLsb":1}']);
    expect(limits.status).toBe(2);
    expect(limits.err).toMatch(/^error: --limits: maxRmsErrorLsb is a limit of rotation cores; a vectoring core's are /m);
    // The server keeps no vectoring soak: refused before the first pass, nothing asked of the board.
    const soak = await run(healthy.url, 'phase-det', ['--soak', '3']);
    expect(soak.status).toBe(2);
    expect(soak.err).toMatch(/^error: --soak with --server: the server does not keep the soaks of vectoring cores yet; run the soak without --server/m);
    expect(soak.err).not.toMatch(/soak pass/);
    expect(await BenchSession.count()).toBe(before);
  });
});
