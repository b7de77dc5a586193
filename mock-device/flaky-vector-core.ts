// The intermittent defect of flaky-core.ts on a vectoring core: each answer, with probability
// `rate`, has one bit of the angle or of the magnitude flipped, high bits more often (weight
// (bit+1)² over that output's width, as a late carry). Healthy until the onset; seeded, so a soak
// can be repeated; every flip reported, so a test knows exactly which vectors the board got wrong.
import { bitWeights, pickBit, type FlakyFault, type FlakyOptions } from './flaky-core';
import { seededRandom } from './line-faults';
import type { SimVectorCore } from './vector-core';

/** One flip a vectoring board made: the vector asked, the output and bit, the true and the sent answer. */
export interface VectorCoreFlip {
  x: number;
  y: number;
  channel: 'angle' | 'magnitude';
  bit: number;
  healthy: { angle: number; magnitude: number };
  answer: { angle: number; magnitude: number };
  atMs: number;
}

export interface FlakyVectorOptions extends Omit<FlakyOptions, 'onFlip'> {
  onFlip?: (flip: VectorCoreFlip) => void;
}

/** Bit `bit` of a `width`-bit code flipped; a signed code stays two's complement, an unsigned one stays unsigned. */
export function flipCodeBit(v: number, width: number, signed: boolean, bit: number): number {
  const m = 2 ** width;
  const u = v < 0 ? v + m : v;
  const w = Math.floor(u / 2 ** bit) % 2 === 1 ? u - 2 ** bit : u + 2 ** bit;
  return signed && w >= m / 2 ? w - m : w;
}

export function createFlakyVectorCore(core: SimVectorCore, fault: FlakyFault, o: FlakyVectorOptions): SimVectorCore {
  const random = seededRandom(o.seed);
  const c = core.config;
  const angleWeights = bitWeights(c.angleBits);
  const magWeights = bitWeights(c.magBits);
  // A `turn` angle is unsigned (it wraps at a full turn), a `rad` angle and the magnitude signed (protocol.md section 8).
  const angleSigned = c.angleFormat === 'rad';
  const healthyUntil = o.now() + fault.onsetS * 1000;
  return {
    config: c,
    answer(x, y) {
      const healthy = core.answer(x, y);
      const now = o.now();
      if (now < healthyUntil || random() >= fault.rate) return healthy;
      const channel = random() < 0.5 ? 'angle' : 'magnitude';
      const bit = pickBit(channel === 'angle' ? angleWeights : magWeights, random());
      const answer =
        channel === 'angle'
          ? { angle: flipCodeBit(healthy.angle, c.angleBits, angleSigned, bit), magnitude: healthy.magnitude }
          : { angle: healthy.angle, magnitude: flipCodeBit(healthy.magnitude, c.magBits, true, bit) };
      o.onFlip?.({ x, y, channel, bit, healthy, answer, atMs: now });
      return answer;
    },
  };
}
