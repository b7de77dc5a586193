// Every payload codec fed arbitrary payloads under arbitrary wire profiles: it either refuses
// with a PayloadError or returns a message that encodes back to the same bytes.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { Kind, kindName } from '../../shared/link/kinds';
import { decodePayload, encodePayload, PayloadError } from '../../shared/link/payloads';
import type { WireProfile } from '../../shared/link/wire-profile';

const profileArb: fc.Arbitrary<WireProfile> = fc.record(
  {
    angleFormat: fc.constantFrom('turn' as const, 'rad' as const),
    angleBits: fc.integer({ min: 1, max: 32 }),
    outBits: fc.integer({ min: 2, max: 32 }),
    // Version 2: the vectoring formats of MODE_INFO, absent before it (the default core's then).
    vector: fc.record({
      inBits: fc.integer({ min: 2, max: 32 }),
      angleFormat: fc.constantFrom('turn' as const, 'rad' as const),
      angleBits: fc.integer({ min: 1, max: 31 }),
      magBits: fc.integer({ min: 2, max: 32 }),
    }),
  },
  { requiredKeys: ['angleFormat', 'angleBits', 'outBits'] },
);

/** The LEN rules of docs/protocol.md "5. Which LEN values are possible", restated here from the table. */
function protocolAllows(kind: number, len: number, p: WireProfile): boolean {
  const angle = Math.ceil(p.angleBits / 8);
  const pair = 2 * Math.ceil(p.outBits / 8);
  // Section 5's v, p and m: the default vectoring core (16-bit x/y, 16-bit angles, 18-bit magnitudes) before MODE_INFO.
  const v = p.vector ?? { inBits: 16, angleBits: 16, magBits: 18 };
  const vec = 2 * Math.ceil(v.inBits / 8);
  const answer = Math.ceil(v.angleBits / 8) + Math.ceil(v.magBits / 8);
  switch (kind) {
    case Kind.Modes:
      return len === 0;
    case Kind.VecOne:
      return len === vec;
    case Kind.VecList:
      return len > 0 && len % vec === 0;
    case Kind.VecGrid:
      return len === 20;
    case Kind.ModeInfo:
      return len >= 9;
    case Kind.VecResults:
      return len > 4 && (len - 4) % answer === 0;
    case Kind.Hello:
    case Kind.Pause:
    case Kind.Resume:
    case Kind.Abort:
      return len === 0;
    case Kind.One:
      return len === angle;
    case Kind.List:
      return len > 0 && len % angle === 0;
    case Kind.Sweep:
      return len === 12;
    case Kind.Info:
      return len >= 17;
    case Kind.Results:
      return len > 4 && (len - 4) % pair === 0;
    case Kind.SweepEnd:
      return len === 5;
    case Kind.Ack:
      return len === 1;
    case Kind.Nak:
      return len === 2;
    default:
      return false;
  }
}

/** Payloads of any length half the time, of a length the KIND allows the other half. */
const payloadFor = (kind: number) =>
  profileArb.chain((profile) => {
    const allowed = Array.from({ length: 256 }, (_, n) => n).filter((n) => protocolAllows(kind, n, profile));
    const len = allowed.length > 0 ? fc.oneof(fc.constantFrom(...allowed), fc.integer({ min: 0, max: 255 })) : fc.integer({ min: 0, max: 255 });
    const bytes = len.chain((n) => fc.uint8Array({ minLength: n, maxLength: n }));
    // INFO's angle format byte is 0 or 1 in a good payload: make it so half the time.
    const payload = kind === Kind.Info ? fc.tuple(bytes, fc.boolean()).map(([b, fix]) => (fix && b.length > 1 ? (b[1] &= 1, b) : b)) : bytes;
    return fc.record({ profile: fc.constant(profile), payload });
  });

const printable = (s: string) => /^[\x20-\x7e]*$/.test(s);

describe('every payload codec under fuzzing', () => {
  for (const kind of Object.values(Kind)) {
    it(`${kindName(kind)}: refuses exactly the lengths docs/protocol.md forbids, and what it reads encodes back to the same bytes`, () => {
      let decoded = 0;
      fc.assert(
        fc.property(payloadFor(kind), ({ profile, payload }) => {
          let m;
          try {
            m = decodePayload(kind, payload, profile);
          } catch (e) {
            expect(e).toBeInstanceOf(PayloadError);
            // Refused: the length is impossible, or an INFO names an angle format other than 0 or 1,
            // or a MODE_INFO with the vectoring bit names formats no vectoring core can have.
            expect(!protocolAllows(kind, payload.length, profile) || (kind === Kind.Info && payload[1] > 1) || (kind === Kind.ModeInfo && (payload[0] & 2) !== 0)).toBe(true);
            return;
          }
          decoded++;
          expect(protocolAllows(kind, payload.length, profile)).toBe(true);
          expect(m.kind).toBe(kind);
          if (m.kind === Kind.Info && !printable(m.info.name)) {
            // The reader keeps any name byte; the writer only writes printable ASCII.
            expect([...m.info.name].map((c) => c.charCodeAt(0))).toEqual([...payload.subarray(17)]);
            expect(() => encodePayload(m, profile)).toThrow(PayloadError);
            return;
          }
          if (m.kind === Kind.ModeInfo || m.kind === Kind.VecResults) {
            // MODE_INFO's reader skips what later versions append and what the mode bits leave
            // meaningless, VEC_RESULTS a turn angle's zero fill: what they read encodes to a payload
            // that reads back the same.
            expect(decodePayload(kind, encodePayload(m, profile), profile)).toEqual(m);
            return;
          }
          expect([...encodePayload(m, profile)]).toEqual([...payload]);
        }),
        { seed: 4242 + kind, numRuns: 3000 },
      );
      expect(decoded).toBeGreaterThan(500);
    });
  }

  it('refuses every unknown KIND with a PayloadError, whatever the payload', () => {
    const known = new Set<number>(Object.values(Kind));
    const unknown = Array.from({ length: 256 }, (_, k) => k).filter((k) => !known.has(k));
    fc.assert(
      fc.property(fc.constantFrom(...unknown), fc.uint8Array({ maxLength: 255 }), profileArb, (kind, payload, profile) => {
        expect(() => decodePayload(kind, payload, profile)).toThrow(PayloadError);
      }),
      { seed: 99, numRuns: 3000 },
    );
  });
});
