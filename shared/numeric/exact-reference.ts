// The exact side of scoring: sin and cos of the angle a code stands for, in double precision, and
// the ideal output codes (the exact value rounded once to the output format).
import { angleCodeRange, assertAngleCode, roundHalfAwayFromZero, saturateOutputCode, type AngleFormat, type OutputFormat } from './formats';
import type { CosSin } from './cordic-model';

const QUARTER_PI = Math.PI / 4;

// sin and cos of 2π·turns into cosOut[k], sinOut[k], reduced by octant first so that binary
// angles keep their symmetries exactly (sin of half a turn is 0, not 1.2e−16) and large angles
// lose no precision. Written for the batch loop (results go straight into the caller's arrays).
function turnsInto(turns: number, cosOut: Float64Array, sinOut: Float64Array, k: number): void {
  const t = turns - Math.floor(turns);
  const e = t * 8; // exact: a power-of-two scaling
  let octant = Math.floor(e);
  let r = e - octant; // exact; r ∈ [0, 1)
  if (octant === 8) octant = 0; // t just below 1 rounded up
  if (octant & 1) r = 1 - r; // odd octants mirror: measure from the next multiple of π/4
  const a = r * QUARTER_PI;
  const s = Math.sin(a);
  const c = Math.cos(a);
  // Octant o: (cos, sin) built from the first-octant pair (c, s); 0 − v keeps zeros positive.
  let oc: number;
  let os: number;
  switch (octant) {
    case 0: oc = c; os = s; break;
    case 1: oc = s; os = c; break;
    case 2: oc = 0 - s; os = c; break;
    case 3: oc = 0 - c; os = s; break;
    case 4: oc = 0 - c; os = 0 - s; break;
    case 5: oc = 0 - s; os = 0 - c; break;
    case 6: oc = s; os = 0 - c; break;
    default: oc = c; os = 0 - s;
  }
  cosOut[k] = oc;
  sinOut[k] = os;
}

/** Turns (`turn`) or radians (`rad`) per code: a power of two, so multiplying by it is exact. */
const perCode = (f: AngleFormat) => (f.angleFormat === 'turn' ? 2 ** -f.angleBits : 2 ** -f.angleFrac);

// One-result scratch for the single-value functions.
const oneCos = new Float64Array(1);
const oneSin = new Float64Array(1);

/** sin and cos of 2π·turns, reduced by octant so binary angles keep their symmetries exactly. */
export function exactSinCosOfTurns(turns: number): CosSin {
  turnsInto(turns, oneCos, oneSin, 0);
  return { cos: oneCos[0], sin: oneSin[0] };
}

/** sin and cos of the angle an angle code stands for. @throws AngleCodeError */
export function exactSinCos(f: AngleFormat, code: number): CosSin {
  oneCos[0] = code;
  exactSinCosInto(f, oneCos, oneCos, oneSin);
  return { cos: oneCos[0], sin: oneSin[0] };
}

/** Exact sin and cos for many codes, into caller-owned arrays. @throws AngleCodeError */
export function exactSinCosInto(f: AngleFormat, codes: ArrayLike<number>, cosOut: Float64Array, sinOut: Float64Array): void {
  const { min, max } = angleCodeRange(f);
  const unit = perCode(f);
  const turn = f.angleFormat === 'turn';
  for (let k = 0; k < codes.length; k++) {
    const code = codes[k];
    if (!(Number.isInteger(code) && code >= min && code <= max)) assertAngleCode(f, code);
    if (turn) {
      turnsInto(code * unit, cosOut, sinOut, k);
    } else {
      const radians = code * unit;
      cosOut[k] = Math.cos(radians);
      sinOut[k] = Math.sin(radians);
    }
  }
}

/** The exact value rounded half away from zero to the output format, saturated at its ends. */
export function idealOutputCode(f: OutputFormat, value: number): number {
  return saturateOutputCode(f, roundHalfAwayFromZero(value * 2 ** f.outFrac));
}

/** The ideal output codes of one angle code: what a perfect core would return. */
export function idealOutputCodes(f: AngleFormat & OutputFormat, code: number): CosSin {
  const e = exactSinCos(f, code);
  return { cos: idealOutputCode(f, e.cos), sin: idealOutputCode(f, e.sin) };
}
