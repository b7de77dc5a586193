// The backup's tar writer and reader: what is written reads back byte for byte, names over 100
// bytes use the ustar prefix field, and the system's own tar program (GNU tar on Debian) lists
// and unpacks the result the same way — the format is the POSIX ustar one, not our own.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { extractEntry, listTar, readEntry, TarFormatError, TarWriter } from '../../../server/backup/tar';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'anglebench-tar-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

const longName = `uploads/${'deep-folder/'.repeat(9)}build-12.bit`; // 124 bytes
const bytes = (n: number, seed: number) => Buffer.from(Array.from({ length: n }, (_, i) => (i * 131 + seed) % 256));

async function writeArchive(file: string, entries: Array<[string, Buffer]>) {
  const fh = await fs.promises.open(file, 'wx');
  const tar = new TarWriter(fh);
  for (const [name, data] of entries) {
    if (name.endsWith('.bit')) {
      const src = path.join(dir, `src-${Math.random().toString(16).slice(2)}`);
      fs.writeFileSync(src, data);
      await tar.addFile(name, src);
    } else await tar.addBuffer(name, data);
  }
  await tar.finish();
  await fh.close();
}

describe('the backup tar', () => {
  const entries: Array<[string, Buffer]> = [
    ['anglebench-backup.json', Buffer.from('{"format":"anglebench-backup"}\n')],
    ['empty.txt', Buffer.alloc(0)],
    ['uploads/build-1.bit', bytes(512, 1)], // exactly one block: no padding
    [longName, bytes(70_001, 7)],
  ];
  const file = path.join(dir, 'a.tar');

  it('reads back every entry byte for byte, in order, long names included', async () => {
    await writeArchive(file, entries);
    const listed = await listTar(file);
    expect(listed.map((e) => [e.name, e.size])).toEqual(entries.map(([n, d]) => [n, d.length]));
    for (const [i, e] of listed.entries()) expect((await readEntry(file, e)).equals(entries[i][1])).toBe(true);
    const out = path.join(dir, 'extracted.bit');
    await extractEntry(file, listed[3], out);
    expect(fs.readFileSync(out).equals(entries[3][1])).toBe(true);
  });

  it('is listed and unpacked by the system tar program alike', () => {
    const names = execFileSync('tar', ['-tf', file], { encoding: 'utf8' }).trim().split('\n');
    expect(names).toEqual(entries.map(([n]) => n));
    const unpacked = path.join(dir, 'unpacked');
    fs.mkdirSync(unpacked);
    execFileSync('tar', ['-xf', file, '-C', unpacked]);
    for (const [name, data] of entries) expect(fs.readFileSync(path.join(unpacked, name)).equals(data)).toBe(true);
  });

  it('refuses a file cut short, and a damaged header, with a TarFormatError', async () => {
    const whole = fs.readFileSync(file);
    const cut = path.join(dir, 'cut.tar');
    fs.writeFileSync(cut, whole.subarray(0, 2048));
    await expect(listTar(cut)).rejects.toThrow(TarFormatError);
    const damaged = path.join(dir, 'damaged.tar');
    const copy = Buffer.from(whole);
    copy[10] ^= 0xff; // inside the first entry's name: the checksum no longer matches
    fs.writeFileSync(damaged, copy);
    await expect(listTar(damaged)).rejects.toThrow(/damaged tar header at byte 0/);
  });
});
