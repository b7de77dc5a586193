// A step-by-step record of one evaluation, for the worked example in docs/model.md and for
// people checking an RTL simulation against the model iteration by iteration. It follows the
// same definition as cordic-model.ts; the tests hold the two to the same answers.
import { readAngle, type CordicModel, type CosSin } from './cordic-model';

/** The state after one iteration i: direction d, the shifted values used, and the new x, y, z. */
export interface CordicStep {
  i: number;
  d: 1 | -1;
  sx: number;
  sy: number;
  atan: number;
  x: number;
  y: number;
  z: number;
}

/** Everything that happened to one angle code inside the model. */
export interface CordicTrace extends CosSin {
  code: number;
  /** z after reading the code (and reducing it, for `rad`). */
  zRead: number;
  /** z after folding, the start of the iterations. */
  zStart: number;
  negate: boolean;
  x0: number;
  steps: CordicStep[];
  /** x and y after the iterations and the final negation, before the output stage. */
  xEnd: number;
  yEnd: number;
}

/** Evaluates one code and records every iteration. @throws AngleCodeError */
export function traceCordic(model: CordicModel, code: number): CordicTrace {
  const result = model.evaluate(code); // also validates the code
  const c = model.config;
  const t = model.tables;
  const zRead = readAngle(c, t, code);
  let z = zRead;
  let negate = false;
  if (c.fold && z > t.zQuarter) {
    z -= t.zHalf;
    negate = true;
  } else if (c.fold && z < -t.zQuarter) {
    z += t.zHalf;
    negate = true;
  }
  const zStart = z;
  let x = t.x0;
  let y = 0;
  const steps: CordicStep[] = [];
  for (let i = 0; i < c.iterations; i++) {
    const d: 1 | -1 = z >= 0 ? 1 : -1;
    const bias = c.shiftRounding === 'nearest' && i > 0 ? 2 ** (i - 1) : 0;
    const sx = Math.floor((x + bias) / 2 ** i);
    const sy = Math.floor((y + bias) / 2 ** i);
    x -= d * sy;
    y += d * sx;
    z -= d * t.atan[i];
    steps.push({ i, d, sx, sy, atan: t.atan[i], x, y, z });
  }
  return {
    code,
    zRead,
    zStart,
    negate,
    x0: t.x0,
    steps,
    xEnd: negate ? 0 - x : x,
    yEnd: negate ? 0 - y : y,
    cos: result.cos,
    sin: result.sin,
  };
}
