// Streaming frame decoder. Bytes are scanned in place where possible; only the tail of an
// incomplete frame (at most 259 bytes) waits in an internal buffer that grows by doubling and is
// compacted lazily, so cost stays linear in the bytes received whatever the chunking.
//
// Every byte received ends up in exactly one frame or one skip event (once finish() is called),
// so a link engine can add up `bytes` over events to report skipped bytes.
import { crc8, DEFAULT_CRC8, type Crc8, type Crc8Name } from './crc8';
import { HEADER_BYTES, FRAME_OVERHEAD, SYNC } from './frame';
import { isKnownKind, REPLY_KINDS, REQUEST_KINDS } from './kinds';
import { DEFAULT_PROFILE, isPossibleLength, validateProfile, type WireProfile } from './wire-profile';

const INITIAL_CAPACITY = 1024;
const SHRINK_ABOVE = 1 << 16;

/** A frame whose CHECK matched. `offset` is the stream position of its SYNC byte. */
export interface DecodedFrame {
  kind: number;
  tag: number;
  /** A copy: it stays valid after the callback returns. */
  payload: Uint8Array;
  check: number;
  offset: number;
}

/**
 * Why bytes were skipped: `garbage` (a run of bytes before a SYNC), `bad-check`, `bad-length`
 * (impossible LEN for the KIND), `unknown-kind`, or `truncated` (finish() found a frame that
 * never completed). For all but `garbage` only the SYNC byte is skipped (bytes = 1) and the
 * hunt goes on from the next byte.
 */
export type SkipReason = 'garbage' | 'bad-check' | 'bad-length' | 'unknown-kind' | 'truncated';

/** A run of skipped bytes. Header fields are present when they had arrived. */
export interface SkipEvent {
  reason: SkipReason;
  /** Stream position of the first skipped byte. */
  offset: number;
  /** Number of bytes skipped. */
  bytes: number;
  kind?: number;
  tag?: number;
  len?: number;
  /** For bad-check: the CHECK received and the one computed. */
  check?: number;
  expected?: number;
}

/** Which KINDs the decoder takes as known: a host hears replies, a device hears requests. */
export type AcceptedKinds = 'replies' | 'requests' | 'all';

/** Options of FrameDecoder. */
export interface FrameDecoderOptions {
  /** Called for each good frame, in stream order. */
  onFrame: (frame: DecodedFrame) => void;
  /** Called for each skipped run, in stream order. Default: ignore. */
  onSkip?: (event: SkipEvent) => void;
  /** CHECK variant. Default CRC-8/SMBUS. */
  crc?: Crc8Name;
  /** Sizes the LEN check of ONE, LIST and RESULTS. Default: turn, 16-bit angles, 16-bit outputs. */
  profile?: WireProfile;
  /** Default `all`. A list of KIND codes: exactly those (a board that serves only some modes). */
  accept?: AcceptedKinds | readonly number[];
}

/** Raised when push() is called from inside a decoder callback. */
export class DecoderReentryError extends Error {
  constructor() {
    super('FrameDecoder.push/finish called from inside its own callback');
    this.name = 'DecoderReentryError';
  }
}

/** Incremental decoder: `push(bytes)` any chunking; frames and skips arrive through callbacks. */
export class FrameDecoder {
  private readonly onFrame: (frame: DecodedFrame) => void;
  private readonly onSkip: (event: SkipEvent) => void;
  private readonly crc: Crc8;
  private readonly known = new Uint8Array(256);
  /** lengthOk[kind * 256 + len] = 1 when LEN is possible for KIND under the current profile. */
  private lengthOk = new Uint8Array(65536);
  private currentProfile: WireProfile;
  private buf = new Uint8Array(INITIAL_CAPACITY);
  private start = 0;
  private end = 0;
  private received = 0;
  private garbageOffset = 0;
  private garbageBytes = 0;
  private busy = false;
  private frames = 0;
  private skipped = 0;

  constructor(options: FrameDecoderOptions) {
    if (typeof options.onFrame !== 'function') throw new TypeError('FrameDecoder option "onFrame" must be a function');
    this.onFrame = options.onFrame;
    this.onSkip = options.onSkip ?? (() => {});
    this.crc = crc8(options.crc ?? DEFAULT_CRC8);
    const accept = options.accept ?? 'all';
    if (Array.isArray(accept)) {
      for (const k of accept as readonly number[]) {
        if (!isKnownKind(k)) throw new TypeError(`FrameDecoder option "accept" lists ${String(k)}, which is no KIND of the bench link`);
        this.known[k] = 1;
      }
    } else {
      if (accept !== 'all' && accept !== 'replies' && accept !== 'requests') {
        throw new TypeError(`FrameDecoder option "accept" must be all, replies, requests or a list of KINDs, got ${String(accept)}`);
      }
      for (const k of accept === 'requests' ? REQUEST_KINDS : accept === 'replies' ? REPLY_KINDS : [...REQUEST_KINDS, ...REPLY_KINDS]) this.known[k] = 1;
    }
    this.currentProfile = DEFAULT_PROFILE;
    this.setProfile(options.profile ?? DEFAULT_PROFILE);
  }

  /** The profile the LEN check uses now. */
  get profile(): WireProfile {
    return this.currentProfile;
  }

  /** Total bytes pushed so far (the stream position of the next byte). */
  get bytesReceived(): number {
    return this.received;
  }

  /** Bytes held back: an incomplete frame, not yet a frame or a skip. */
  get pendingBytes(): number {
    return this.end - this.start;
  }

