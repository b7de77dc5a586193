// Phase error of one answer: the angle from the exact vector to the answer's, in [−π, π).
import type { ModelConfig } from './model-config';

const TWO_PI = 2 * Math.PI;
/** Below this |tan δ| the series for atan is exact to double precision (next term < 1e−27 of δ). */
const SMALL_TAN = 2 ** -10;

/** Radians per angle code of the format: what phaseError's general case needs. */
export function radiansPerCode(c: Readonly<ModelConfig>): number {
  return c.angleFormat === 'turn' ? TWO_PI / 2 ** c.angleBits : 2 ** -c.angleFrac;
}

/**
 * The angle from the exact vector (exactCos, exactSin) to the answer (cos, sin) at angle `code`.
 * A working core is off by far less than a degree: there δ = atan(cross / dot) by its series,
 * which also avoids the cancellation in atan2(sin, cos) − angle. Anything else (a broken core,
 * a zero answer, half a turn off) goes the general way. Small enough for V8 to inline into the
 * scorer's per-answer loop.
 */
export function phaseError(code: number, cos: number, sin: number, exactCos: number, exactSin: number, radPerCode: number): number {
  const cross = exactCos * sin - exactSin * cos;
  const dot = exactCos * cos + exactSin * sin;
  if (dot > 0 && Math.abs(cross) < SMALL_TAN * dot) {
    const t = cross / dot;
    const t2 = t * t;
    return t * (1 - t2 * (1 / 3 - t2 * (1 / 5 - t2 / 7)));
  }
  const dp = Math.atan2(sin, cos) - code * radPerCode;
  return dp - TWO_PI * Math.floor((dp + Math.PI) / TWO_PI);
}
