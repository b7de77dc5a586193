import { describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { accessSync, constants, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { root } from './run-support';

// What a user expects of a command-line tool: `anglebench` on the PATH after an install (the
// package's bin, run here from a directory outside the project as an installed copy would be),
// --version, usage on stderr and exit status 2 when the arguments are wrong.

const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { version: string; bin: Record<string, string>; scripts: Record<string, string> };
const elsewhere = mkdtempSync(join(tmpdir(), 'anglebench-bin-'));

function anglebench(args: string[]): Promise<{ status: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [join(root, pkg.bin.anglebench), ...args], { cwd: elsewhere, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (d: string) => (stdout += d));
    child.stderr.setEncoding('utf8').on('data', (d: string) => (stderr += d));
    child.on('error', reject);
    child.on('close', (status) => resolve({ status, stdout, stderr }));
  });
}

describe('the anglebench command', { timeout: 30_000 }, () => {
  it('is the package\u2019s bin: an executable node script, the npm script kept beside it', () => {
    expect(pkg.bin).toEqual({ anglebench: 'bin/anglebench.js' });
    const launcher = join(root, pkg.bin.anglebench);
    expect(readFileSync(launcher, 'utf8').split('\n')[0]).toBe('#!/usr/bin/env node');
    expect(() => accessSync(launcher, constants.X_OK)).not.toThrow();
    expect(pkg.scripts.cli).toBe('tsx cli/index.ts');
  });

  it('--version prints the package version and exits 0, from any working directory', async () => {
    const r = await anglebench(['--version']);
    expect(r).toEqual({ status: 0, stdout: `${pkg.version}\n`, stderr: '' });
  });

  it('--help prints the usage on stdout and exits 0', async () => {
    const r = await anglebench(['--help']);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/^usage: anglebench <command> \[options\]/);
    expect(r.stdout).toMatch(/^ {2}run {6}/m);
    expect(r.stderr).toBe('');
  });

  it.each([
    ['no command', [], /^usage: anglebench <command>/],
    ['an unknown command', ['launch'], /^error: unknown command "launch" \(known: model, run, bridge, explain\)\nusage: anglebench <command>/],
    ['run without --device', ['run', '--plan', 'edges', '--core', 'reference-16'], /^error: --device is required \(see run --help\)\nusage: anglebench run --device/],
    ['run with an unknown option', ['run', '--devcie', 'x'], /^error: Unknown option '--devcie'.*\nusage: anglebench run /],
    ['bridge without --token', ['bridge', '--device', '/dev/ttyUSB0', '--ws-port', '0'], /^error: --token is required.*\nusage: anglebench bridge /],
  ])('%s: usage on stderr, nothing on stdout, exit 2', async (_what, args, stderr) => {
    const r = await anglebench(args);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(stderr);
  });

  it('run --help states the exit statuses, Ctrl-C included, and the --junit option', async () => {
    const r = await anglebench(['run', '--help']);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/^ {2}--junit FILE {5}write the verdict as JUnit XML/m);
    expect(r.stdout).toContain('130 interrupted by Ctrl-C');
  });
});
