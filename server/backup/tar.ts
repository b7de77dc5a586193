// The few parts of the POSIX tar format (ustar) a backup needs: regular files only, written and
// read in order, streamed from and to disk so a database of any size is never held in memory.
// Any tar program lists and unpacks the result (`tar -tvf backup.tar`). Sizes of 8 GiB and more
// use the base-256 size field GNU tar and bsdtar read.
import fs from 'node:fs';
import type { FileHandle } from 'node:fs/promises';
import { pipeline } from 'node:stream/promises';

const BLOCK = 512;
const COPY_CHUNK = 1 << 20;

export class TarFormatError extends Error {
  override name = 'TarFormatError';
}

function writeField(h: Buffer, offset: number, length: number, text: string) {
  const bytes = Buffer.from(text, 'utf8');
  if (bytes.length > length) throw new TarFormatError(`tar field too long: ${text}`);
  bytes.copy(h, offset);
}

const octal = (h: Buffer, offset: number, length: number, value: number) => writeField(h, offset, length, `${value.toString(8).padStart(length - 1, '0')}\0`);

function header(name: string, size: number, mtimeMs: number): Buffer {
  const h = Buffer.alloc(BLOCK);
  // Names over 100 bytes split at a slash into the 155-byte prefix field.
  let prefix = '';
  let rest = name;
  if (Buffer.byteLength(name) > 100) {
    const cut = name.lastIndexOf('/', 155);
    if (cut <= 0 || Buffer.byteLength(name.slice(cut + 1)) > 100) throw new TarFormatError(`name too long for a tar entry: ${name}`);
    prefix = name.slice(0, cut);
    rest = name.slice(cut + 1);
  }
  writeField(h, 0, 100, rest);
  octal(h, 100, 8, 0o644);
  octal(h, 108, 8, 0);
  octal(h, 116, 8, 0);
  if (size < 8 ** 11) octal(h, 124, 12, size);
  else {
    h[124] = 0x80; // base-256: the remaining 11 bytes big-endian
    let v = BigInt(size);
    for (let i = 135; i > 124; i--, v >>= 8n) h[i] = Number(v & 0xffn);
  }
  octal(h, 136, 12, Math.floor(mtimeMs / 1000));
  h.fill(0x20, 148, 156); // the checksum counts its own field as spaces
  h[156] = 0x30; // '0': a regular file
  writeField(h, 257, 6, 'ustar\0');
  writeField(h, 263, 2, '00');
  writeField(h, 345, 155, prefix);
  writeField(h, 148, 8, `${checksum(h).toString(8).padStart(6, '0')}\0 `);
  return h;
}

const checksum = (h: Buffer) => {
  let sum = 0;
  for (let i = 0; i < BLOCK; i++) sum += i >= 148 && i < 156 ? 0x20 : h[i];
  return sum;
};

const padding = (size: number) => (BLOCK - (size % BLOCK)) % BLOCK;

/** Appends entries to an open file; `finish` writes the end-of-archive marker. */
export class TarWriter {
  constructor(private readonly out: FileHandle) {}

  async addBuffer(name: string, data: Buffer, mtimeMs = Date.now()): Promise<void> {
    await this.out.write(header(name, data.length, mtimeMs));
    await this.out.write(data);
    await this.out.write(Buffer.alloc(padding(data.length)));
  }

  /** Copies the file as it is when opened: exactly the size it had then. */
  async addFile(name: string, source: string): Promise<number> {
    const src = await fs.promises.open(source, 'r');
    try {
      const { size, mtimeMs } = await src.stat();
      await this.out.write(header(name, size, mtimeMs));
      const buf = Buffer.alloc(Math.min(COPY_CHUNK, Math.max(size, 1)));
      for (let done = 0; done < size; ) {
        const { bytesRead } = await src.read(buf, 0, Math.min(buf.length, size - done), done);
        if (bytesRead === 0) throw new Error(`${source} shrank while it was copied`);
        await this.out.write(buf.subarray(0, bytesRead));
        done += bytesRead;
      }
      await this.out.write(Buffer.alloc(padding(size)));
      return size;
    } finally {
      await src.close();
    }
  }

  async finish(): Promise<void> {
    await this.out.write(Buffer.alloc(2 * BLOCK));
  }
}

export interface TarEntry {
  name: string;
  size: number;
  /** Where the entry's bytes start in the archive. */
  offset: number;
}

function readSize(h: Buffer): number {
  if (h[124] & 0x80) {
    let v = 0n;
    for (let i = 125; i < 136; i++) v = (v << 8n) | BigInt(h[i]);
    return Number(v);
  }
  return parseOctal(h, 124, 12);
}

function parseOctal(h: Buffer, offset: number, length: number): number {
  const text = h.toString('latin1', offset, offset + length).replace(/[\0 ]+$/, '').trim();
  if (!/^[0-7]*$/.test(text)) throw new TarFormatError('not a tar file (a number field is not octal)');
  return text ? parseInt(text, 8) : 0;
}

const cString = (h: Buffer, offset: number, length: number) => {
  const end = h.indexOf(0, offset);
  return h.toString('utf8', offset, end === -1 || end > offset + length ? offset + length : end);
};

/** The regular files of the archive at `file`, in order. @throws TarFormatError when it is not one. */
export async function listTar(file: string): Promise<TarEntry[]> {
  const fh = await fs.promises.open(file, 'r');
  try {
    const { size: total } = await fh.stat();
    const entries: TarEntry[] = [];
    const h = Buffer.alloc(BLOCK);
    for (let pos = 0; ; ) {
      if (pos + BLOCK > total) throw new TarFormatError('the archive ends without its end marker (cut short?)');
      await fh.read(h, 0, BLOCK, pos);
      if (h.every((b) => b === 0)) return entries;
      if (parseOctal(h, 148, 8) !== checksum(h)) throw new TarFormatError(`damaged tar header at byte ${pos}`);
      const prefix = cString(h, 345, 155);
      const name = (prefix ? `${prefix}/` : '') + cString(h, 0, 100);
      const size = readSize(h);
      const type = String.fromCharCode(h[156] || 0x30);
      if (pos + BLOCK + size > total) throw new TarFormatError(`the archive is cut short inside ${name}`);
      if (type === '0') entries.push({ name, size, offset: pos + BLOCK });
      pos += BLOCK + size + padding(size);
    }
  } finally {
    await fh.close();
  }
}

/** Writes one entry's bytes to `dest` (created; never overwritten). */
export async function extractEntry(file: string, entry: TarEntry, dest: string): Promise<void> {
  if (entry.size === 0) return fs.promises.writeFile(dest, Buffer.alloc(0), { flag: 'wx' });
  await pipeline(fs.createReadStream(file, { start: entry.offset, end: entry.offset + entry.size - 1 }), fs.createWriteStream(dest, { flags: 'wx' }));
}

export async function readEntry(file: string, entry: TarEntry): Promise<Buffer> {
  const fh = await fs.promises.open(file, 'r');
  try {
    const buf = Buffer.alloc(entry.size);
    await fh.read(buf, 0, entry.size, entry.offset);
    return buf;
  } finally {
    await fh.close();
  }
}
