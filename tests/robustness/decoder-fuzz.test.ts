// The frame decoder fed millions of random and damaged bytes in random chunks. What it emits is
// checked against the frames actually put into the stream, by stream offset.
import { crc8 as referenceCrc8 } from 'crc';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { FrameDecoder, type DecodedFrame, type SkipEvent } from '../../shared/link/decoder';
import { FRAME_OVERHEAD, SYNC } from '../../shared/link/frame';
import { fuzzStream, pushInChunks, randomFrame, type FuzzStream, type PlacedFrame } from './support/wire-streams';
import { seededRandom } from '../../mock-device/line-faults';

const sameBytes = (a: Uint8Array, b: Uint8Array) => a.length === b.length && a.every((v, i) => v === b[i]);

interface Decoded {
  frames: DecodedFrame[];
  badChecks: number;
  skipped: number;
}

function decodeAll(bytes: Uint8Array, chunkSeed: number): Decoded {
  const frames: DecodedFrame[] = [];
  let badChecks = 0;
  const decoder = new FrameDecoder({
    onFrame: (f) => frames.push(f),
    onSkip: (e: SkipEvent) => {
      if (e.reason === 'bad-check') badChecks++;
    },
  });
  pushInChunks(bytes, (c) => decoder.push(c), chunkSeed);
  decoder.finish();
  return { frames, badChecks, skipped: decoder.bytesSkipped };
}

/**
 * Sorts what the decoder emitted into encoded frames (a good frame at its own offset, or the
 * untouched original inside a damaged segment) and false frames (anything else), after checking
 * each is a real run of the stream whose CHECK the `crc` package agrees with. `lost` lists the
 * good frames never emitted and not covered by a false frame: resynchronisation failures.
 */
function audit(stream: FuzzStream, out: Decoded) {
  const goodAt = new Map<number, PlacedFrame>(stream.good.map((g) => [g.offset, g]));
  const emittedAt = new Set<number>();
  const falseFrames: Array<[from: number, to: number]> = [];
  const problems: string[] = [];
  let lastEnd = 0;
  let d = 0;
  let fromDamage = 0;
  for (const f of out.frames) {
    const len = f.payload.length;
    const onWire = stream.bytes.subarray(f.offset, f.offset + len + FRAME_OVERHEAD);
    if (f.offset < lastEnd) problems.push(`frame at ${f.offset} overlaps the one before`);
    lastEnd = f.offset + onWire.length;
    const headerOk = onWire[0] === SYNC && onWire[1] === f.kind && onWire[2] === f.tag && onWire[3] === len;
    // CRC-8/SMBUS from the `crc` package (poly 0x07, init 0), not the project's own table.
    const checkOk = onWire[4 + len] === f.check && referenceCrc8(Buffer.from(onWire.subarray(1, 4 + len))) === f.check;
    if (!headerOk || !checkOk || !sameBytes(onWire.subarray(4, 4 + len), f.payload)) problems.push(`frame at ${f.offset} is not what the stream holds there`);
    while (d < stream.damaged.length && stream.damaged[d].offset + stream.damaged[d].span <= f.offset) d++;
    const seg = stream.damaged[d];
    const good = goodAt.get(f.offset);
    if (good && sameBytes(good.bytes, onWire)) emittedAt.add(f.offset);
    else if (seg && seg.offset <= f.offset && lastEnd <= seg.offset + seg.span && sameBytes(seg.bytes, onWire)) fromDamage++;
    else falseFrames.push([f.offset, lastEnd]);
  }
  const covered = (g: PlacedFrame) => falseFrames.some(([from, to]) => from < g.offset + g.bytes.length && g.offset < to);
  const lost = stream.good.filter((g) => !emittedAt.has(g.offset) && !covered(g));
  return { problems, goodEmitted: emittedAt.size, fromDamage, falseFrames: falseFrames.length, lost };
}

