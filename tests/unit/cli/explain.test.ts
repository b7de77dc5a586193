import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runExplainCommand } from '../../../cli/explain';
import { runRunCommand } from '../../../cli/run';
import { createSimCore, parseCoreFault } from '../../../mock-device/faulty-core';
import { DEFAULT_MODEL_CONFIG } from '../../../shared/numeric';
import { captureIo, cli, mockSerialBoard } from './run-support';

const dir = mkdtempSync(join(tmpdir(), 'anglebench-explain-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** The CSV import format: a header, then angle_code,cos_code,sin_code for every 16-bit code. */
function csv(spec: string | null, damage: (k: number, cos: number) => number = (_, c) => c): string {
  const sim = createSimCore({}, spec ? parseCoreFault(spec) : undefined);
  const rows = ['angle_code,cos_code,sin_code'];
  for (let k = 0; k < 65_536; k++) {
    const r = sim.evaluate(k);
    rows.push(`${k},${damage(k, r.cos)},${r.sin}`);
  }
  return `${rows.join('\n')}\n`;
}

const MODEL_KEYS = Object.keys(DEFAULT_MODEL_CONFIG).sort();

async function explainCsv(text: string, extra: string[] = ['--config', '{}']) {
  const io = captureIo({ 'answers.csv': text });
  const status = await runExplainCommand(['--samples-file', 'answers.csv', ...extra], io);
  return { status, io };
}

describe('the explain command', { timeout: 120_000 }, () => {
  it('exits 0 with the JSON keys fixed for scripts when a defect reproduces every answer', async () => {
    const { status, io } = await explainCsv(csv('sign-slip:5'));
    expect(status).toBe(0);
    expect(io.err).toBe('');
    const out = JSON.parse(io.out);
    expect(Object.keys(out)).toEqual(['declared', 'answered', 'hypotheses']);
    expect(Object.keys(out.declared).sort()).toEqual(MODEL_KEYS);
    expect(out.answered).toBe(65_536);
    expect(out.hypotheses.length).toBeGreaterThan(0);
    expect(out.hypotheses.length).toBeLessThanOrEqual(10);
    for (const h of out.hypotheses) {
      expect(Object.keys(h)).toEqual(['label', 'config', 'fault', 'exact', 'maxDiffLsb', 'equivalent']);
      expect(Object.keys(h.config).sort()).toEqual(MODEL_KEYS);
    }
    expect(out.hypotheses[0]).toMatchObject({ label: 'iteration 5 turns the wrong way', fault: { kind: 'sign-slip', iteration: 5 }, exact: 65_536, maxDiffLsb: 0 });
    // Best first.
    const exact = out.hypotheses.map((h: { exact: number }) => h.exact);
    expect(exact).toEqual([...exact].sort((a, b) => b - a));
  });

  it('gives a pure configuration deviation "fault": null and its own config', async () => {
    const { status, io } = await explainCsv(csv('iterations=14'));
    expect(status).toBe(0);
    const best = JSON.parse(io.out).hypotheses[0];
    expect(best.fault).toBeNull();
    expect(best.config).toEqual({ ...DEFAULT_MODEL_CONFIG, iterations: 14 });
    expect(best.label).toBe('14 iterations instead of 16');
  });

  it('exits 1 when no hypothesis reproduces every answer', async () => {
    // Two defects at once: iteration 5 turns the wrong way and cos bit 0 is stuck at 1.
    const { status, io } = await explainCsv(csv('sign-slip:5', (_, c) => c | 1));
    expect(status).toBe(1);
    const out = JSON.parse(io.out);
    expect(out.hypotheses.every((h: { exact: number }) => h.exact < 65_536)).toBe(true);
  });

  it('exits 2 with one line on stderr for bad options and input', async () => {
    const bad: [string[], Record<string, string>, RegExp][] = [
      [['--frobnicate'], {}, /^error: Unknown option '--frobnicate'/],
      [['--samples-file', 'a.csv'], { 'a.csv': 'angle_code,cos_code,sin_code\n0,1,2\n' }, /^error: give the core's declared configuration with --config/],
      [['--config', '{}'], {}, /^error: give exactly one of --samples-file, --archive \(got none\)/],
      [['--config', '{}', '--samples-file', 'a.csv', '--archive', 'b'], {}, /^error: give exactly one of --samples-file, --archive \(got --samples-file, --archive\)/],
      [['--config', '{oops', '--samples-file', 'a.csv'], { 'a.csv': 'angle_code,cos_code,sin_code\n0,1,2\n' }, /^error: config: is not valid JSON$/],
      [['--config', '{"outBits":40}', '--samples-file', 'a.csv'], { 'a.csv': 'angle_code,cos_code,sin_code\n0,1,2\n' }, /^error: config\.outBits: /],
      [['--config', '{}', '--samples-file', 'missing.csv'], {}, /^error: samples-file: cannot read missing\.csv \(ENOENT\)$/],
      [['--config', '{}', '--samples-file', 'a.csv'], { 'a.csv': 'angle_code,cos_code,sin_code\n0,16384,0\n1,16384,x\n' }, /^error: samples-file line 3: sin_code "x" is not an integer$/],
      [['--config', '{}', '--samples-file', 'a.csv'], { 'a.csv': 'angle_code,cos_code,sin_code\n0,16384,0\n1,16384\n' }, /^error: samples-file line 3: expected 3 values, found 2$/],
      [['--config', '{}', '--samples-file', 'a.csv'], { 'a.csv': 'angle,cos,sin\n0,16384,0\n' }, /^error: samples-file line 1: the header must be/],
      // A blank line is skipped, and still counted in the line the message names.
      [['--config', '{}', '--samples-file', 'a.csv'], { 'a.csv': 'angle_code,cos_code,sin_code\n0,16384,0\n\n70000,1,1\n' }, /^error: samples-file line 4: angle code 70000 is not 0\.\.65535/],
      [['--config', '{}', '--samples-file', 'a.csv'], { 'a.csv': 'angle_code,cos_code,sin_code\n0,40000,0\n' }, /^error: samples-file line 2: cos code 40000 is not -32768\.\.32767/],
    ];
    for (const [argv, files, message] of bad) {
      const io = captureIo(files);
      expect(await runExplainCommand(argv, io), argv.join(' ')).toBe(2);
      expect(io.out).toBe('');
      expect(io.err.split('\n').filter(Boolean)).toHaveLength(1);
      expect(io.err.trimEnd()).toMatch(message);
    }
  });

  it('refuses a file that is not a capture archive, and one that cannot be read', async () => {
    const junk = join(dir, 'junk.abrc');
    writeFileSync(junk, 'not an archive at all');
    const io = captureIo();
    expect(await runExplainCommand(['--archive', junk], io)).toBe(2);
    expect(io.err).toMatch(/^error: archive: .*junk\.abrc is not a readable capture archive/);
    const io2 = captureIo();
    expect(await runExplainCommand(['--archive', join(dir, 'nothing-here.abrc')], io2)).toBe(2);
    expect(io2.err.trimEnd()).toMatch(/^error: archive: cannot read .*nothing-here\.abrc \(ENOENT\)$/);
  });

  it('explains a run of the simulated board with a catalogue fault from its capture archive', async () => {
    // The board with arctangent entry 4 one LSB low, run exhaustively over a (mock) serial line.
    const board = mockSerialBoard({ baud: 12_000_000, coreFault: parseCoreFault('atan-entry:4:-1') });
    const out = join(dir, 'run.abrc');
    const runIo = captureIo();
    expect(await runRunCommand(['--device', board.path, '--baud', '12000000', '--plan', 'exhaustive', '--core', 'reference-16', '--out', out, '--json'], runIo, { serialBinding: board.binding })).toBe(0);
    expect(JSON.parse(runIo.out).stats.mismatches.count).toBeGreaterThan(0);
    // The archive's label holds the model configuration: no --config needed.
    const io = captureIo();
    expect(await runExplainCommand(['--archive', out], io)).toBe(0);
    const result = JSON.parse(io.out);
    expect(result.answered).toBe(65_536);
    expect(result.hypotheses[0]).toMatchObject({ label: 'arctangent entry 4 is 1 LSB low', fault: { kind: 'atan-entry', iteration: 4, delta: -1 }, exact: 65_536 });
    expect(readFileSync(out).length).toBeGreaterThan(0);
  });

  it('runs as `cli explain` in its own process', async () => {
    const file = join(dir, 'swap.csv');
    writeFileSync(file, csv('swap'));
    const r = await cli(['explain', '--config', '{}', '--samples-file', file], 120_000);
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).hypotheses[0]).toMatchObject({ label: 'cos and sin swapped', fault: { kind: 'swap' } });
    const bad = await cli(['explain', '--config', '{}', '--samples-file', join(dir, 'none.csv')]);
    expect(bad.status).toBe(2);
    expect(bad.stderr.trim().split('\n')).toHaveLength(1);
  });
});
