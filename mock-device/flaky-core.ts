// An intermittent defect: a path that barely meets timing, so now and then one output bit comes
// out wrong. Each answer, with probability `rate`, has one bit of cos or sin flipped, high bits
// more often than low ones (a late carry has further to ripple to reach them). With an onset the
// core is healthy until then, as one warming up in a chamber. Seeded, so a run can be repeated,
// and every flip is reported, so a test knows exactly what the board got wrong.
import type { SimCore } from './faulty-core';
import { seededRandom } from './line-faults';

export interface FlakyFault {
  kind: 'flaky';
  /** Probability that one answer has a bit flipped, 0..1. */
  rate: number;
  /** Seconds after the board opens before the first flip can happen. */
  onsetS: number;
}

/** One flip the board made: the code asked, the channel and bit, the true and the sent answer. */
export interface CoreFlip {
  code: number;
  channel: 'cos' | 'sin';
  bit: number;
  healthy: { cos: number; sin: number };
  answer: { cos: number; sin: number };
  atMs: number;
}

const FLAKY = /^flaky:([0-9.eE+-]+)(?:@([0-9.]+))?$/;

export const isFlakyFaultText = (text: string) => text.startsWith('flaky:');

/** `flaky:RATE` or `flaky:RATE@SECONDS`. */
export function parseFlakyFault(text: string): FlakyFault {
  const m = FLAKY.exec(text.trim());
  const rate = m ? Number(m[1]) : NaN;
  const onsetS = m?.[2] !== undefined ? Number(m[2]) : 0;
  if (!m || !Number.isFinite(rate) || !Number.isFinite(onsetS)) throw new Error(`--core-fault flaky must be flaky:RATE or flaky:RATE@SECONDS (e.g. flaky:0.001@30), got "${text}"`);
  if (rate <= 0 || rate > 1) throw new Error(`--core-fault flaky: RATE is a probability per answer, above 0 and at most 1, got ${m[1]}`);
  if (onsetS > 86_400) throw new Error(`--core-fault flaky: the onset is at most 86400 s, got ${m[2]}`);
  return { kind: 'flaky', rate, onsetS };
}

export interface FlakyOptions {
  seed: number;
  /** Ms on the board's clock; the onset counts from the first call. */
  now: () => number;
  onFlip?: (flip: CoreFlip) => void;
}

/** Cumulative weights for bit 0..outBits-1, growing as (bit+1)²: the MSB is flipped most often. */
export function bitWeights(outBits: number): Float64Array {
  const w = new Float64Array(outBits);
  let sum = 0;
  for (let b = 0; b < outBits; b++) w[b] = sum += (b + 1) ** 2;
  for (let b = 0; b < outBits; b++) w[b] /= sum;
  return w;
}

/** Index of the bit a uniform draw `r` picks from cumulative weights (bitWeights). */
export function pickBit(weights: Float64Array, r: number): number {
  let bit = 0;
  while (bit < weights.length - 1 && weights[bit] < r) bit++;
  return bit;
}

export function createFlakyCore(core: SimCore, fault: FlakyFault, o: FlakyOptions): SimCore {
  const random = seededRandom(o.seed);
  const { outBits } = core.config;
  const weights = bitWeights(outBits);
  const width = 2 ** outBits;
  const half = width / 2;
  const healthyUntil = o.now() + fault.onsetS * 1000;
  const flip = (v: number, bit: number) => {
    const u = (v < 0 ? v + width : v) ^ 0; // two's complement in outBits (outBits ≤ 32)
    const f = (u ^ (2 ** bit)) >>> 0;
    return f >= half ? f - width : f;
  };
  return {
    config: core.config,
    evaluate(code) {
      const healthy = core.evaluate(code);
      const now = o.now();
      if (now < healthyUntil || random() >= fault.rate) return healthy;
      const bit = pickBit(weights, random());
      const channel = random() < 0.5 ? 'cos' : 'sin';
      const answer = channel === 'cos' ? { cos: flip(healthy.cos, bit), sin: healthy.sin } : { cos: healthy.cos, sin: flip(healthy.sin, bit) };
      o.onFlip?.({ code, channel, bit, healthy, answer, atMs: now });
      return answer;
    },
  };
}
