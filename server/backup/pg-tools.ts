// Finding and running PostgreSQL's own client programs (pg_dump, pg_restore) for backups.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

export class ToolMissing extends Error {
  override name = 'ToolMissing';
}

/**
 * `name` on PATH (Debian's /usr/bin wrapper picks the newest installed version), else in PG_BIN,
 * else the newest /usr/lib/postgresql/<version>/bin. @throws ToolMissing naming what to install.
 */
export function findPgTool(name: 'pg_dump' | 'pg_restore'): string {
  const dirs = [...(process.env.PATH ?? '').split(path.delimiter), process.env.PG_BIN ?? ''];
  const debian = '/usr/lib/postgresql';
  if (fs.existsSync(debian)) dirs.push(...fs.readdirSync(debian).sort((a, b) => Number(b) - Number(a)).map((v) => path.join(debian, v, 'bin')));
  for (const dir of dirs) {
    const candidate = dir && path.join(dir, name);
    if (candidate && fs.existsSync(candidate)) return candidate;
  }
  throw new ToolMissing(
    `${name} was not found: install PostgreSQL's client programs of the server's major version or newer (Debian: apt-get install postgresql-client), or set PG_BIN to their folder`,
  );
}

/** Runs a program to the end; rejects with its last lines of stderr when it fails. */
export function runTool(program: string, args: string[]): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(program, args, { stdio: ['ignore', 'ignore', 'pipe'] });
    let stderr = '';
    child.stderr.on('data', (d) => (stderr += d));
    child.once('error', reject);
    child.once('exit', (code, signal) => {
      if (code === 0) return resolve();
      const tail = stderr.trim().split('\n').slice(-3).join(' | ');
      reject(new Error(`${path.basename(program)} failed (${signal ?? `exit ${code}`}): ${tail}`));
    });
  });
}
