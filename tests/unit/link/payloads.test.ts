import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { crc8 as crcSmbus } from 'crc';
import { FrameDecoder, type DecodedFrame } from '../../../shared/link/decoder';
import { Kind, NakReason, SweepStatus, kindName } from '../../../shared/link/kinds';
import {
  decodePayload,
  encodeMessage,
  encodePayload,
  PayloadError,
  profileFromInfo,
  sweepAngleCode,
  type DeviceInfo,
  type Message,
} from '../../../shared/link/payloads';
import {
  angleCodeRange,
  isAngleCodeInRange,
  isPossibleLength,
  maxListCodes,
  maxResultPairs,
  type WireProfile,
} from '../../../shared/link/wire-profile';

const profileArb: fc.Arbitrary<WireProfile> = fc.record({
  angleFormat: fc.constantFrom('turn' as const, 'rad' as const),
  angleBits: fc.integer({ min: 1, max: 32 }),
  outBits: fc.integer({ min: 2, max: 32 }),
});

const signedOf = (bits: number) => fc.integer({ min: -(2 ** (bits - 1)), max: 2 ** (bits - 1) - 1 });
const angleOf = (p: WireProfile) => {
  const { min, max } = angleCodeRange(p);
  return fc.integer({ min, max });
};

const infoArb: fc.Arbitrary<DeviceInfo> = fc.record({
  version: fc.constant(1),
  angleFormat: fc.constantFrom('turn' as const, 'rad' as const),
  angleBits: fc.integer({ min: 1, max: 32 }),
  angleFrac: fc.integer({ min: 0, max: 31 }),
  outBits: fc.integer({ min: 2, max: 32 }),
  outFrac: fc.integer({ min: 0, max: 31 }),
  iterations: fc.integer({ min: 1, max: 40 }),
  queueDepth: fc.integer({ min: 0, max: 0xffff }),
  buildId: fc.nat({ max: 0xffffffff }),
  clockKHz: fc.nat({ max: 0xffffffff }),
  name: fc.stringMatching(/^[\x20-\x7e]{0,238}$/),
});

/** Every KIND's message, valid under profile p. */
function messageArb(p: WireProfile): fc.Arbitrary<Message> {
  // Any value that fits the wire field, and values that fit outBits.
  const out = signedOf(8 * Math.ceil(p.outBits / 8));
  const outCode = fc.integer({ min: -(2 ** (p.outBits - 1)), max: 2 ** (p.outBits - 1) - 1 });
  return fc.oneof(
    fc.constantFrom(Kind.Hello, Kind.Pause, Kind.Resume, Kind.Abort).map((kind) => ({ kind }) as Message),
    angleOf(p).map((angleCode) => ({ kind: Kind.One, angleCode }) as Message),
    fc.array(angleOf(p), { minLength: 1, maxLength: maxListCodes(p) }).map((angleCodes) => ({ kind: Kind.List, angleCodes }) as Message),
    fc
      .record({ start: p.angleFormat === 'rad' ? signedOf(32) : fc.nat({ max: 0xffffffff }), step: signedOf(32), count: fc.nat({ max: 0xffffffff }) })
      .map((s) => ({ kind: Kind.Sweep, ...s }) as Message),
    infoArb.map((info) => ({ kind: Kind.Info, info }) as Message),
    fc
      .record({
        firstIndex: fc.nat({ max: 0xffffffff }),
        pairs: fc.array(fc.tuple(fc.oneof(outCode, out), outCode), { minLength: 1, maxLength: maxResultPairs(p) }),
      })
      .map(({ firstIndex, pairs }) => ({ kind: Kind.Results, firstIndex, cos: Int32Array.from(pairs, (q) => q[0]), sin: Int32Array.from(pairs, (q) => q[1]) }) as Message),
    fc.record({ done: fc.nat({ max: 0xffffffff }), status: fc.constantFrom(0, 1, 2) }).map((e) => ({ kind: Kind.SweepEnd, ...e }) as Message),
    fc.constantFrom(Kind.One, Kind.List, Kind.Sweep, Kind.Pause).map((acked) => ({ kind: Kind.Ack, acked }) as Message),
    fc.record({ refused: fc.constantFrom(Kind.One, Kind.List, 0x55), reason: fc.integer({ min: 1, max: 6 }) }).map((n) => ({ kind: Kind.Nak, ...n }) as Message),
  );
}

const pm = profileArb.chain((p) => fc.tuple(fc.constant(p), messageArb(p)));

