// Seeded byte streams for fuzzing the frame decoder: good frames (whose offsets are remembered),
// random garbage and damaged frames, back to back. The same seed always gives the same stream.
import { encodeFrame, SYNC } from '../../../shared/link/frame';
import { Kind } from '../../../shared/link/kinds';
import { seededRandom } from '../../../mock-device/line-faults';

/** A good frame put into the stream: where its SYNC sits and its bytes. */
export interface PlacedFrame {
  offset: number;
  bytes: Uint8Array;
}

export interface FuzzStream {
  bytes: Uint8Array;
  good: PlacedFrame[];
  /**
   * Each damaged segment: where it starts, how long it is, and the frame it was made from. Some
   * edits leave that frame whole (a stray byte in front of it), so the decoder may rightly
   * deliver it from inside the segment.
   */
  damaged: Array<PlacedFrame & { span: number }>;
  /** Segments of each sort, for the report. */
  counts: { good: number; garbage: number; damaged: number };
}

export interface StreamOptions {
  seed: number;
  /** Stream length in bytes (the last segment is cut to fit). */
  totalBytes: number;
  /**
   * `open`: garbage is any byte and damage is any edit (bit flips, cuts, inserted and removed
   * bytes), so a false frame can pass the 8-bit CHECK by chance. `closed`: garbage holds no SYNC
   * byte, good frames hold none after their own SYNC, and damage is an odd number of bit flips
   * outside SYNC and LEN that makes no SYNC byte — errors every CRC-8 here must catch.
   */
  mode: 'open' | 'closed';
}

/**
 * Payload lengths possible for each KIND under the default profile (16-bit angles and outputs;
 * the default vectoring core's 16-bit x/y, 16-bit angles and 18-bit magnitudes).
 */
function payloadLength(kind: number, random: () => number): number {
  const upTo = (n: number) => 1 + Math.floor(random() * n);
  switch (kind) {
    case Kind.One:
      return 2;
    case Kind.List:
      return 2 * upTo(127);
    case Kind.Sweep:
      return 12;
    case Kind.Info:
      return 17 + Math.floor(random() * 239);
    case Kind.Results:
      return 4 + 4 * upTo(62);
    case Kind.SweepEnd:
      return 5;
    case Kind.Ack:
      return 1;
    case Kind.Nak:
      return 2;
    case Kind.VecOne:
      return 4;
    case Kind.VecList:
      return 4 * upTo(63);
    case Kind.VecGrid:
      return 20;
    case Kind.ModeInfo:
      return 9 + Math.floor(random() * 247);
    case Kind.VecResults:
      return 4 + 5 * upTo(50);
    default:
      return 0; // HELLO, MODES, PAUSE, RESUME, ABORT
  }
}

const KINDS = Object.values(Kind);

/** A random byte; in the closed mode never SYNC. */
function byteFrom(random: () => number, noSync: boolean): number {
  const b = Math.floor(random() * 256);
  return noSync && b === SYNC ? b ^ 1 : b;
}

/** Fills `out` with random bytes, four from each draw; in the closed mode SYNC becomes 0xA4. */
function fillRandom(random: () => number, out: Uint8Array, noSync: boolean): void {
  for (let i = 0; i < out.length; i += 4) {
    let word = Math.floor(random() * 2 ** 32);
    for (let k = i; k < i + 4 && k < out.length; k++, word >>>= 8) out[k] = word & 0xff;
  }
  if (noSync) for (let i = out.indexOf(SYNC); i >= 0; i = out.indexOf(SYNC, i + 1)) out[i] ^= 1;
}

/** A valid frame of a random KIND; in the closed mode with no SYNC byte after its first. */
export function randomFrame(random: () => number, closed: boolean): Uint8Array {
  for (;;) {
    const kind = KINDS[Math.floor(random() * KINDS.length)];
    const payload = new Uint8Array(payloadLength(kind, random));
    fillRandom(random, payload, closed);
    const frame = encodeFrame(kind, byteFrom(random, closed), payload);
    if (!closed || frame.indexOf(SYNC, 1) < 0) return frame;
  }
}

/** A damaged copy of a good frame. */
function damage(frame: Uint8Array, random: () => number, closed: boolean): Uint8Array {
  const pick = (from: number, to: number) => from + Math.floor(random() * (to - from));
  if (closed) {
    // 1 or 3 flips: CRC-8 polynomials with an (x + 1) factor, as SMBUS's 0x07 has, catch every
    // error of odd weight (Peterson & Brown, "Cyclic Codes for Error Detection", 1961).
    for (;;) {
      const out = frame.slice();
      const flips = random() < 0.5 ? 1 : 3;
      const bits = new Set<number>();
      while (bits.size < flips) {
        const at = pick(1, frame.length);
        if (at !== 3) bits.add(at * 8 + pick(0, 8));
      }
      for (const bit of bits) out[bit >> 3] ^= 1 << (bit & 7);
      if (out.indexOf(SYNC, 1) < 0) return out;
    }
  }
  const out = Array.from(frame);
  switch (pick(0, 5)) {
    case 0: // a burst of flipped bits anywhere, LEN included
      for (let n = pick(1, 9); n > 0; n--) out[pick(0, out.length)] ^= 1 << pick(0, 8);
      break;
    case 1: // cut short
      out.length = pick(1, out.length);
      break;
    case 2: // one byte lost
      out.splice(pick(0, out.length), 1);
      break;
    case 3: // a stray byte, sometimes a SYNC
      out.splice(pick(0, out.length + 1), 0, random() < 0.3 ? SYNC : pick(0, 256));
      break;
    default: // a doubled SYNC in front
      out.unshift(SYNC);
  }
  return Uint8Array.from(out);
}

/** Builds a stream of about `totalBytes`: roughly half good frames, the rest garbage and damage. */
export function fuzzStream(o: StreamOptions): FuzzStream {
  const random = seededRandom(o.seed);
  const closed = o.mode === 'closed';
  const bytes = new Uint8Array(o.totalBytes);
  const good: PlacedFrame[] = [];
  const damaged: FuzzStream['damaged'] = [];
  const counts = { good: 0, garbage: 0, damaged: 0 };
  let at = 0;
  while (at < o.totalBytes) {
    const roll = random();
    let segment: Uint8Array;
    if (roll < 0.5) {
      segment = randomFrame(random, closed);
      if (at + segment.length > o.totalBytes) break;
      good.push({ offset: at, bytes: segment });
      counts.good++;
    } else if (roll < 0.75) {
      segment = new Uint8Array(1 + Math.floor(random() * 300));
      fillRandom(random, segment, closed);
      counts.garbage++;
    } else {
      const original = randomFrame(random, closed);
      segment = damage(original, random, closed);
      damaged.push({ offset: at, bytes: original, span: segment.length });
      counts.damaged++;
    }
    const n = Math.min(segment.length, o.totalBytes - at);
    bytes.set(segment.subarray(0, n), at);
    at += n;
  }
  // A good frame that did not fit leaves the tail as zeros: garbage, never SYNC.
  return { bytes, good, damaged, counts };
}

/** Feeds `bytes` to `push` in seeded random chunks of 1..maxChunk bytes, some of one byte. */
export function pushInChunks(bytes: Uint8Array, push: (chunk: Uint8Array) => void, seed: number, maxChunk = 4096): number {
  const random = seededRandom(seed);
  let chunks = 0;
  for (let at = 0; at < bytes.length; chunks++) {
    const n = random() < 0.05 ? 1 : 1 + Math.floor(random() * maxChunk);
    push(bytes.subarray(at, at + n));
    at += n;
  }
  return chunks;
}