  /** Good frames delivered so far. */
  get framesDecoded(): number {
    return this.frames;
  }

  /** Bytes reported in skip events so far. */
  get bytesSkipped(): number {
    return this.skipped;
  }

  /**
   * Changes the profile (e.g. after INFO). Safe inside onFrame: the new LEN rules apply from the
   * byte after the current frame.
   */
  setProfile(profile: WireProfile): void {
    const p = { ...validateProfile(profile) };
    const ok = new Uint8Array(65536);
    for (let kind = 0; kind < 256; kind++) {
      if (!this.known[kind]) continue;
      for (let len = 0; len < 256; len++) if (isPossibleLength(kind, len, p)) ok[kind * 256 + len] = 1;
    }
    this.lengthOk = ok;
    this.currentProfile = p;
  }

  /** Takes the next chunk of the stream, of any size. */
  push(bytes: Uint8Array): void {
    if (this.busy) throw new DecoderReentryError();
    this.busy = true;
    try {
      const n = bytes.length;
      if (this.start === this.end) {
        const stop = this.scan(bytes, 0, n, this.received);
        this.received += n;
        this.start = 0;
        this.end = 0;
        if (stop < n) this.append(bytes.subarray(stop));
      } else {
        this.append(bytes);
        this.received += n;
        this.start = this.scan(this.buf, this.start, this.end, this.received - this.end);
      }
      if (this.start === this.end) {
        this.start = 0;
        this.end = 0;
      }
      // A huge chunk may have grown the buffer; give the memory back once the tail is small.
      if (this.buf.length > SHRINK_ABOVE && this.end - this.start <= INITIAL_CAPACITY) {
        const small = new Uint8Array(INITIAL_CAPACITY);
        small.set(this.buf.subarray(this.start, this.end));
        this.end -= this.start;
        this.start = 0;
        this.buf = small;
      }
    } finally {
      this.busy = false;
    }
  }

  /**
   * Ends the stream: a frame still incomplete loses its SYNC (a `truncated` event) and the hunt
   * goes on through what remains, then the last garbage run is reported. Pushing may go on.
   */
  finish(): void {
    if (this.busy) throw new DecoderReentryError();
    this.busy = true;
    try {
      const base = () => this.received - this.end;
      while (this.start < this.end) {
        const i = this.start;
        const have = this.end - i;
        const b = this.buf;
        this.flushGarbage();
        this.skip({
          reason: 'truncated',
          offset: base() + i,
          bytes: 1,
          ...(have > 1 ? { kind: b[i + 1] } : {}),
          ...(have > 2 ? { tag: b[i + 2] } : {}),
          ...(have > 3 ? { len: b[i + 3] } : {}),
        });
        this.start = this.scan(b, i + 1, this.end, base());
      }
      this.start = 0;
      this.end = 0;
      this.flushGarbage();
    } finally {
      this.busy = false;
    }
  }

  private append(bytes: Uint8Array): void {
    const pending = this.end - this.start;
    if (this.end + bytes.length > this.buf.length) {
      let cap = this.buf.length;
      while (cap < pending + bytes.length) cap *= 2;
      if (cap === this.buf.length) {
        this.buf.copyWithin(0, this.start, this.end);
      } else {
        const next = new Uint8Array(cap);
        next.set(this.buf.subarray(this.start, this.end), 0);
        this.buf = next;
      }
      this.start = 0;
      this.end = pending;
    }
    this.buf.set(bytes, this.end);
    this.end += bytes.length;
  }

  private flushGarbage(): void {
    if (this.garbageBytes > 0) {
      const event: SkipEvent = { reason: 'garbage', offset: this.garbageOffset, bytes: this.garbageBytes };
      this.garbageBytes = 0;
      this.skip(event);
    }
  }

  private skip(event: SkipEvent): void {
    this.skipped += event.bytes;
    this.onSkip(event);
  }

  /** Scans data[pos..limit) (stream position of data[i] is base + i); returns where it stopped. */
  private scan(data: Uint8Array, pos: number, limit: number, base: number): number {
    const known = this.known;
    while (pos < limit) {
      if (data[pos] !== SYNC) {
        let next = data.indexOf(SYNC, pos);
        if (next < 0 || next > limit) next = limit;
        if (this.garbageBytes === 0) this.garbageOffset = base + pos;
        this.garbageBytes += next - pos;
        pos = next;
        continue;
      }
      if (limit - pos < HEADER_BYTES) break;
      const kind = data[pos + 1];
      const tag = data[pos + 2];
      const len = data[pos + 3];
      if (!known[kind] || !this.lengthOk[kind * 256 + len]) {
        this.flushGarbage();
        this.skip({ reason: known[kind] ? 'bad-length' : 'unknown-kind', offset: base + pos, bytes: 1, kind, tag, len });
        pos += 1;
        continue;
      }
      if (limit - pos < len + FRAME_OVERHEAD) break;
      const end = pos + HEADER_BYTES + len;
      const check = data[end];
      const expected = this.crc.compute(data, pos + 1, end);
      if (check !== expected) {
        this.flushGarbage();
        this.skip({ reason: 'bad-check', offset: base + pos, bytes: 1, kind, tag, len, check, expected });
        pos += 1;
        continue;
      }
      this.flushGarbage();
      this.frames++;
      this.onFrame({ kind, tag, payload: data.slice(pos + HEADER_BYTES, end), check, offset: base + pos });
      pos = end + 1;
    }
    return pos;
  }
}
