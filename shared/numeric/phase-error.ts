// Phase error of each answer: the angle from the exact vector to the answer's, in [−π, π).
import type { ModelConfig } from './model-config';

const TWO_PI = 2 * Math.PI;
/** Below this |tan δ| the series for atan is exact to double precision (next term < 1e−27 of δ). */
const SMALL_TAN = 2 ** -10;

/**
 * Phase errors into out[0..n): the angle from the exact vector to each answer, in [−π, π).
 * A working core is off by far less than a degree: there δ = atan(cross / dot) by its series,
 * which also avoids the cancellation in atan2(sin, cos) − angle. Anything else (a broken core,
 * a zero answer, half a turn off) goes the general way.
 */
export function phaseErrorsInto(
  c: Readonly<ModelConfig>,
  codes: ArrayLike<number>,
  cos: ArrayLike<number>,
  sin: ArrayLike<number>,
  exactCos: Float64Array,
  exactSin: Float64Array,
  out: Float64Array,
  n: number,
): void {
  const radPerCode = c.angleFormat === 'turn' ? TWO_PI / 2 ** c.angleBits : 2 ** -c.angleFrac;
  for (let k = 0; k < n; k++) {
    const vc = cos[k];
    const vs = sin[k];
    const cross = exactCos[k] * vs - exactSin[k] * vc;
    const dot = exactCos[k] * vc + exactSin[k] * vs;
    if (dot > 0 && Math.abs(cross) < SMALL_TAN * dot) {
      const t = cross / dot;
      const t2 = t * t;
      out[k] = t * (1 - t2 * (1 / 3 - t2 * (1 / 5 - t2 / 7)));
    } else {
      const dp = Math.atan2(vs, vc) - codes[k] * radPerCode;
      out[k] = dp - TWO_PI * Math.floor((dp + Math.PI) / TWO_PI);
    }
  }
}
