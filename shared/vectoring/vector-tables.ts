// Constants of the vectoring datapath, derived from the configuration as docs/model.md
// ("Vectoring cores") states. The arctangent table and the turn units are the rotation model's
// (buildCordicTables), so both kinds of core read angles with one set of rules.
import { buildCordicTables, cordicGain } from '../numeric/cordic-tables';
import { DEFAULT_MODEL_CONFIG } from '../numeric/model-config';
import type { VectorConfig } from './vector-config';

/** Everything the vectoring loop needs, as integers in the accumulators' own units. */
export interface VectorTables {
  /** Fraction bits of the x/y datapath: inFrac + guardBits. */
  xyFrac: number;
  /** z units in a half turn and a quarter turn (the pre-rotation angles). */
  zHalf: number;
  zQuarter: number;
  /** z units in one full turn. */
  zTurn: number;
  /** atan(2^−i) in z units, i = 0..iterations−1. */
  atan: Float64Array;
  /** The gain-compensating constant round(1/A_n · 2^gainBits) (or floored); 0 without compensation. */
  gainConst: number;
}

/** Builds the vectoring datapath constants for one configuration. */
export function buildVectorTables(c: VectorConfig): VectorTables {
  // The rotation tables depend only on the angle format, zGuardBits and iterations here.
  const t = buildCordicTables({
    ...DEFAULT_MODEL_CONFIG,
    angleFormat: c.angleFormat,
    angleBits: c.angleBits,
    angleFrac: c.angleFrac,
    zGuardBits: c.zGuardBits,
    iterations: c.iterations,
  });
  // cordicGain is K_n = 1/A_n, the inverse of the growth, below 1: gainBits are all fraction bits.
  const exact = cordicGain(c.iterations) * 2 ** c.gainBits;
  const gainConst = c.gainCompensation === 'none' ? 0 : c.gainRounding === 'nearest' ? Math.round(exact) : Math.floor(exact);
  return { xyFrac: c.inFrac + c.guardBits, zHalf: t.zHalf, zQuarter: t.zQuarter, zTurn: t.zTurn, atan: t.atan, gainConst };
}
