// Unfinished bitstream uploads left in a shared upload folder: a restarted server removes those
// whose writer is gone, and leaves alone those another live server instance is still writing.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { removeAbandonedUploads } from '../../../server/uploads/bitstream-storage';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'anglebench-uploads-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

const host = os.hostname().replace(/[^A-Za-z0-9.]/g, '_');
const uuid = '0f8e4c1a-2b3d-4e5f-8a9b-0c1d2e3f4a5b';
const put = (name: string, ageMs = 0) => {
  const file = path.join(dir, name);
  fs.writeFileSync(file, 'partial');
  const t = new Date(Date.now() - ageMs);
  fs.utimesSync(file, t, t);
};

describe('removeAbandonedUploads', () => {
  it('removes uploads of processes gone from this host and old ones from elsewhere, and keeps the rest', () => {
    // A pid that has just exited: its process is gone.
    const deadPid = spawnSync(process.execPath, ['-e', '0']).pid!;
    const DAY = 24 * 60 * 60 * 1000;
    put(`.incoming-${host}-${deadPid}-${uuid}`);
    put(`.incoming-${host}-${process.ppid}-${uuid}`); // a live process (this test's parent)
    put(`.incoming-other-host-1234-${uuid}`); // another machine's upload in flight
    put(`.incoming-other-host-1235-${uuid}`, 2 * DAY); // another machine's, long abandoned
    put(`.incoming-${uuid}`, 2 * DAY); // the older naming, long abandoned
    put('build-7.bit', 2 * DAY); // a stored bitstream: never touched

    expect(removeAbandonedUploads(dir)).toBe(3);
    expect(fs.readdirSync(dir).sort()).toEqual(['.incoming-other-host-1234-' + uuid, `.incoming-${host}-${process.ppid}-${uuid}`, 'build-7.bit'].sort());
  });

  it('reports nothing removed for a folder that does not exist yet', () => {
    expect(removeAbandonedUploads(path.join(dir, 'never-made'))).toBe(0);
  });
});
