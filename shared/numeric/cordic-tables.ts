// Constants of the CORDIC datapath, derived from the configuration exactly as the model
// definition states (docs/model.md), so the simulated board and the scorer share one table.
import { roundHalfAwayFromZero } from './formats';
import type { ModelConfig } from './model-config';

/** K_n = Π_{i<n} 1/√(1 + 2^−2i): the inverse of the rotation gain after n iterations. */
export function cordicGain(iterations: number): number {
  let k = 1;
  for (let i = 0; i < iterations; i++) k *= 1 / Math.sqrt(1 + 2 ** (-2 * i));
  return k;
}

/** Everything the iteration loop needs, as integers in the accumulators' own units. */
export interface CordicTables {
  /** x/y fraction bits: outFrac + guardBits. */
  xyFrac: number;
  /** Start value of x: round(K_n · 2^F). */
  x0: number;
  /** z units in one full turn, half a turn and a quarter turn. */
  zTurn: number;
  zHalf: number;
  zQuarter: number;
  /** Fraction bits of z in radians (`rad`), or bits of z per turn (`turn`). */
  zBits: number;
  /** atan(2^−i) in z units, i = 0..iterations−1. */
  atan: Float64Array;
  /** 2^i, i = 0..iterations, so the loop divides instead of using 32-bit shifts. */
  pow2: Float64Array;
}

/** Builds the datapath constants for one configuration. */
export function buildCordicTables(c: ModelConfig): CordicTables {
  const n = c.iterations;
  const xyFrac = c.outFrac + c.guardBits;
  const atan = new Float64Array(n);
  const pow2 = new Float64Array(n + 1);
  for (let i = 0; i <= n; i++) pow2[i] = 2 ** i;
  let zTurn: number;
  let zHalf: number;
  let zQuarter: number;
  let zBits: number;
  if (c.angleFormat === 'turn') {
    zBits = c.angleBits + c.zGuardBits;
    zTurn = 2 ** zBits;
    zHalf = zTurn / 2;
    zQuarter = zTurn / 4;
    for (let i = 0; i < n; i++) atan[i] = roundHalfAwayFromZero((Math.atan(2 ** -i) / (2 * Math.PI)) * zTurn);
  } else {
    zBits = c.angleFrac + c.zGuardBits;
    const scale = 2 ** zBits;
    zTurn = roundHalfAwayFromZero(2 * Math.PI * scale);
    zHalf = roundHalfAwayFromZero(Math.PI * scale);
    zQuarter = roundHalfAwayFromZero((Math.PI / 2) * scale);
    for (let i = 0; i < n; i++) atan[i] = roundHalfAwayFromZero(Math.atan(2 ** -i) * scale);
  }
  return { xyFrac, x0: roundHalfAwayFromZero(cordicGain(n) * 2 ** xyFrac), zTurn, zHalf, zQuarter, zBits, atan, pow2 };
}
