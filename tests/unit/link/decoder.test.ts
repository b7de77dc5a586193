import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { crc8 as crcSmbus } from 'crc';
import { FrameDecoder, DecoderReentryError, type DecodedFrame, type SkipEvent, type FrameDecoderOptions } from '../../../shared/link/decoder';
import { encodeFrame, FrameError, SYNC } from '../../../shared/link/frame';
import { Kind } from '../../../shared/link/kinds';
import { concat, rawFrameArb, streamOf } from './arbitraries';

function decodeChunks(chunks: Uint8Array[], options: Partial<FrameDecoderOptions> = {}) {
  const frames: DecodedFrame[] = [];
  const skips: SkipEvent[] = [];
  const d = new FrameDecoder({ ...options, onFrame: (f) => frames.push(f), onSkip: (e) => skips.push(e) });
  for (const c of chunks) d.push(c);
  d.finish();
  return { frames, skips, decoder: d };
}

function splitAt(bytes: Uint8Array, cuts: number[]): Uint8Array[] {
  const points = [0, ...[...new Set(cuts)].filter((c) => c > 0 && c < bytes.length).sort((a, b) => a - b), bytes.length];
  return points.slice(1).map((p, i) => bytes.subarray(points[i], p));
}

/** Frame bytes recomputed from what the decoder delivered: the CHECK must match. */
function checkIsRight(f: DecodedFrame): boolean {
  const e = encodeFrame(f.kind, f.tag, f.payload);
  return e[e.length - 1] === f.check;
}

const one = encodeFrame(Kind.One, 7, Uint8Array.of(0x55, 0x15));
const results = encodeFrame(Kind.Results, 7, Uint8Array.of(0, 0, 0, 0, 0x00, 0x40, 0x00, 0x20));

describe('frame encoder', () => {
  it('lays out SYNC, KIND, TAG, LEN, PAYLOAD and a CHECK over KIND..PAYLOAD', () => {
    expect([...one.subarray(0, 6)]).toEqual([0xa5, 0x10, 7, 2, 0x55, 0x15]);
    // Outside reference: the crc package's crc8 is CRC-8/SMBUS, the default CHECK.
    expect(one[6]).toBe(crcSmbus(Buffer.from(one.subarray(1, 6))));
  });

  it('refuses a payload over 255 bytes and a TAG outside 0..255, naming the field', () => {
    expect(() => encodeFrame(Kind.List, 0, new Uint8Array(256))).toThrow(FrameError);
    expect(() => encodeFrame(Kind.Hello, 256)).toThrow(/tag/);
  });
});

