import { crc8 as crcSmbus } from 'crc';
import { describe, expect, it } from 'vitest';
import {
  DEFAULT_VECTOR_PROFILE,
  FrameDecoder,
  Kind,
  PayloadError,
  decodePayload,
  encodeMessage,
  encodePayload,
  gridVector,
  isPossibleLength,
  maxVectorListPairs,
  maxVectorResultPairs,
  type DecodedFrame,
  type Message,
  type SkipEvent,
  type WireProfile,
} from '../../../shared/link';
import { createVectorModel } from '../../../shared/vectoring';

const dflt: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 18, vector: { ...DEFAULT_VECTOR_PROFILE } };
/** 12-bit inputs (2-byte fields), 20-bit rad angles (3 bytes), 8-bit magnitudes (1 byte). */
const odd: WireProfile = { angleFormat: 'rad', angleBits: 20, outBits: 8, vector: { inBits: 12, angleFormat: 'rad', angleBits: 20, magBits: 8 } };
const bytes = (s: string) => Uint8Array.from(s.split(' '), (h) => parseInt(h, 16));

describe('vectoring payload codecs (bench link version 2)', () => {
  it('round-trips every new KIND under the default and an odd profile', () => {
    const messages: Message[] = [
      { kind: Kind.Modes },
      { kind: Kind.VecOne, x: -2048, y: 2047 },
      { kind: Kind.VecList, xs: [-2048, 0, 2047], ys: [5, -5, 0] },
      { kind: Kind.VecGrid, x0: -2048, dx: -(2 ** 31), nx: 65535, y0: 2047, dy: 2 ** 31 - 1, ny: 1 },
      { kind: Kind.VecResults, firstIndex: 2 ** 32 - 1, angle: Int32Array.of(-(2 ** 19), 2 ** 19 - 1), magnitude: Int32Array.of(-128, 127) },
      { kind: Kind.ModeInfo, modes: { rotation: true, vectoring: { inBits: 12, inFrac: 10, angleFormat: 'rad', angleBits: 20, angleFrac: 17, magBits: 8, magFrac: 4, iterations: 14 } } },
      { kind: Kind.ModeInfo, modes: { rotation: true, vectoring: null } },
    ];
    for (const m of messages) {
      const payload = encodePayload(m, odd);
      expect(isPossibleLength(m.kind, payload.length, odd)).toBe(true);
      expect(decodePayload(m.kind, payload, odd)).toEqual(m);
    }
    // A turn angle is unsigned in its field: 0xFFFF is 65535, not −1.
    const turn = encodePayload({ kind: Kind.VecResults, firstIndex: 0, angle: Int32Array.of(65535), magnitude: Int32Array.of(-1) }, dflt);
    expect([...turn]).toEqual([0, 0, 0, 0, 0xff, 0xff, 0xff, 0xff, 0xff]);
    expect(decodePayload(Kind.VecResults, turn, dflt)).toMatchObject({ angle: Int32Array.of(65535), magnitude: Int32Array.of(-1) });
  });

  it('sizes VEC_ONE, VEC_LIST and VEC_RESULTS from the vectoring profile, the default core before MODE_INFO', () => {
    const noVector: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 16 };
    expect(isPossibleLength(Kind.VecOne, 4, noVector)).toBe(true);
    expect(isPossibleLength(Kind.VecResults, 4 + 5, noVector)).toBe(true);
    expect(isPossibleLength(Kind.VecResults, 4 + 4, noVector)).toBe(false);
    expect(isPossibleLength(Kind.VecResults, 4 + 4, odd)).toBe(true);
    expect(isPossibleLength(Kind.VecList, 6, dflt)).toBe(false);
    expect(isPossibleLength(Kind.VecList, 0, dflt)).toBe(false);
    expect(isPossibleLength(Kind.VecGrid, 12, dflt)).toBe(false);
    expect(isPossibleLength(Kind.ModeInfo, 8, dflt)).toBe(false);
    expect(isPossibleLength(Kind.ModeInfo, 30, dflt)).toBe(true);
    expect(maxVectorListPairs(dflt)).toBe(63);
    expect(maxVectorResultPairs(dflt)).toBe(50);
    expect(maxVectorResultPairs(odd)).toBe(62);
  });

  it('skips the fields a later MODE_INFO appends', () => {
    const nine = encodePayload({ kind: Kind.ModeInfo, modes: { rotation: false, vectoring: { inBits: 16, inFrac: 14, angleFormat: 'turn', angleBits: 16, angleFrac: 0, magBits: 18, magFrac: 14, iterations: 16 } } }, dflt);
    const longer = Uint8Array.from([...nine, 0xee, 0xee]);
    expect(decodePayload(Kind.ModeInfo, longer, dflt)).toEqual(decodePayload(Kind.ModeInfo, nine, dflt));
  });

  it('refuses what cannot be encoded or a MODE_INFO with impossible formats, naming the field', () => {
    expect(() => encodePayload({ kind: Kind.VecOne, x: 40000, y: 0 }, dflt)).toThrow(PayloadError);
    expect(() => encodePayload({ kind: Kind.VecList, xs: [1, 2], ys: [1] }, dflt)).toThrow(/same length/);
    expect(() => encodePayload({ kind: Kind.VecList, xs: new Array(64).fill(0), ys: new Array(64).fill(0) }, dflt)).toThrow(/1\.\.63 vectors/);
    expect(() => encodePayload({ kind: Kind.VecGrid, x0: 0, dx: 1, nx: 65536, y0: 0, dy: 1, ny: 1 }, dflt)).toThrow(/nx/);
    const bad = Uint8Array.of(2, 0, 0, 0, 16, 0, 18, 14, 16); // inBits 0
    expect(() => decodePayload(Kind.ModeInfo, bad, dflt)).toThrow(/MODE_INFO: vector\.inBits must be an integer 2\.\.32, got 0/);
  });

  it('makes grid points with y fastest, each coordinate wrapped in inBits', () => {
    const g = { x0: 2040, dx: 5, nx: 3, y0: -2048, dy: -1, ny: 2 };
    // 12-bit inputs: x 2040, 2045, 2050 → −2046; y −2048, then −2049 → 2047.
    expect([0, 1, 2, 3, 4, 5].map((k) => gridVector(g, k, odd))).toEqual([
      { x: 2040, y: -2048 },
      { x: 2040, y: 2047 },
      { x: 2045, y: -2048 },
      { x: 2045, y: 2047 },
      { x: -2046, y: -2048 },
      { x: -2046, y: 2047 },
    ]);
  });

  it('lets a decoder take only the KINDs it is given (a rotation-only board: every version-2 KIND unknown)', () => {
    const skips: SkipEvent[] = [];
    const frames: DecodedFrame[] = [];
    const d = new FrameDecoder({ accept: [Kind.Hello, Kind.One], onFrame: (f) => frames.push(f), onSkip: (e) => skips.push(e) });
    d.push(encodeMessage({ kind: Kind.VecOne, x: 1, y: 1 }, 1, dflt));
    d.push(encodeMessage({ kind: Kind.Hello }, 2, dflt));
    d.finish();
    expect(frames.map((f) => f.kind)).toEqual([Kind.Hello]);
    expect(skips[0]).toMatchObject({ reason: 'unknown-kind', kind: Kind.VecOne, tag: 1 });
    expect(() => new FrameDecoder({ accept: [0x55], onFrame: () => {} })).toThrow(/0x55|85/);
  });
});

