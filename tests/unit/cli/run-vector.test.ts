import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runRunCommand } from '../../../cli/run';
import { scoreArchive, scoreVectorArchive } from '../../../cli/run-record';
import { parseVectorPlanSpec, resolveVectorPlan, vectorPlanToRequest } from '../../../cli/run-vector-plan';
import { parseRunArgs } from '../../../cli/run-options';
import { defaultBoardSettings } from '../../../mock-device/board-session';
import { parseVectorCoreFault } from '../../../mock-device/vector-core';
import { startMockServer, type MockServer } from '../../../mock-device/ws-server';
import { Kind, replayArchive } from '../../../shared/link';
import { expandVectorRequest } from '../../../shared/link-engine/run-request';
import { parseVectorConfig, planVectors } from '../../../shared/vectoring';
import { captureIo } from './run-support';

const FAST = ['--baud', '12000000'];
const LIMITS = JSON.stringify({ maxModelMismatches: 0, maxLinkErrors: 0 });

let vectoring: MockServer;
let slipped: MockServer;
let rotating: MockServer;
/** 12-bit inputs and 20-bit angles (3-byte fields): pairs the default widths would misread. */
let odd: MockServer;
const ODD = { inBits: 12, angleBits: 20 };
const dir = mkdtempSync(join(tmpdir(), 'anglebench-run-vector-'));

beforeAll(async () => {
  const settings = { ...defaultBoardSettings(), baud: 12_000_000 };
  const quiet = () => undefined;
  vectoring = await startMockServer({ ...settings, vector: { core: {} } }, 0, '127.0.0.1', quiet);
  slipped = await startMockServer({ ...settings, vector: { core: { inBits: 12 }, fault: parseVectorCoreFault('sign-slip:3') } }, 0, '127.0.0.1', quiet);
  rotating = await startMockServer(settings, 0, '127.0.0.1', quiet);
  odd = await startMockServer({ ...settings, vector: { core: ODD } }, 0, '127.0.0.1', quiet);
});
afterAll(async () => {
  await vectoring.close();
  await slipped.close();
  await rotating.close();
  await odd.close();
});

const run = async (args: string[], files: Record<string, string> = {}) => {
  const io = captureIo(files);
  const status = await runRunCommand(args, io, { stderrIsTty: false, interrupt: { requested: false, onRequest: () => () => undefined } });
  return { status, out: io.out, err: io.err };
};

