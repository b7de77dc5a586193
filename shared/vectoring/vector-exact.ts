// The exact side of scoring a vectoring core: atan2 and hypot of the input vector in double
// precision, in the units of the output codes (angle LSB, magnitude LSB), and the ideal codes (the
// exact values rounded once to the formats).
import { cordicGain } from '../numeric/cordic-tables';
import { roundHalfAwayFromZero } from '../numeric/formats';
import { VectorInputError } from './errors';
import { inputRange, type VectorConfig } from './vector-config';
import { angleOutputRange, magnitudeRange, type AngleMagnitude } from './vector-model';

const TWO_PI = 2 * Math.PI;

/**
 * The magnitude an ideal core of this configuration returns for a unit vector: the CORDIC growth
 * A_n = 1/K_n when the core leaves it in, 1 when it multiplies it away. The exact magnitude
 * includes it, so an uncompensated core is judged on its rounding, not on its documented gain.
 */
export function nominalGain(c: Pick<VectorConfig, 'iterations' | 'gainCompensation'>): number {
  return c.gainCompensation === 'none' ? 1 / cordicGain(c.iterations) : 1;
}

/**
 * Exact angles and magnitudes for many input pairs, in output LSB (real-valued), into caller-owned
 * arrays. Angles: `turn` in [0, 2^angleBits) (a negative angle reads as a turn minus it), `rad` in
 * (−π, π] · 2^angleFrac. The zero vector's angle is 0 (atan2(0, 0) = 0, as IEEE 754 defines it).
 * @throws VectorInputError for an input the format cannot hold.
 */
export function exactVectorInto(c: VectorConfig, xs: ArrayLike<number>, ys: ArrayLike<number>, anglesOut: Float64Array, magnitudesOut: Float64Array): void {
  const { min, max } = inputRange(c);
  const turn = c.angleFormat === 'turn';
  const span = 2 ** c.angleBits;
  // Both powers of two: scaling by them is exact.
  const angleScale = turn ? span / TWO_PI : 2 ** c.angleFrac;
  const magScale = 2 ** (c.magFrac - c.inFrac);
  const gain = nominalGain(c);
  for (let k = 0; k < xs.length; k++) {
    const x = xs[k];
    const y = ys[k];
    if (!(Number.isInteger(x) && Number.isInteger(y) && x >= min && x <= max && y >= min && y <= max)) {
      throw new VectorInputError(`inputs[${k}]: (${x}, ${y}) is not a pair of integers ${min}..${max} (${c.inBits} bits)`);
    }
    let a = Math.atan2(y, x) * angleScale;
    if (turn && a < 0) a += span;
    anglesOut[k] = a;
    // x² + y² < 2^49 is exact, so the square root is correctly rounded (and cheaper than Math.hypot).
    magnitudesOut[k] = Math.sqrt(x * x + y * y) * gain * magScale;
  }
}

const oneA = new Float64Array(1);
const oneM = new Float64Array(1);

/** The exact angle and magnitude of one input pair, in output LSB. @throws VectorInputError */
export function exactVector(c: VectorConfig, x: number, y: number): AngleMagnitude {
  exactVectorInto(c, [x], [y], oneA, oneM);
  return { angle: oneA[0], magnitude: oneM[0] };
}

/** What a perfect core would return: the exact values rounded once (half away from zero), saturated or wrapped. */
export function idealVectorCodes(c: VectorConfig, x: number, y: number): AngleMagnitude {
  const e = exactVector(c, x, y);
  const span = 2 ** c.angleBits;
  const a = roundHalfAwayFromZero(e.angle);
  const ar = angleOutputRange(c);
  const angle = c.angleFormat === 'turn' ? a % span : Math.min(ar.max, Math.max(ar.min, a));
  const mr = magnitudeRange(c);
  return { angle, magnitude: Math.min(mr.max, roundHalfAwayFromZero(e.magnitude)) };
}