describe('the vectoring worked example of docs/protocol.md section 8', () => {
  // Every CHECK is confirmed with the crc package's crc8, CRC-8/SMBUS (poly 0x07, init 0, no
  // reflection, no final XOR), an implementation independent of shared/link.
  const check = (frame: Uint8Array) => crcSmbus(Buffer.from(frame.subarray(1, frame.length - 1)));

  const examples: Array<[string, Message, number, string]> = [
    ['MODES', { kind: Kind.Modes }, 0x30, 'A5 02 30 00 2F'],
    [
      'MODE_INFO',
      { kind: Kind.ModeInfo, modes: { rotation: false, vectoring: { inBits: 16, inFrac: 14, angleFormat: 'turn', angleBits: 16, angleFrac: 0, magBits: 18, magFrac: 14, iterations: 16 } } },
      0x30,
      'A5 82 30 09 02 10 0E 00 10 00 12 0E 10 CC',
    ],
    ['VEC_ONE', { kind: Kind.VecOne, x: 12288, y: 16384 }, 0x31, 'A5 13 31 04 00 30 00 40 90'],
    ['VEC_RESULTS', { kind: Kind.VecResults, firstIndex: 0, angle: Int32Array.of(9672), magnitude: Int32Array.of(33727) }, 0x31, 'A5 91 31 09 00 00 00 00 C8 25 BF 83 00 1E'],
    ['VEC_GRID', { kind: Kind.VecGrid, x0: -16384, dx: 8192, nx: 5, y0: -16384, dy: 8192, ny: 5 }, 0x32, 'A5 15 32 14 00 C0 FF FF 00 20 00 00 00 C0 FF FF 00 20 00 00 05 00 05 00 05'],
    ['SWEEP_END', { kind: Kind.SweepEnd, done: 25, status: 0 }, 0x32, 'A5 92 32 05 19 00 00 00 00 A1'],
    ['NAK 7', { kind: Kind.Nak, refused: Kind.VecOne, reason: 7 }, 0x33, 'A5 AF 33 02 13 07 FB'],
    ['VEC_LIST of two', { kind: Kind.VecList, xs: [12288, 0], ys: [16384, -16384] }, 0x34, 'A5 14 34 08 00 30 00 40 00 00 00 C0 A8'],
    [
      'VEC_RESULTS of two',
      { kind: Kind.VecResults, firstIndex: 0, angle: Int32Array.of(9672, 49152), magnitude: Int32Array.of(33727, 26981) },
      0x34,
      'A5 91 34 0E 00 00 00 00 C8 25 BF 83 00 00 C0 65 69 00 8F',
    ],
  ];

  for (const [name, m, tag, wire] of examples) {
    it(`encodes ${name} as ${wire}, its CHECK confirmed by the crc package`, () => {
      const frame = encodeMessage(m, tag, dflt);
      expect(frame).toEqual(bytes(wire));
      expect(check(frame)).toBe(frame[frame.length - 1]);
    });
  }

  it("answers (0.75, 1.0) with the bit-accurate model's codes 9672 and 33727", () => {
    // atan2(4, 3) = 53.1301° is 9672.04 codes of a 16-bit turn; K_16 · 1.25 · 16384 = 33725.65
    // (K_16 = 1.646760…, docs/references.md). The model's codes are what the example shows.
    expect(createVectorModel({}).answer(12288, 16384)).toEqual({ angle: 9672, magnitude: 33727 });
    expect((Math.atan2(4, 3) / (2 * Math.PI)) * 65536).toBeCloseTo(9672.04, 2);
  });

  it('packs VEC_RESULTS as RESULTS: whole-byte fields back to back, pair k at 4 + k·(p + m), no padding', () => {
    // The two-pair example: pair 1 begins at byte 4 + 5 of the payload, right after pair 0's 3-byte magnitude.
    const payload = bytes('00 00 00 00 C8 25 BF 83 00 00 C0 65 69 00');
    const m = decodePayload(Kind.VecResults, payload, dflt) as Extract<Message, { kind: typeof Kind.VecResults }>;
    expect(Array.from(m.angle)).toEqual([9672, 49152]);
    expect(Array.from(m.magnitude)).toEqual([33727, 26981]);
    // atan2(-1, 0) = -90°, sent as a turn minus a quarter: 3/4 of 65536 (section 8, "Numbers").
    expect(createVectorModel({}).answer(0, -16384)).toEqual({ angle: 49152, magnitude: 26981 });
    // RESULTS of an 18-bit core has 3-byte fields the same way: pair k at 4 + 6k, sign-extended (cos 0, sin 0, cos 1, sin 1).
    const wide: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 18 };
    const r = decodePayload(Kind.Results, bytes('00 00 00 00 FF FF FF 01 00 00 00 02 00 FE FF FF'), wide) as Extract<Message, { kind: typeof Kind.Results }>;
    expect([Array.from(r.cos), Array.from(r.sin)]).toEqual([[-1, 512], [1, -2]]);
    // A pair one byte longer or shorter is an impossible length, in both.
    expect(isPossibleLength(Kind.VecResults, payload.length + 1, dflt)).toBe(false);
    expect(isPossibleLength(Kind.Results, 4 + 6 * 2 - 1, wide)).toBe(false);
  });

  it('decodes the grid example to the 25 points the board walks, the zero vector in the middle', () => {
    const g = decodePayload(Kind.VecGrid, bytes('00 C0 FF FF 00 20 00 00 00 C0 FF FF 00 20 00 00 05 00 05 00'), dflt) as Extract<Message, { kind: typeof Kind.VecGrid }>;
    expect(gridVector(g, 0, dflt)).toEqual({ x: -16384, y: -16384 });
    expect(gridVector(g, 1, dflt)).toEqual({ x: -16384, y: -8192 });
    expect(gridVector(g, 12, dflt)).toEqual({ x: 0, y: 0 });
    expect(gridVector(g, 24, dflt)).toEqual({ x: 16384, y: 16384 });
  });
});
