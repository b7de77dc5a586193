// The exact side of scoring: sin and cos of the angle a code stands for, in double precision, and
// the ideal output codes (the exact value rounded once to the output format).
import { angleCodeRange, assertAngleCode, roundHalfAwayFromZero, saturateOutputCode, type AngleFormat, type OutputFormat } from './formats';
import type { CosSin } from './cordic-model';

const QUARTER_PI = Math.PI / 4;

// Results of the internal helpers land here so batch callers allocate nothing per sample.
let outCos = 0;
let outSin = 0;

// sin and cos of 2π·turns, reduced by octant first so that binary angles keep their symmetries
// exactly (sin of half a turn is 0, not 1.2e−16) and large angles lose no precision.
function sinCosOfTurns(turns: number): void {
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
  switch (octant) {
    case 0: outCos = c; outSin = s; break;
    case 1: outCos = s; outSin = c; break;
    case 2: outCos = 0 - s; outSin = c; break;
    case 3: outCos = 0 - c; outSin = s; break;
    case 4: outCos = 0 - c; outSin = 0 - s; break;
    case 5: outCos = 0 - s; outSin = 0 - c; break;
    case 6: outCos = s; outSin = 0 - c; break;
    default: outCos = c; outSin = 0 - s;
  }
}

/** Turns (`turn`) or radians (`rad`) per code: a power of two, so multiplying by it is exact. */
const perCode = (f: AngleFormat) => (f.angleFormat === 'turn' ? 2 ** -f.angleBits : 2 ** -f.angleFrac);

function sinCosOfCode(f: AngleFormat, code: number, min: number, max: number, unit: number): void {
  if (!(Number.isInteger(code) && code >= min && code <= max)) assertAngleCode(f, code);
  if (f.angleFormat === 'turn') {
    sinCosOfTurns(code * unit);
  } else {
    const radians = code * unit;
    outCos = Math.cos(radians);
    outSin = Math.sin(radians);
  }
}

/** sin and cos of 2π·turns, reduced by octant so binary angles keep their symmetries exactly. */
export function exactSinCosOfTurns(turns: number): CosSin {
  sinCosOfTurns(turns);
  return { cos: outCos, sin: outSin };
}

/** sin and cos of the angle an angle code stands for. @throws AngleCodeError */
export function exactSinCos(f: AngleFormat, code: number): CosSin {
  const r = angleCodeRange(f);
  sinCosOfCode(f, code, r.min, r.max, perCode(f));
  return { cos: outCos, sin: outSin };
}

/** Exact sin and cos for many codes, into caller-owned arrays. @throws AngleCodeError */
export function exactSinCosInto(f: AngleFormat, codes: ArrayLike<number>, cosOut: Float64Array, sinOut: Float64Array): void {
  const r = angleCodeRange(f);
  const unit = perCode(f);
  for (let k = 0; k < codes.length; k++) {
    sinCosOfCode(f, codes[k], r.min, r.max, unit);
    cosOut[k] = outCos;
    sinOut[k] = outSin;
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