describe('run against a vectoring board', { timeout: 60_000 }, () => {
  it('finds the vectoring core in MODE_INFO, runs a grid bit-exact with the model and passes', async () => {
    const r = await run(['--device', vectoring.url, ...FAST, '--plan', 'grid:4096', '--core', 'vec-16', '--limits', LIMITS, '--json']);
    expect(r.err).not.toMatch(/^error/m);
    expect(r.status).toBe(0);
    const s = JSON.parse(r.out);
    expect(s.mode).toBe('vectoring');
    expect(s.device.modes).toEqual({ rotation: false, vectoring: expect.objectContaining({ inBits: 16, magBits: 18 }) });
    expect(s.results).toEqual({ total: 4096, answered: 4096, missing: 0 });
    expect(s.stats.mismatches.count).toBe(0);
    // The default core leaves the magnitude K_n times the input's: errors of a few LSB, never more.
    expect(s.stats.magnitudeLsb.maxAbs).toBeLessThan(8);
    expect(s.stats.angleLsb.count).toBe(4095); // the zero vector has no angle
    expect(s.verdict).toMatchObject({ passed: true, limitsFrom: 'option' });
  });

  it('exits 1 when the board has a sign slip, naming the mismatches; a list plan travels as VEC_LIST', async () => {
    const r = await run(['--device', slipped.url, ...FAST, '--plan', 'random:3000,9', '--core', 'vec-12', '--limits', LIMITS]);
    expect(r.status).toBe(1);
    expect(r.out).toMatch(/model mismatches (\d+)/);
    expect(Number(/model mismatches (\d+)/.exec(r.out)![1])).toBeGreaterThan(2500);
    expect(r.out).toMatch(/FAIL {2}maxModelMismatches/);
    expect(r.out).toMatch(/verdict: FAIL/);
  });

  it('takes vectors from a file and checks --config against the device formats', async () => {
    const files = { 'v.txt': '# x,y\n16384,0\n0,16384\n-16384,-16384 # third quadrant\n0x1000,-0x1000\n' };
    const ok = await run(['--device', vectoring.url, ...FAST, '--plan', 'file:v.txt', '--core', 'vec-16', '--config', '{"iterations":16}', '--json'], files);
    expect(ok.status).toBe(0);
    expect(JSON.parse(ok.out).results).toEqual({ total: 4, answered: 4, missing: 0 });
    const wrong = await run(['--device', vectoring.url, ...FAST, '--plan', 'file:v.txt', '--core', 'vec-16', '--config', '{"inBits":12}'], files);
    expect(wrong.status).toBe(2);
    expect(wrong.err).toMatch(/^error: the device's formats differ from the model of core "vec-16" \(inBits 16 on the device, 12 in the model; inFrac 14 on the device, 10 in the model/m);
    const bad = await run(['--device', vectoring.url, ...FAST, '--plan', 'file:b.txt', '--core', 'vec-16'], { 'b.txt': '1,2\n40000,0\n' });
    expect(bad.status).toBe(2);
    expect(bad.err).toMatch(/b\.txt line 2: x 40000 is not an input code -32768\.\.32767/);
  });

  it('writes the capture with --out, which scores again as a vectoring capture only', async () => {
    const out = join(dir, 'grid.abrc');
    const r = await run(['--device', vectoring.url, ...FAST, '--plan', 'exhaustive', '--core', 'vec-8', '--config', '{"inBits":8}', '--out', out]);
    // An 8-bit board is not what this board has: refused before anything is recorded.
    expect(r.status).toBe(2);
    const r2 = await run(['--device', vectoring.url, ...FAST, '--plan', 'circle:10000,500', '--core', 'vec-16', '--out', out]);
    expect(r2.status).toBe(0);
    const bytes = new Uint8Array(readFileSync(out));
    const replay = replayArchive(bytes);
    const toHost = replay.frames.filter((f) => f.direction === 'to-host').map((f) => f.frame);
    expect(toHost.filter((f) => f.kind === Kind.ModeInfo)).toHaveLength(1);
    // 500 vectors, 5 bytes a pair after a 4-byte firstIndex; with the default widths a replay reads them all.
    const pairs = toHost.filter((f) => f.kind === Kind.VecResults).reduce((n, f) => n + (f.payload.length - 4) / 5, 0);
    expect(pairs).toBe(500);
    expect(replay.skips).toEqual([]);
    expect(JSON.parse(replay.archive.header.label)).toMatchObject({ mode: 'vectoring', plan: { kind: 'circle', radius: 10000, points: 500 } });
    expect(() => scoreArchive(bytes)).toThrow('This archive holds a vectoring run: score it with scoreVectorArchive');
    expect(scoreVectorArchive(bytes).score).toMatchObject({ total: 500, answered: 500, missing: 0 });
  });

  it("keeps a vectoring core's formats in the capture (archive version 2), so a replay reads its VEC_* frames at their own widths", async () => {
    const out = join(dir, 'odd.abrc');
    const r = await run(['--device', odd.url, ...FAST, '--plan', 'grid:1024', '--core', 'vec-odd', '--out', out, '--json']);
    expect(r.err).not.toMatch(/^error/m);
    expect(r.status).toBe(0);
    const bytes = new Uint8Array(readFileSync(out));
    const replay = replayArchive(bytes);
    expect(replay.archive.version).toBe(2);
    const formats = replay.archive.records.flatMap((x) => (x.type === 'vector-formats' ? [x] : []));
    const v = parseVectorConfig(ODD);
    const declared = { inBits: 12, inFrac: v.inFrac, angleFormat: 'turn', angleBits: 20, angleFrac: 0, magBits: v.magBits, magFrac: v.magFrac, iterations: v.iterations };
    expect(formats.map((x) => x.direction).sort()).toEqual(['to-device', 'to-host']);
    for (const x of formats) expect(x.formats).toEqual(declared);
    expect(JSON.parse(r.out).device.modes.vectoring).toEqual(declared);
    // Every frame read back, the 1,024 answers in pairs of 3 bytes of angle and the magnitude's field.
    expect(replay.skips).toEqual([]);
    const pair = 3 + Math.ceil(v.magBits / 8);
    const toHost = replay.frames.filter((f) => f.direction === 'to-host').map((f) => f.frame);
    expect(toHost.filter((f) => f.kind === Kind.VecResults).reduce((n, f) => n + (f.payload.length - 4) / pair, 0)).toBe(1024);
    // Scored again from the archive alone: the run's own figures.
    const again = scoreVectorArchive(bytes);
    const s = JSON.parse(r.out) as { stats: Record<string, unknown>; results: unknown };
    expect(again.label.model).toEqual(v);
    expect({ total: again.score.total, answered: again.score.answered, missing: again.score.missing }).toEqual(s.results);
    expect(JSON.parse(JSON.stringify({ angleLsb: again.score.summary.angleLsb, magnitudeLsb: again.score.summary.magnitudeLsb, mismatches: again.score.summary.mismatches }))).toEqual({
      angleLsb: s.stats.angleLsb,
      magnitudeLsb: s.stats.magnitudeLsb,
      mismatches: s.stats.mismatches,
    });
    expect(again.score.summary.mismatches.count).toBe(0);
  });

  it('with --explain names the board’s sign slip, in the JSON summary and the printed report', async () => {
    const r = await run(['--device', slipped.url, ...FAST, '--plan', 'grid:4096', '--core', 'vec-12', '--explain', '--json']);
    expect(r.err).not.toMatch(/^error/m);
    const s = JSON.parse(r.out);
    expect(s.explanation).toMatchObject({ mode: 'vectoring', answered: s.results.answered, outcome: 'explained' });
    expect(s.explanation.hypotheses[0]).toMatchObject({ label: 'iteration 3 turns the wrong way', fault: { kind: 'sign-slip', iteration: 3 }, exact: s.results.answered });
    const human = await run(['--device', slipped.url, ...FAST, '--plan', 'grid:1024', '--core', 'vec-12', '--explain']);
    expect(human.out).toMatch(/^explanation: iteration 3 turns the wrong way — reproduces 1,024 of 1,024 answers exactly\.$/m);
    // Without --explain the summary has none.
    expect(JSON.parse((await run(['--device', slipped.url, ...FAST, '--plan', 'grid:1024', '--core', 'vec-12', '--json'])).out).explanation).toBeUndefined();
  });

  it('refuses what it cannot do for a vectoring core, and what the board does not serve', async () => {
    const rot = await run(['--device', rotating.url, ...FAST, '--plan', 'edges', '--core', 'r', '--mode', 'vectoring']);
    expect(rot.status).toBe(2);
    expect(rot.err).toMatch(/^error: --mode vectoring: the device at ws:\/\/127\.0\.0\.1:\d+\/ serves no vectoring core \(rotation only\)/m);
    const circle = await run(['--device', rotating.url, ...FAST, '--plan', 'circle:100,10', '--core', 'r']);
    expect(circle.status).toBe(2);
    expect(circle.err).toMatch(/^error: --plan circle:100,10 is a vectoring core's plan, and the board serves a rotating core/m);
    const sweep = await run(['--device', vectoring.url, ...FAST, '--plan', 'sweep:0,1,10', '--core', 'v']);
    expect(sweep.status).toBe(2);
    expect(sweep.err).toMatch(/^error: --plan sweep:0,1,10 is a rotating core's plan, and the board serves a vectoring core/m);
    const rotationLimit = await run(['--device', vectoring.url, ...FAST, '--plan', 'edges', '--core', 'v', '--limits', '{"maxAbsErrorLsb":2}']);
    expect(rotationLimit.status).toBe(2);
    expect(rotationLimit.err).toMatch(/^error: --limits: maxAbsErrorLsb is a limit of rotation cores; a vectoring core's are maxModelMismatches, maxLinkErrors, maxAngleErrorLsb/m);
    expect(() => parseRunArgs(['--device', 'ws://x/', '--plan', 'sweep:0,1,2', '--core', 'v', '--mode', 'vectoring'])).toThrow(/--plan for a vectoring core must be exhaustive, grid:TARGET/);
  });

  it('runs a rotating board exactly as before when no --mode is given', async () => {
    const r = await run(['--device', rotating.url, ...FAST, '--plan', 'sweep:0,16,4096', '--core', 'reference-16', '--limits', LIMITS, '--json']);
    expect(r.status).toBe(0);
    const s = JSON.parse(r.out);
    expect(s.mode).toBeUndefined();
    expect(s.results).toEqual({ total: 4096, answered: 4096, missing: 0 });
    expect(s.link.framesSent).toBe(2); // HELLO and one SWEEP: no MODES asked of a version-1 board
  });
});

describe('vectoring plans as requests', () => {
  it('turns grid and exhaustive plans into VEC_GRID requests that walk the plan in its own order', () => {
    for (const [text, inBits] of [['grid:5000', 16], ['exhaustive', 6], ['grid:10', 4]] as const) {
      const c = parseVectorConfig({ inBits });
      const bound = resolveVectorPlan(parseVectorPlanSpec(text), c, () => '');
      const req = vectorPlanToRequest(bound, c);
      expect(req.kind).toBe('grid');
      const profile = { angleFormat: 'turn', angleBits: 16, outBits: 16, vector: { inBits, angleFormat: 'turn', angleBits: 16, magBits: 18 } } as const;
      const walked = expandVectorRequest(req, profile);
      const planned = planVectors(bound.plan, c);
      expect(walked).toEqual(planned);
    }
  });
});