describe('frame decoder', () => {
  it('decodes one whole frame with its offset and a copy of its payload', () => {
    const { frames, skips } = decodeChunks([one]);
    expect(frames).toEqual([{ kind: Kind.One, tag: 7, payload: Uint8Array.of(0x55, 0x15), check: one[6], offset: 0 }]);
    expect(skips).toEqual([]);
  });

  const boundaries: Array<[string, number]> = [
    ['right after SYNC', 1],
    ['inside the header, after KIND', 2],
    ['inside the header, after TAG', 3],
    ['when the LEN byte ends a chunk', 4],
    ['inside the payload', 5],
    ['right before CHECK', 6],
  ];
  for (const [what, cut] of boundaries) {
    it(`works when a chunk boundary falls ${what}`, () => {
      const stream = concat([one, results]);
      const whole = decodeChunks([stream]);
      const split = decodeChunks(splitAt(stream, [cut, one.length + cut]));
      expect(whole.frames).toHaveLength(2);
      expect(split.frames).toEqual(whole.frames);
    });
  }

  it('yields the same frames and events for every two-way split of a mixed stream', () => {
    const bad = one.slice();
    bad[6] ^= 0xff;
    const stream = concat([Uint8Array.of(1, 2, 3), one, bad, Uint8Array.of(SYNC, 0x77, 0, 0), results]);
    const whole = decodeChunks([stream]);
    expect(whole.frames).toHaveLength(2);
    for (let cut = 1; cut < stream.length; cut++) expect(decodeChunks(splitAt(stream, [cut]))).toMatchObject({ frames: whole.frames, skips: whole.skips });
  });

  it('yields the same frames and events one byte at a time as in one push', () => {
    fc.assert(
      fc.property(fc.array(rawFrameArb, { minLength: 1, maxLength: 8 }), (list) => {
        const { bytes } = streamOf(list);
        const whole = decodeChunks([bytes]);
        const bytewise = decodeChunks(Array.from(bytes, (b) => Uint8Array.of(b)));
        expect(bytewise.frames).toEqual(whole.frames);
        expect(whole.frames.map((f) => [f.kind, f.tag, [...f.payload]])).toEqual(list.map((f) => [f.kind, f.tag, [...f.payload]]));
      }),
    );
  });

  it('yields the same frames and events in any random chunking, garbage included', () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(rawFrameArb.map((f) => streamOf([f]).bytes), fc.uint8Array({ maxLength: 20 })), { maxLength: 10 }),
        fc.array(fc.nat(), { maxLength: 12 }),
        (parts, rawCuts) => {
          const stream = concat(parts);
          const cuts = rawCuts.map((c) => (stream.length ? c % stream.length : 0));
          const whole = decodeChunks([stream]);
          const split = decodeChunks(splitAt(stream, cuts));
          expect(split.frames).toEqual(whole.frames);
          expect(split.skips).toEqual(whole.skips);
        },
      ),
    );
  });

  it('reports garbage before SYNC as one run with its byte count', () => {
    const { frames, skips } = decodeChunks([Uint8Array.of(0, 1, 2), Uint8Array.of(3, 4), one]);
    expect(frames).toHaveLength(1);
    expect(frames[0].offset).toBe(5);
    expect(skips).toEqual([{ reason: 'garbage', offset: 0, bytes: 5 }]);
  });

  it('drops only the SYNC of a frame with a bad CHECK and resyncs on the next good frame', () => {
    const bad = one.slice();
    bad[5] ^= 0x01;
    const { frames, skips } = decodeChunks([bad, results]);
    expect(frames.map((f) => f.offset)).toEqual([bad.length]);
    expect(skips[0]).toMatchObject({ reason: 'bad-check', offset: 0, bytes: 1, kind: Kind.One, tag: 7, len: 2, check: one[6] });
    expect(skips[1]).toEqual({ reason: 'garbage', offset: 1, bytes: bad.length - 1 });
  });

  it('reports an impossible LEN for a KIND as bad-length', () => {
    const { frames, skips } = decodeChunks([Uint8Array.of(SYNC, Kind.Ack, 3, 4), one]);
    expect(skips[0]).toEqual({ reason: 'bad-length', offset: 0, bytes: 1, kind: Kind.Ack, tag: 3, len: 4 });
    expect(frames).toHaveLength(1);
  });

  it('reports a KIND the protocol does not define as unknown-kind', () => {
    const { skips } = decodeChunks([Uint8Array.of(SYNC, 0x55, 9, 0, 0)]);
    expect(skips[0]).toEqual({ reason: 'unknown-kind', offset: 0, bytes: 1, kind: 0x55, tag: 9, len: 0 });
  });

  it('treats requests as unknown when told to accept replies only', () => {
    const { frames, skips } = decodeChunks([one, results], { accept: 'replies' });
    expect(frames.map((f) => f.kind)).toEqual([Kind.Results]);
    expect(skips[0]).toMatchObject({ reason: 'unknown-kind', kind: Kind.One });
  });

  it('sizes the RESULTS LEN check from the profile', () => {
    const wide = encodeFrame(Kind.Results, 1, new Uint8Array(4 + 6));
    expect(decodeChunks([wide]).frames).toHaveLength(0);
    expect(decodeChunks([wide], { profile: { angleFormat: 'turn', angleBits: 16, outBits: 24 } }).frames).toHaveLength(1);
  });

  it('applies a profile set inside onFrame from the next frame on', () => {
    const wide = encodeFrame(Kind.Results, 1, new Uint8Array(4 + 6));
    const got: DecodedFrame[] = [];
    const d = new FrameDecoder({
      onFrame: (f) => {
        got.push(f);
        if (f.kind === Kind.Ack) d.setProfile({ angleFormat: 'turn', angleBits: 16, outBits: 24 });
      },
    });
    d.push(concat([encodeFrame(Kind.Ack, 0, Uint8Array.of(1)), wide]));
    expect(got.map((f) => f.kind)).toEqual([Kind.Ack, Kind.Results]);
  });

  it('recovers the frames swallowed by a corrupted LEN once enough bytes arrive', () => {
    const bad = one.slice();
    bad[1] = Kind.Info;
    bad[3] = 40; // INFO with LEN 40 swallows the frames behind it until its CHECK fails
    const tail = Array.from({ length: 10 }, (_, i) => encodeFrame(Kind.Ack, i, Uint8Array.of(i)));
    const { frames, skips } = decodeChunks([bad, ...tail]);
    expect(skips[0]).toMatchObject({ reason: 'bad-check', offset: 0, len: 40 });
    expect(frames.map((f) => f.tag)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
  });

  it('reports a frame cut off at the end of the stream as truncated, then decodes what follows its SYNC', () => {
    const cut = one.subarray(0, 5);
    const inner = encodeFrame(Kind.Ack, 2, Uint8Array.of(1));
    const { frames, skips } = decodeChunks([Uint8Array.of(SYNC, Kind.Info, 0, 200), inner]);
    expect(frames.map((f) => f.tag)).toEqual([2]);
    expect(skips[0]).toEqual({ reason: 'truncated', offset: 0, bytes: 1, kind: Kind.Info, tag: 0, len: 200 });
    const alone = decodeChunks([cut]);
    expect(alone.skips.map((s) => s.reason)).toEqual(['truncated', 'garbage']);
    expect(alone.skips.reduce((n, s) => n + s.bytes, 0)).toBe(5);
  });

  it('never throws on random bytes, accepts only frames whose CHECK is right and accounts for every byte', () => {
    fc.assert(
      fc.property(fc.array(fc.uint8Array({ maxLength: 64 }), { maxLength: 20 }), (chunks) => {
        const { frames, skips, decoder } = decodeChunks(chunks);
        expect(frames.every(checkIsRight)).toBe(true);
        const total = chunks.reduce((n, c) => n + c.length, 0);
        const framed = frames.reduce((n, f) => n + f.payload.length + 5, 0);
        expect(framed + skips.reduce((n, s) => n + s.bytes, 0)).toBe(total);
        expect(decoder.bytesReceived).toBe(total);
        expect(decoder.pendingBytes).toBe(0);
      }),
    );
  });

  it('decodes every good frame of a corrupted stream that no wrongly accepted frame covers', () => {
    fc.assert(
      fc.property(
        fc.array(rawFrameArb, { minLength: 2, maxLength: 10 }),
        fc.array(fc.tuple(fc.nat(), fc.integer({ min: 1, max: 255 })), { minLength: 1, maxLength: 6 }),
        fc.array(fc.nat(), { maxLength: 5 }),
        (list, flips, rawCuts) => {
          const { bytes, offsets } = streamOf(list);
          const ends = offsets.map((o, i) => o + list[i].payload.length + 5);
          const damaged = bytes.slice();
          const hit = new Set<number>();
          for (const [at, mask] of flips) {
            const i = at % damaged.length;
            damaged[i] ^= mask;
            hit.add(offsets.findIndex((o, k) => i >= o && i < ends[k]));
          }
          const { frames } = decodeChunks(splitAt(damaged, rawCuts.map((c) => c % damaged.length)));
          expect(frames.every(checkIsRight)).toBe(true);
          const good = new Set(frames.map((f) => f.offset));
          const spurious = frames.filter((f) => !offsets.includes(f.offset) || hit.has(offsets.indexOf(f.offset)));
          list.forEach((_, k) => {
            if (hit.has(k)) return;
            const covered = spurious.some((f) => offsets[k] > f.offset && offsets[k] < f.offset + f.payload.length + 5);
            if (!covered) expect(good.has(offsets[k])).toBe(true);
          });
        },
      ),
    );
  });

  // Its speed (≥ 3 MB/s) is the `decoder-rate` figure of `npm run bench -- hot-paths`.
  it('decodes a long run of RESULTS frames pushed in 4 KiB chunks', () => {
    const frame = encodeFrame(Kind.Results, 1, new Uint8Array(4 + 62 * 4).map((_, i) => (i * 7) & 0xff));
    const stream = concat(Array.from({ length: 16000 }, () => frame));
    let n = 0;
    const d = new FrameDecoder({ onFrame: () => n++ });
    for (let o = 0; o < stream.length; o += 4096) d.push(stream.subarray(o, o + 4096));
    expect(n).toBe(16000);
  });

  it('refuses to be pushed from inside its own callback', () => {
    const d: FrameDecoder = new FrameDecoder({ onFrame: () => d.push(one) });
    expect(() => d.push(one)).toThrow(DecoderReentryError);
  });

  it('names the bad option when built with one', () => {
    expect(() => new FrameDecoder({ onFrame: () => {}, accept: 'most' as never })).toThrow(/accept/);
    expect(() => new FrameDecoder({ onFrame: () => {}, profile: { angleFormat: 'turn', angleBits: 40, outBits: 16 } })).toThrow(/angleBits/);
  });
});

describe('frame decoder buffering', () => {
  it('keeps decoding after a huge chunk that leaves an incomplete frame behind', () => {
    const big = concat([new Uint8Array(200_000), one, results.subarray(0, 5)]);
    const { frames } = decodeChunks([Uint8Array.of(SYNC), big.subarray(1), results.subarray(5), one]);
    expect(frames.map((f) => f.kind)).toEqual([Kind.One, Kind.Results, Kind.One]);
  });
});
