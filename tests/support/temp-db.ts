import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { pgQuery } from '../../server/db/pg-query';

export interface TempDatabase {
  /** A temporary folder of the test's own (uploads, secrets…), removed by `cleanup`. */
  dir: string;
  url: string;
  dialect: 'sqlite' | 'postgres';
  cleanup(): Promise<void>;
}

/**
 * A fresh, empty database for one test file, removed by `cleanup`. A SQLite file in its own
 * temporary folder, or — when ANGLEBENCH_TEST_PG holds a PostgreSQL admin URL (`npm run test:pg`
 * sets it) — a new database with a unique name on that cluster. `dialect` insists on one: SQLite
 * whatever the environment (tests of SQLite's own behaviour), or PostgreSQL (the benchmarks).
 */
export async function tempDatabase(options: { dialect?: 'sqlite' | 'postgres' } = {}): Promise<TempDatabase> {
  const adminUrl = options.dialect === 'sqlite' ? undefined : process.env.ANGLEBENCH_TEST_PG;
  if (options.dialect === 'postgres' && !adminUrl) throw new Error('a PostgreSQL test database needs ANGLEBENCH_TEST_PG (npm run test:pg sets it)');
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'anglebench-test-'));
  const removeDir = () => fs.rmSync(dir, { recursive: true, force: true });
  if (!adminUrl) return { dir, url: `sqlite:${path.join(dir, 'test.sqlite')}`, dialect: 'sqlite', cleanup: async () => removeDir() };

  const name = `anglebench_test_${randomBytes(6).toString('hex')}`;
  await pgQuery(adminUrl, `CREATE DATABASE ${name}`);
  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  return {
    dir,
    url: url.toString(),
    dialect: 'postgres',
    cleanup: async () => {
      // FORCE: a server process killed by the test may have left connections behind.
      await pgQuery(adminUrl, `DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      removeDir();
    },
  };
}
