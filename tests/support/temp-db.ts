import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

/** A fresh SQLite file in its own temporary folder, removed by `cleanup`. */
export function tempDatabase() {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'anglebench-test-'));
  return {
    dir,
    url: `sqlite:${path.join(dir, 'test.sqlite')}`,
    cleanup: () => fs.rmSync(dir, { recursive: true, force: true }),
  };
}