describe('payload codecs', () => {
  it('round-trip every KIND under every profile', () => {
    fc.assert(
      fc.property(pm, ([p, m]) => {
        const payload = encodePayload(m, p);
        expect(isPossibleLength(m.kind, payload.length, p)).toBe(true);
        expect(decodePayload(m.kind, payload, p)).toEqual(m);
      }),
      { numRuns: 500 },
    );
  });

  it('round-trip every KIND through a frame and the streaming decoder', () => {
    fc.assert(
      fc.property(pm, fc.integer({ min: 0, max: 255 }), ([p, m], tag) => {
        const got: DecodedFrame[] = [];
        new FrameDecoder({ profile: p, onFrame: (f) => got.push(f) }).push(encodeMessage(m, tag, p));
        expect(got).toHaveLength(1);
        expect(got[0].tag).toBe(tag);
        expect(decodePayload(got[0].kind, got[0].payload, p)).toEqual(m);
      }),
    );
  });

  it('lays out a ONE request for a 16-bit turn angle little-endian', () => {
    // 30° as a 16-bit binary angle is 5461 = 0x1555 (docs/references.md "Number formats").
    const p: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 16 };
    expect([...encodePayload({ kind: Kind.One, angleCode: 5461 }, p)]).toEqual([0x55, 0x15]);
  });

  it('sign-extends a 12-bit output into its 2-byte field and reads it back negative', () => {
    const p: WireProfile = { angleFormat: 'turn', angleBits: 12, outBits: 12 };
    const bytes = encodePayload({ kind: Kind.Results, firstIndex: 3, cos: Int32Array.of(-2048), sin: Int32Array.of(2047) }, p);
    expect([...bytes]).toEqual([3, 0, 0, 0, 0x00, 0xf8, 0xff, 0x07]);
    const m = decodePayload(Kind.Results, bytes, p);
    expect(m).toMatchObject({ firstIndex: 3, cos: Int32Array.of(-2048), sin: Int32Array.of(2047) });
  });

  it('reads rad angle codes as two\'s complement and turn angle codes as unsigned', () => {
    const bytes = Uint8Array.of(0x00, 0x80);
    expect(decodePayload(Kind.One, bytes, { angleFormat: 'rad', angleBits: 16, outBits: 16 })).toEqual({ kind: Kind.One, angleCode: -32768 });
    expect(decodePayload(Kind.One, bytes, { angleFormat: 'turn', angleBits: 16, outBits: 16 })).toEqual({ kind: Kind.One, angleCode: 32768 });
  });

  it('uses 3-byte fields for 24-bit cores', () => {
    const p: WireProfile = { angleFormat: 'rad', angleBits: 18, outBits: 24 };
    expect(encodePayload({ kind: Kind.One, angleCode: -1 }, p)).toEqual(Uint8Array.of(0xff, 0xff, 0xff));
    expect(maxResultPairs(p)).toBe(41);
    expect(maxListCodes(p)).toBe(85);
  });

  it('fits 127 LIST codes and 62 RESULTS pairs in a frame for 16-bit cores, as the link budget assumes', () => {
    const p: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 16 };
    // docs/protocol.md "7. Throughput": RESULTS frames of 62 pairs, 5 + 4 + 62·4 = 257 bytes.
    expect(maxResultPairs(p)).toBe(62);
    expect(encodeMessage({ kind: Kind.Results, firstIndex: 0, cos: new Int32Array(62), sin: new Int32Array(62) }, 0, p)).toHaveLength(257);
    expect(maxListCodes(p)).toBe(127);
  });

  it('refuses values that do not fit their field, naming the field', () => {
    const p: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 16 };
    expect(() => encodePayload({ kind: Kind.One, angleCode: 65536 }, p)).toThrow(/angleCode/);
    expect(() => encodePayload({ kind: Kind.List, angleCodes: [] }, p)).toThrow(PayloadError);
    expect(() => encodePayload({ kind: Kind.Results, firstIndex: 0, cos: Int32Array.of(1), sin: Int32Array.of() }, p)).toThrow(/same length/);
    expect(() => encodePayload({ kind: Kind.Results, firstIndex: 0, cos: new Int32Array(63), sin: new Int32Array(63) }, p)).toThrow(/1\.\.62/);
    expect(() => encodePayload({ kind: Kind.Nak, refused: 1, reason: 300 }, p)).toThrow(/reason/);
  });

  it('refuses to decode an impossible LEN, an unknown KIND and an unknown INFO angle format', () => {
    const p: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 16 };
    expect(() => decodePayload(Kind.Ack, new Uint8Array(2), p)).toThrow(/LEN 2/);
    expect(() => decodePayload(0x42, new Uint8Array(0), p)).toThrow(/unknown KIND/);
    const info = new Uint8Array(17);
    info[1] = 2;
    expect(() => decodePayload(Kind.Info, info, p)).toThrow(/angleFormat/);
  });

  it('keeps an angle code outside angleBits on the wire but flags it as out of range (NAK 6)', () => {
    const p: WireProfile = { angleFormat: 'turn', angleBits: 12, outBits: 16 };
    const m = decodePayload(Kind.One, encodePayload({ kind: Kind.One, angleCode: 4096 }, p), p) as { angleCode: number };
    expect(m.angleCode).toBe(4096);
    expect(isAngleCodeInRange(4095, p)).toBe(true);
    expect(isAngleCodeInRange(4096, p)).toBe(false);
    expect(isAngleCodeInRange(-2048, { ...p, angleFormat: 'rad' })).toBe(true);
    expect(isAngleCodeInRange(2048, { ...p, angleFormat: 'rad' })).toBe(false);
  });

  it('derives the wire profile from INFO', () => {
    const info: DeviceInfo = { version: 1, angleFormat: 'rad', angleBits: 16, angleFrac: 12, outBits: 18, outFrac: 16, iterations: 18, queueDepth: 4096, buildId: 7, clockKHz: 100000, name: 'demo' };
    expect(profileFromInfo(info)).toEqual({ angleFormat: 'rad', angleBits: 16, outBits: 18 });
  });

  it('wraps turn sweeps to angleBits and saturates rad sweeps', () => {
    const turn: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 16 };
    const rad: WireProfile = { angleFormat: 'rad', angleBits: 16, outBits: 16 };
    expect([0, 1, 2].map((i) => sweepAngleCode(65534, 1, i, turn))).toEqual([65534, 65535, 0]);
    expect(sweepAngleCode(0, -1, 1, turn)).toBe(65535);
    expect(sweepAngleCode(32000, 1000, 2, rad)).toBe(32767);
    expect(sweepAngleCode(-32000, -1000, 2, rad)).toBe(-32768);
    // Exact even where i·step passes 2^53: (2^32 − 1)·(−2^31) mod 2^16 = 0.
    expect(sweepAngleCode(5, -(2 ** 31), 2 ** 32 - 1, turn)).toBe(5);
  });

  it('names KINDs, NAK reasons and sweep statuses as the protocol numbers them', () => {
    expect(kindName(Kind.SweepEnd)).toBe('SWEEP_END');
    expect(kindName(0x33)).toBe('0x33');
    expect(NakReason).toEqual({ BadCheck: 1, BadLength: 2, UnknownKind: 3, Paused: 4, QueueFull: 5, AngleOutOfRange: 6, VectorOutOfRange: 7 });
    expect(SweepStatus).toEqual({ Complete: 0, Aborted: 1, Overflow: 2 });
    expect(Kind).toMatchObject({ Hello: 0x01, One: 0x10, List: 0x11, Sweep: 0x12, Info: 0x81, Results: 0x90, SweepEnd: 0x92, Ack: 0xa0, Nak: 0xaf });
  });
});

