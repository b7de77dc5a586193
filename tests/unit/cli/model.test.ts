import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createCordicModel, DEFAULT_MODEL_CONFIG } from '../../../shared/numeric';

const root = fileURLToPath(new URL('../../..', import.meta.url));
const tsx = join(root, 'node_modules/.bin/tsx');

function cli(...args: string[]) {
  const r = spawnSync(tsx, ['cli/index.ts', ...args], { cwd: root, encoding: 'utf8', timeout: 30_000 });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

function expectOneLineError(r: ReturnType<typeof cli>, pattern: RegExp) {
  expect(r.status).toBe(2);
  expect(r.stdout).toBe('');
  expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
  expect(r.stderr).toMatch(pattern);
}

// Each check starts a process or three (about a second each): give them room on a busy machine.
describe('the model command', { timeout: 30_000 }, () => {
  it('prints every configuration key with defaults filled and the model results, through the npm script', () => {
    const r = spawnSync('npm', ['run', '--silent', 'cli', '--', 'model', '--config', '{"iterations":12}', '--codes', '0,1,2'], { cwd: root, encoding: 'utf8', timeout: 30_000 });
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.config).toEqual({ ...DEFAULT_MODEL_CONFIG, iterations: 12 });
    const m = createCordicModel({ iterations: 12 });
    expect(out.results).toEqual([0, 1, 2].map((code) => ({ code, ...m.evaluate(code) })));
  });

  it('reads one code a line from a file, hex and negative codes included', () => {
    const dir = mkdtempSync(join(tmpdir(), 'anglebench-cli-'));
    const file = join(dir, 'codes.txt');
    writeFileSync(file, '-4096\n\n0x10\n4096\n');
    const r = cli('model', '--config', '{"angleFormat":"rad"}', '--codes-file', file);
    expect(r.status).toBe(0);
    const m = createCordicModel({ angleFormat: 'rad' });
    expect(JSON.parse(r.stdout).results).toEqual([-4096, 16, 4096].map((code) => ({ code, ...m.evaluate(code) })));
  });

  it('evaluates every code in order for --plan exhaustive', () => {
    const r = cli('model', '--config', '{"angleBits":10,"outBits":12,"outFrac":10}', '--plan', 'exhaustive');
    expect(r.status).toBe(0);
    const results = JSON.parse(r.stdout).results as { code: number; cos: number; sin: number }[];
    expect(results.map((x) => x.code)).toEqual(Array.from({ length: 1024 }, (_, i) => i));
    // A quarter turn: cos ≈ 0 and sin ≈ 1.0 = 2^10 within a few LSB (the core's error bound).
    expect(Math.abs(results[256].cos)).toBeLessThan(4);
    expect(Math.abs(results[256].sin - 1024)).toBeLessThan(4);
  });

  it('names the configuration key at fault in one line and exits 2', () => {
    expectOneLineError(cli('model', '--config', '{"outBits":40}', '--codes', '0'), /config\.outBits/);
    expectOneLineError(cli('model', '--config', '{"gain":1.6}', '--codes', '0'), /config\.gain/);
    expectOneLineError(cli('model', '--config', '{not json', '--codes', '0'), /config/);
  });

  it('names the code at fault in one line and exits 2', () => {
    expectOneLineError(cli('model', '--codes', '0,65536'), /codes\[1\].*65536/);
    expectOneLineError(cli('model', '--codes', '1,two'), /codes\[1\]/);
    const dir = mkdtempSync(join(tmpdir(), 'anglebench-cli-'));
    const file = join(dir, 'codes.txt');
    writeFileSync(file, '1\n2\n1.5\n');
    expectOneLineError(cli('model', '--codes-file', file), /codes-file line 3/);
  });

  it('asks for exactly one source of codes', () => {
    expectOneLineError(cli('model'), /exactly one of --codes, --codes-file, --plan/);
    expectOneLineError(cli('model', '--codes', '1', '--plan', 'edges'), /exactly one/);
    expectOneLineError(cli('model', '--plan', 'spiral'), /plan\.kind/);
  });
});
