// The bit-accurate reference model of a rotation-mode CORDIC sine/cosine core. Every product part
// (scorer, simulated board, runner) evaluates through here, so its arithmetic is the definition.
// Values reach 2^40, beyond JavaScript's 32-bit shifts: the general path's shifts are floor
// divisions by powers of two, exact on integers below 2^53; datapaths that fit in 32 bits take
// an integer path with the same results (fitsInt32).
import { buildCordicTables, type CordicTables } from './cordic-tables';
import { AngleCodeError } from './errors';
import { angleCodeRange, outputCodeRange } from './formats';
import { parseModelConfig, type ModelConfig, type ModelConfigInput } from './model-config';
import { shiftRound, shiftRoundAddends32 } from './shift-round';

/** The model's answer for one angle code. */
export interface CosSin {
  cos: number;
  sin: number;
}

/** A configured model, ready to evaluate codes. */
export interface CordicModel {
  readonly config: Readonly<ModelConfig>;
  readonly tables: Readonly<CordicTables>;
  /** Cos and sin output codes for one angle code. @throws AngleCodeError */
  evaluate(code: number): CosSin;
  /**
   * Evaluates many codes into caller-owned arrays without allocating.
   * @throws AngleCodeError naming the index of the first code out of range.
   */
  evaluateInto(codes: ArrayLike<number>, cosOut: Int32Array, sinOut: Int32Array): void;
}

/**
 * Reads an angle code into z units: `turn` as a signed zBits-bit number (the circle becomes
 * [−1/2, 1/2) turn), `rad` reduced by the fewest whole turns into [−half, +half] turn.
 * Folding comes after, in the iteration's caller.
 */
export function readAngle(c: ModelConfig, t: CordicTables, code: number): number {
  const g = 2 ** c.zGuardBits;
  if (c.angleFormat === 'turn') return (code >= 2 ** (c.angleBits - 1) ? code - 2 ** c.angleBits : code) * g;
  let z = code * g;
  // The loops only fix a rare off-by-one of the division.
  if (z > t.zHalf) {
    z -= Math.ceil((z - t.zHalf) / t.zTurn) * t.zTurn;
    while (z > t.zHalf) z -= t.zTurn;
  } else if (z < -t.zHalf) {
    z += Math.ceil((-t.zHalf - z) / t.zTurn) * t.zTurn;
    while (z < -t.zHalf) z += t.zTurn;
  }
  return z;
}

/**
 * Whether every value of the iteration stays a 32-bit integer: |x|, |y| stay below about 2^(F+1)
 * (the rotation keeps the vector's length near x0/K ≤ 2^F), |z| below a turn plus Σ atan, and
 * shifts stay below 31.
 */
export function fitsInt32(c: ModelConfig, t: CordicTables): boolean {
  return t.xyFrac <= 28 && c.iterations <= 30 && t.zTurn <= 2 ** 29;
}

/**
 * Creates a model from a (partial) configuration. `arithmetic: 'float'` forces the general
 * double-based path, so tests can check that both paths agree. @throws ModelConfigError
 */
export function createCordicModel(input: ModelConfigInput | ModelConfig = {}, arithmetic: 'auto' | 'float' = 'auto'): CordicModel {
  const config = Object.freeze(parseModelConfig(input));
  const key = `${arithmetic} ${JSON.stringify(config)}`;
  let model = models.get(key);
  if (!model) {
    model = buildModel(config, arithmetic);
    if (models.size >= MODELS_KEPT) models.delete(models.keys().next().value!);
    models.set(key, model);
  }
  return model;
}

// Models are immutable, so one per configuration is shared. Besides saving the tables, this
// keeps the hot loop in one set of closures that V8 has already optimised: a fresh model per
// scorer would start cold every time, and would be slower once many exist.
const MODELS_KEPT = 32;
const models = new Map<string, CordicModel>();

