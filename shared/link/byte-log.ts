// Growable byte log in fixed blocks (no reallocation of what is written, so a long capture never
// copies itself), and a bounds-checked cursor for reading such bytes back. Helpers for the archive.

const BLOCK_BYTES = 1 << 16;

/** Append-only bytes in 64 KiB blocks, with little-endian and LEB128 writers. */
export class ByteLog {
  private blocks: Uint8Array[] = [];
  private current = new Uint8Array(BLOCK_BYTES);
  private used = 0;
  private full = 0;
  private readonly scratch = new DataView(new ArrayBuffer(8));

  /** Bytes written so far. */
  get length(): number {
    return this.full + this.used;
  }

  u8(v: number): void {
    if (this.used === this.current.length) this.nextBlock();
    this.current[this.used++] = v;
  }

  u16(v: number): void {
    this.u8(v & 0xff);
    this.u8((v >>> 8) & 0xff);
  }

  f64(v: number): void {
    this.scratch.setFloat64(0, v, true);
    for (let i = 0; i < 8; i++) this.u8(this.scratch.getUint8(i));
  }

  /** Unsigned LEB128, for integers 0..2^53−1. */
  varint(v: number): void {
    if (!Number.isSafeInteger(v) || v < 0) throw new RangeError(`varint needs a safe non-negative integer, got ${v}`);
    while (v >= 0x80) {
      this.u8((v % 0x80) | 0x80);
      v = Math.floor(v / 0x80);
    }
    this.u8(v);
  }

  bytes(src: Uint8Array): void {
    let i = 0;
    while (i < src.length) {
      if (this.used === this.current.length) this.nextBlock();
      const n = Math.min(src.length - i, this.current.length - this.used);
      this.current.set(src.subarray(i, i + n), this.used);
      this.used += n;
      i += n;
    }
  }

  /** One contiguous copy of everything written, plus `extra` appended. */
  toBytes(extra: Uint8Array = new Uint8Array(0)): Uint8Array {
    const out = new Uint8Array(this.length + extra.length);
    let o = 0;
    for (const b of this.blocks) {
      out.set(b, o);
      o += b.length;
    }
    out.set(this.current.subarray(0, this.used), o);
    out.set(extra, o + this.used);
    return out;
  }

  private nextBlock(): void {
    this.blocks.push(this.current);
    this.full += this.current.length;
    this.current = new Uint8Array(BLOCK_BYTES);
    this.used = 0;
  }
}

/** Raised by ByteCursor when the bytes end before a field does. */
export class EndOfBytesError extends Error {
  constructor(readonly at: number, readonly needed: number) {
    super(`bytes end at offset ${at}; ${needed} more needed`);
    this.name = 'EndOfBytesError';
  }
}

/** Reads little-endian and LEB128 fields from a Uint8Array, refusing to run past its end. */
export class ByteCursor {
  pos = 0;
  private readonly view: DataView;

  constructor(private readonly src: Uint8Array) {
    this.view = new DataView(src.buffer, src.byteOffset, src.byteLength);
  }

  get remaining(): number {
    return this.src.length - this.pos;
  }

  private need(n: number): void {
    if (this.remaining < n) throw new EndOfBytesError(this.src.length, n - this.remaining);
  }

  u8(): number {
    this.need(1);
    return this.src[this.pos++];
  }

  u16(): number {
    this.need(2);
    const v = this.view.getUint16(this.pos, true);
    this.pos += 2;
    return v;
  }

  f64(): number {
    this.need(8);
    const v = this.view.getFloat64(this.pos, true);
    this.pos += 8;
    return v;
  }

  varint(): number {
    let v = 0;
    let scale = 1;
    for (;;) {
      const b = this.u8();
      v += (b & 0x7f) * scale;
      if (b < 0x80) return v;
      scale *= 0x80;
      if (scale > 2 ** 56) throw new RangeError(`varint too long at offset ${this.pos}`);
    }
  }

  /** A view (no copy) of the next n bytes. */
  bytes(n: number): Uint8Array {
    this.need(n);
    const out = this.src.subarray(this.pos, this.pos + n);
    this.pos += n;
    return out;
  }
}
