// fast-check generators shared by the link tests: frames that are valid under the default profile.
import fc from 'fast-check';
import { encodeFrame } from '../../../shared/link/frame';
import { Kind } from '../../../shared/link/kinds';

/**
 * Payload lengths that are possible for each KIND with 16-bit angles and 16-bit outputs, and the
 * default vectoring core's 16-bit x/y, 16-bit angles and 18-bit (3-byte) magnitudes.
 */
const lengthFor: Record<number, fc.Arbitrary<number>> = {
  [Kind.Hello]: fc.constant(0),
  [Kind.One]: fc.constant(2),
  [Kind.List]: fc.integer({ min: 1, max: 127 }).map((k) => 2 * k),
  [Kind.Sweep]: fc.constant(12),
  [Kind.Pause]: fc.constant(0),
  [Kind.Resume]: fc.constant(0),
  [Kind.Abort]: fc.constant(0),
  [Kind.Info]: fc.integer({ min: 17, max: 255 }),
  [Kind.Results]: fc.integer({ min: 1, max: 62 }).map((n) => 4 + 4 * n),
  [Kind.SweepEnd]: fc.constant(5),
  [Kind.Ack]: fc.constant(1),
  [Kind.Nak]: fc.constant(2),
  [Kind.Modes]: fc.constant(0),
  [Kind.VecOne]: fc.constant(4),
  [Kind.VecList]: fc.integer({ min: 1, max: 63 }).map((k) => 4 * k),
  [Kind.VecGrid]: fc.constant(20),
  [Kind.ModeInfo]: fc.integer({ min: 9, max: 255 }),
  [Kind.VecResults]: fc.integer({ min: 1, max: 50 }).map((n) => 4 + 5 * n),
};

export interface RawFrame {
  kind: number;
  tag: number;
  payload: Uint8Array;
}

/** A frame with a known KIND and a LEN possible for it (default profile). */
export const rawFrameArb: fc.Arbitrary<RawFrame> = fc
  .constantFrom(...Object.values(Kind))
  .chain((kind) =>
    fc.record({
      kind: fc.constant<number>(kind),
      tag: fc.integer({ min: 0, max: 255 }),
      payload: lengthFor[kind].chain((n) => fc.uint8Array({ minLength: n, maxLength: n })),
    }),
  );

/** Concatenates byte arrays. */
export function concat(parts: Uint8Array[]): Uint8Array {
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}

/** Encodes frames back to back and returns the stream with each frame's offset. */
export function streamOf(frames: RawFrame[]): { bytes: Uint8Array; offsets: number[] } {
  const encoded = frames.map((f) => encodeFrame(f.kind, f.tag, f.payload));
  const offsets: number[] = [];
  let o = 0;
  for (const e of encoded) {
    offsets.push(o);
    o += e.length;
  }
  return { bytes: concat(encoded), offsets };
}