describe('the frame decoder under fuzzing', () => {
  it('the crc package used as the outside reference is CRC-8/SMBUS (catalogue check value 0xF4)', () => {
    // Check value of CRC-8/SMBUS for ASCII "123456789": the CRC RevEng catalogue.
    expect(referenceCrc8(Buffer.from('123456789'))).toBe(0xf4);
  });

  it.each([11, 12, 13])('10,000,000 random and damaged bytes (seed %i): no throw, every good frame back or covered by a chance frame, false frames at the 1-in-256 rate', (seed) => {
    const stream = fuzzStream({ seed, totalBytes: 10_000_000, mode: 'open' });
    const out = decodeAll(stream.bytes, seed * 7);
    const { problems, goodEmitted, fromDamage, falseFrames, lost } = audit(stream, out);
    expect(problems).toEqual([]);
    expect(lost).toEqual([]);
    expect(goodEmitted).toBeGreaterThan(stream.good.length * 0.99);
    // Every candidate that reaches the CHECK passes with probability 2^-8 when its bytes are
    // random (an 8-bit check: common practice, no source). Allow five standard deviations.
    const trials = out.badChecks + falseFrames;
    const expected = trials / 256;
    expect(Math.abs(falseFrames - expected)).toBeLessThan(5 * Math.sqrt(expected) + 5);
    expect(out.skipped + out.frames.reduce((n, f) => n + f.payload.length + FRAME_OVERHEAD, 0)).toBe(stream.bytes.length);
    console.info(
      `[fuzz seed ${seed}] ${stream.counts.good} good, ${stream.counts.garbage} garbage, ${stream.counts.damaged} damaged segments; ` +
        `${goodEmitted} good frames back, ${fromDamage} whole frames from inside damage, ${falseFrames} chance frames passed CRC-8 out of ${trials} checked (expected ${expected.toFixed(1)})`,
    );
  });

  it('2,000,000 bytes of SYNC-free garbage and odd-weight damage: exactly the good frames come out, in order', () => {
    for (const seed of [21, 22]) {
      const stream = fuzzStream({ seed, totalBytes: 2_000_000, mode: 'closed' });
      const out = decodeAll(stream.bytes, seed);
      expect(out.frames.map((f) => f.offset)).toEqual(stream.good.map((g) => g.offset));
      expect(out.frames.every((f, i) => sameBytes(stream.bytes.subarray(f.offset, f.offset + f.payload.length + FRAME_OVERHEAD), stream.good[i].bytes))).toBe(true);
      expect(stream.counts.damaged).toBeGreaterThan(5000);
    }
  });

  it('fast-check: any mix of good frames, garbage and cuts, in any chunking, gives every good frame not covered by a frame that passed its CHECK', () => {
    const segment = fc.oneof(
      fc.integer({ min: 0, max: 2 ** 31 }).map((s) => ({ good: true, bytes: randomFrame(seededRandom(s), false) })),
      fc.uint8Array({ minLength: 1, maxLength: 80 }).map((bytes) => ({ good: false, bytes })),
      fc.tuple(fc.integer({ min: 0, max: 2 ** 31 }), fc.nat()).map(([s, cut]) => {
        const f = randomFrame(seededRandom(s), false);
        return { good: false, bytes: f.subarray(0, cut % f.length) };
      }),
    );
    fc.assert(
      fc.property(fc.array(segment, { maxLength: 40 }), fc.integer({ min: 0, max: 2 ** 31 }), (segments, chunkSeed) => {
        const good: PlacedFrame[] = [];
        const bytes = new Uint8Array(segments.reduce((n, s) => n + s.bytes.length, 0));
        let at = 0;
        for (const s of segments) {
          if (s.good) good.push({ offset: at, bytes: s.bytes });
          bytes.set(s.bytes, at);
          at += s.bytes.length;
        }
        const stream: FuzzStream = { bytes, good, damaged: [], counts: { good: good.length, garbage: 0, damaged: 0 } };
        const { problems, lost } = audit(stream, decodeAll(bytes, chunkSeed));
        expect(problems).toEqual([]);
        expect(lost).toEqual([]);
      }),
      { seed: 20_261_202, numRuns: 2000 },
    );
  });
});