function buildModel(config: Readonly<ModelConfig>, arithmetic: 'auto' | 'float'): CordicModel {
  const tables = buildCordicTables(config);
  const { atan, x0, zHalf, zQuarter } = tables;
  const turn = config.angleFormat === 'turn';
  const zUnit = 2 ** config.zGuardBits;
  const codeHalf = 2 ** (config.angleBits - 1);
  const codeTurn = 2 ** config.angleBits;
  const fold = config.fold;
  const n = config.iterations;
  const nearestShift = config.shiftRounding === 'nearest';
  // Called through a local: so the loop kept the old inline step's speed; through the import it measured slower under tsx.
  const shift = shiftRound;
  const g = config.guardBits;
  const outScale = 2 ** -g;
  const outBias = config.outputRounding === 'nearest' && g > 0 ? 2 ** (g - 1) : 0;
  const { min: outMin, max: outMax } = outputCodeRange(config);
  const { min: codeMin, max: codeMax } = angleCodeRange(config);
  let lastCos = 0;
  let lastSin = 0;

  const out = (v: number): number => {
    const r = g === 0 ? v : Math.floor((v + outBias) * outScale);
    return r < outMin ? outMin : r > outMax ? outMax : r;
  };

  // The angle in z units, folded into ±90° when the core folds; `negate` says to turn the result
  // half a turn back. Shared by both paths; results land in closure variables so nothing allocates.
  let negate = false;
  const foldedAngle = (code: number): number => {
    // readAngle for `turn`, inlined with its constants hoisted.
    const z = turn ? (code >= codeHalf ? code - codeTurn : code) * zUnit : readAngle(config, tables, code);
    negate = fold && (z > zQuarter || z < -zQuarter);
    return negate ? (z > 0 ? z - zHalf : z + zHalf) : z;
  };

  // Leaves the result in lastCos/lastSin so the batch path allocates nothing per sample.
  const runFloat = (code: number): void => {
    let z = foldedAngle(code);
    let x = x0;
    let y = 0;
    for (let i = 0; i < n; i++) {
      const sx = shift(x, i, nearestShift);
      const sy = shift(y, i, nearestShift);
      if (z >= 0) {
        x -= sy;
        y += sx;
        z -= atan[i];
      } else {
        x += sy;
        y -= sx;
        z += atan[i];
      }
    }
    if (negate) {
      // 0 − v, not −v: a negated zero must stay +0 for callers that compare results deeply.
      x = 0 - x;
      y = 0 - y;
    }
    lastCos = out(x);
    lastSin = out(y);
  };

  // The same arithmetic in 32-bit integers, for datapaths that fit (the common cores): `>>` is
  // the floor division, and the rotation direction is a sign mask, since a data-dependent branch
  // per step is mispredicted about half the time. Several times faster than runFloat.
  const atan32 = Int32Array.from(atan);
  const roundAdd32 = shiftRoundAddends32(n, nearestShift);
  const runInt32 = (code: number): void => {
    let z = foldedAngle(code) | 0;
    let x = x0 | 0;
    let y = 0;
    for (let i = 0; i < n; i++) {
      const d = z >> 31; // 0 when z ≥ 0, −1 when z < 0; (v ^ d) − d is then v or −v
      const ra = roundAdd32[i];
      const sx = (x + ra) >> i;
      const sy = (y + ra) >> i;
      x = (x - ((sy ^ d) - d)) | 0;
      y = (y + ((sx ^ d) - d)) | 0;
      z = (z - ((atan32[i] ^ d) - d)) | 0;
    }
    if (negate) {
      x = -x | 0;
      y = -y | 0;
    }
    lastCos = outInt32(x);
    lastSin = outInt32(y);
  };
  const outInt32 = (v: number): number => {
    const r = g === 0 ? v : (v + outBias) >> g;
    return r < outMin ? outMin : r > outMax ? outMax : r;
  };

  const run = arithmetic === 'float' || !fitsInt32(config, tables) ? runFloat : runInt32;

  const check = (code: number, where: string): void => {
    if (!(Number.isInteger(code) && code >= codeMin && code <= codeMax)) {
      throw new AngleCodeError(`${where}angle code ${code} is not an integer ${codeMin}..${codeMax} (${config.angleFormat}, ${config.angleBits} bits)`);
    }
  };

  return {
    config,
    tables,
    evaluate(code) {
      check(code, '');
      run(code);
      return { cos: lastCos, sin: lastSin };
    },
    evaluateInto(codes, cosOut, sinOut) {
      if (cosOut.length < codes.length || sinOut.length < codes.length) {
        throw new RangeError(`output arrays hold ${Math.min(cosOut.length, sinOut.length)} results, ${codes.length} codes given`);
      }
      for (let k = 0; k < codes.length; k++) {
        const code = codes[k];
        // The message is only built for a bad code: a string per good one would cost more than the model.
        if (!(Number.isInteger(code) && code >= codeMin && code <= codeMax)) check(code, `codes[${k}]: `);
        run(code);
        cosOut[k] = lastCos;
        sinOut[k] = lastSin;
      }
    },
  };
}