describe('the worked example of docs/protocol.md', () => {
  const p: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 16 };
  const bytes = (s: string) => Uint8Array.from(s.split(' '), (h) => parseInt(h, 16));

  it('encodes ONE 30° with TAG 0x2A as A5 10 2A 02 55 15 90', () => {
    expect(encodeMessage({ kind: Kind.One, angleCode: 5461 }, 0x2a, p)).toEqual(bytes('A5 10 2A 02 55 15 90'));
  });

  it('encodes its RESULTS reply (cos 14189, sin 8192) as documented, CHECK confirmed by the crc package', () => {
    const reply = encodeMessage({ kind: Kind.Results, firstIndex: 0, cos: Int32Array.of(14189), sin: Int32Array.of(8192) }, 0x2a, p);
    expect(reply).toEqual(bytes('A5 90 2A 08 00 00 00 00 6D 37 00 20 9D'));
    // Outside reference: the crc package's crc8 (CRC-8/SMBUS).
    expect(crcSmbus(Buffer.from(reply.subarray(1, 12)))).toBe(0x9d);
    expect(crcSmbus(Buffer.from(bytes('10 2A 02 55 15')))).toBe(0x90);
    // The codes are code 5461's exact cos and sin in Q2.14, rounded: 29.99817°.
    const a = (5461 * 2 * Math.PI) / 65536;
    expect([Math.round(Math.cos(a) * 16384), Math.round(Math.sin(a) * 16384)]).toEqual([14189, 8192]);
  });
});
