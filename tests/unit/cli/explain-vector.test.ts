import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runExplainCommand } from '../../../cli/explain';
import { runRunCommand } from '../../../cli/run';
import { defaultBoardSettings } from '../../../mock-device/board-session';
import { startMockServer, type MockServer } from '../../../mock-device/ws-server';
import { createSimVectorCore, parseVectorCoreFault } from '../../../mock-device/vector-core';
import { vectorCsvChunks } from '../../../shared/link-engine/vector-sample-csv';
import { DEFAULT_VECTOR_CONFIG, edgePairs, parseVectorConfig, planVectors } from '../../../shared/vectoring';
import { captureIo, cli } from './run-support';

const dir = mkdtempSync(join(tmpdir(), 'anglebench-explain-vector-'));
// Simulated vectoring boards with a defect, for runs recorded with --out.
let boards: MockServer[] = [];
beforeAll(async () => {
  const settings = { ...defaultBoardSettings(), baud: 12_000_000 };
  const quiet = () => undefined;
  boards = [
    await startMockServer({ ...settings, vector: { core: {}, fault: parseVectorCoreFault('atan-entry:1:+2') } }, 0, '127.0.0.1', quiet),
    await startMockServer({ ...settings, vector: { core: { inBits: 12, angleBits: 14 }, fault: parseVectorCoreFault('iterations=12') } }, 0, '127.0.0.1', quiet),
  ];
});
afterAll(async () => {
  await Promise.all(boards.map((b) => b.close()));
  if (!process.env.KEEP_DIR) rmSync(dir, { recursive: true, force: true });
});

const CONFIG = '{"inBits":12}';
const config = parseVectorConfig(JSON.parse(CONFIG));

/** A session's CSV export of the simulated vectoring board: random vectors, the format's edges and (0, 0). */
function csv(spec: string | null, damage: (k: number, magnitude: number) => number = (_, m) => m): string {
  const sim = createSimVectorCore(config, spec ? parseVectorCoreFault(spec) : undefined);
  const { xs, ys } = planVectors({ kind: 'random', seed: 9, count: 2500 }, config);
  const pairs: [number, number][] = [...edgePairs(config), [0, 0], ...Array.from(xs, (x, i): [number, number] => [x, ys[i]])];
  const angles = new Int32Array(pairs.length);
  const magnitudes = new Int32Array(pairs.length);
  pairs.forEach(([x, y], k) => {
    const r = sim.answer(x, y);
    angles[k] = r.angle;
    magnitudes[k] = damage(k, r.magnitude);
  });
  return [...vectorCsvChunks({ xs: Int32Array.from(pairs, (p) => p[0]), ys: Int32Array.from(pairs, (p) => p[1]), angles, magnitudes })].join('');
}

async function explainCsv(text: string, extra: string[] = ['--mode', 'vectoring', '--config', CONFIG]) {
  const io = captureIo({ 'vectors.csv': text });
  const status = await runExplainCommand(['--samples-file', 'vectors.csv', ...extra], io);
  return { status, io };
}

const VECTOR_KEYS = Object.keys(DEFAULT_VECTOR_CONFIG).sort();

describe('the explain command on a vectoring core', { timeout: 120_000 }, () => {
  it('exits 0 with mode, declared, answered and hypotheses when a defect reproduces every answer', async () => {
    const { status, io } = await explainCsv(csv('stuck-bit:magnitude:2:1'));
    expect(io.err).toBe('');
    expect(status).toBe(0);
    const out = JSON.parse(io.out);
    expect(Object.keys(out)).toEqual(['mode', 'declared', 'answered', 'hypotheses']);
    expect(out.mode).toBe('vectoring');
    expect(out.declared).toEqual(config);
    expect(Object.keys(out.declared).sort()).toEqual(VECTOR_KEYS);
    for (const h of out.hypotheses) expect(Object.keys(h)).toEqual(['label', 'config', 'fault', 'exact', 'maxDiffLsb', 'equivalent']);
    expect(out.hypotheses[0]).toMatchObject({ label: 'magnitude output bit 2 stuck at 1', fault: { kind: 'stuck-bit', channel: 'magnitude', bit: 2, value: 1 }, exact: out.answered, maxDiffLsb: 0 });
  });

  it('gives a configuration deviation "fault": null and its own vectoring config', async () => {
    const { status, io } = await explainCsv(csv('zeroVector=iterate'));
    expect(status).toBe(0);
    const best = JSON.parse(io.out).hypotheses[0];
    expect(best).toMatchObject({ fault: null, label: 'the zero vector goes through the iterations instead of answering 0' });
    expect(best.config).toEqual({ ...config, zeroVector: 'iterate' });
  });

  it('exits 1 when no single hypothesis reproduces every answer', async () => {
    // Iteration 2 turns the wrong way and magnitude bit 0 is stuck at 1 as well.
    const { status, io } = await explainCsv(csv('sign-slip:2', (_, m) => m | 1));
    expect(status).toBe(1);
    const out = JSON.parse(io.out);
    expect(out.hypotheses.every((h: { exact: number }) => h.exact < out.answered)).toBe(true);
  });

  it('exits 2 with one line on stderr for bad options and input', async () => {
    const file = (rows: string) => ({ 'v.csv': `x_code,y_code,angle_code,magnitude_code\n${rows}` });
    const vec = ['--mode', 'vectoring', '--samples-file', 'v.csv'];
    const bad: [string[], Record<string, string>, RegExp][] = [
      [['--mode', 'spiral', '--config', '{}', '--samples-file', 'v.csv'], file('1,1,0,0\n'), /^error: --mode must be rotation or vectoring, got "spiral"$/],
      [vec, file('1,1,0,0\n'), /^error: give the core's declared vectoring configuration with --config/],
      [[...vec, '--config', '{"fold":true}'], file('1,1,0,0\n'), /^error: config\.fold: is not a vectoring configuration key$/],
      [[...vec, '--config', '{"inBits":40}'], file('1,1,0,0\n'), /^error: config\.inBits: /],
      [[...vec, '--config', CONFIG], { 'v.csv': 'angle_code,cos_code,sin_code\n0,1,2\n' }, /^error: samples-file line 1: the header must be/],
      [[...vec, '--config', CONFIG], file('1,1,0\n'), /^error: samples-file line 2: expected 4 values, found 3$/],
      [[...vec, '--config', CONFIG], file('1,1,0,0\n\n3000,0,0,0\n'), /^error: samples-file line 4: x code 3000 is not -2048\.\.2047 \(12 bits\)$/],
      [[...vec, '--config', CONFIG], file('1,1,70000,0\n'), /^error: samples-file line 2: angle code 70000 is not 0\.\.65535/],
      [[...vec, '--config', CONFIG], file('1,1,0,99999\n'), /^error: samples-file line 2: magnitude code 99999 is not -8192\.\.8191 \(14 bits\)$/],
      [['--mode', 'vectoring', '--config', CONFIG, '--archive', join(dir, 'none.abrc')], {}, /^error: archive: cannot read .*none\.abrc \(ENOENT\)$/],
      [[...vec, '--config', CONFIG], {}, /^error: samples-file: cannot read v\.csv \(ENOENT\)$/],
    ];
    for (const [argv, files, message] of bad) {
      const io = captureIo(files);
      expect(await runExplainCommand(argv, io), argv.join(' ')).toBe(2);
      expect(io.out).toBe('');
      expect(io.err.split('\n').filter(Boolean)).toHaveLength(1);
      expect(io.err.trimEnd()).toMatch(message);
    }
  });

  it('explains a vectoring run of the simulated board from its capture archive, the mode and configuration from its label', async () => {
    for (const [board, name, expected] of [
      [boards[0], 'default', { label: 'arctangent entry 1 is 2 LSB high', fault: { kind: 'atan-entry', iteration: 1, delta: 2 } }],
      [boards[1], 'narrow', { label: '12 iterations instead of 16', fault: null }],
    ] as const) {
      const out = join(dir, `${name}.abrc`);
      const runIo = captureIo();
      const ran = await runRunCommand(['--device', board.url, '--baud', '12000000', '--plan', 'grid:4096', '--core', `vec-${name}`, '--out', out, '--json'], runIo, { stderrIsTty: false, interrupt: { requested: false, onRequest: () => () => undefined } });
      expect(runIo.err).not.toMatch(/^error/m);
      // No limits given: the run itself passes, and its answers differ from the declared model.
      expect(ran).toBe(0);
      expect(JSON.parse(runIo.out).stats.mismatches.count).toBeGreaterThan(0);
      const io = captureIo();
      const status = await runExplainCommand(['--archive', out], io);
      expect(io.err).toBe('');
      expect(status).toBe(0);
      const result = JSON.parse(io.out);
      expect(result.mode).toBe('vectoring');
      expect(result.answered).toBe(JSON.parse(runIo.out).results.answered);
      expect(result.hypotheses[0]).toMatchObject({ ...expected, exact: result.answered });
    }
  });

  it('runs as `cli explain --mode vectoring` in its own process', async () => {
    const path = join(dir, 'slip.csv');
    writeFileSync(path, csv('sign-slip:4'));
    const r = await cli(['explain', '--mode', 'vectoring', '--config', CONFIG, '--samples-file', path], 120_000);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).hypotheses[0]).toMatchObject({ label: 'iteration 4 turns the wrong way', fault: { kind: 'sign-slip', iteration: 4 } });
  });
});
