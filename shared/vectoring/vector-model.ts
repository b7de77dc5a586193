// The bit-accurate reference model of a vectoring-mode CORDIC core: (x, y) codes in, the angle
// code of atan2(y, x) and the magnitude code out. The arithmetic here is the definition
// (docs/model.md, "Vectoring cores"); the simulated board and the scorer evaluate through it.
// Values reach 2^52, beyond JavaScript's 32-bit shifts: the general path's shifts are floor
// divisions by powers of two, exact on integers below 2^53; datapaths that fit in 32 bits take an
// integer path with the same results (vectorFitsInt32).
import { shiftRound, shiftRoundAddends32 } from '../numeric/shift-round';
import { VectorInputError } from './errors';
import { inputRange, parseVectorConfig, type VectorConfig, type VectorConfigInput } from './vector-config';
import { buildVectorTables, type VectorTables } from './vector-tables';

/** The model's answer for one (x, y) pair: integer output codes. */
export interface AngleMagnitude {
  angle: number;
  magnitude: number;
}

/** A configured vectoring model. */
export interface VectorModel {
  readonly config: Readonly<VectorConfig>;
  readonly tables: Readonly<VectorTables>;
  /** Angle and magnitude codes for one input pair. @throws VectorInputError */
  answer(x: number, y: number): AngleMagnitude;
  /**
   * Answers many pairs into caller-owned arrays without allocating.
   * @throws VectorInputError naming the index of the first pair out of range.
   */
  answerInto(xs: ArrayLike<number>, ys: ArrayLike<number>, angles: Int32Array, magnitudes: Int32Array): void;
}

/** The angle code range: 0..2^N−1 for `turn`, −2^(N−1)..2^(N−1)−1 for `rad`. */
export function angleOutputRange(c: Pick<VectorConfig, 'angleFormat' | 'angleBits'>): { min: number; max: number } {
  const count = 2 ** c.angleBits;
  return c.angleFormat === 'turn' ? { min: 0, max: count - 1 } : { min: -count / 2, max: count / 2 - 1 };
}

/** The magnitude code range: signed two's complement, −2^(magBits−1)..2^(magBits−1)−1. */
export function magnitudeRange(c: Pick<VectorConfig, 'magBits'>): { min: number; max: number } {
  return { min: -(2 ** (c.magBits - 1)), max: 2 ** (c.magBits - 1) - 1 };
}

/**
 * Whether every value of the iteration stays a 32-bit integer: |x|, |y| < 2^(inBits+guardBits+1)
 * (see vector-config.ts), |z| below a turn, shifts below 31. The gain multiply and the output
 * stage run in doubles on both paths.
 */
export function vectorFitsInt32(c: VectorConfig, t: VectorTables): boolean {
  return c.inBits + c.guardBits <= 29 && c.iterations <= 30 && t.zTurn <= 2 ** 29;
}

/**
 * Creates a vectoring model from a (partial) configuration. `arithmetic: 'float'` forces the
 * general double-based path, so tests can check that both paths agree. @throws ModelConfigError
 */
export function createVectorModel(input: VectorConfigInput | VectorConfig = {}, arithmetic: 'auto' | 'float' = 'auto'): VectorModel {
  const config = Object.freeze(parseVectorConfig(input));
  const key = `${arithmetic} ${JSON.stringify(config)}`;
  let model = models.get(key);
  if (!model) {
    model = buildModel(config, arithmetic);
    if (models.size >= MODELS_KEPT) models.delete(models.keys().next().value!);
    models.set(key, model);
  }
  return model;
}

// Models are immutable, so one per configuration is shared (as the rotation model does): the hot
// loop stays in closures V8 has already optimised.
const MODELS_KEPT = 32;
const models = new Map<string, VectorModel>();

function buildModel(config: Readonly<VectorConfig>, arithmetic: 'auto' | 'float'): VectorModel {
  const tables = buildVectorTables(config);
  const { atan, zHalf, zQuarter, gainConst } = tables;
  const n = config.iterations;
  const nearestShift = config.shiftRounding === 'nearest';
  // Called through a local: so the loop kept the old inline step's speed; through the import it measured slower under tsx.
  const shift = shiftRound;
  const nearestOut = config.outputRounding === 'nearest';
  const guard = 2 ** config.guardBits;
  const prerot = config.prerotation;
  const zeroIsZero = config.zeroVector === 'zero';
  const { min: inMin, max: inMax } = inputRange(config);

  // Output stage: drop `drop` low bits (negative: append zeros, exact) with the output rounding.
  const roundDrop = (v: number, drop: number): number => {
    if (drop <= 0) return v * 2 ** -drop;
    const bias = nearestOut ? 2 ** (drop - 1) : 0;
    return Math.floor((v + bias) * 2 ** -drop);
  };
  const magDrop = tables.xyFrac + (gainConst > 0 ? config.gainBits : 0) - config.magFrac;
  const { min: magMin, max: magMax } = magnitudeRange(config);
  const turn = config.angleFormat === 'turn';
  const angleSpan = 2 ** config.angleBits;
  const { min: angMin, max: angMax } = angleOutputRange(config);
  const zDrop = config.zGuardBits;

  let lastAngle = 0;
  let lastMag = 0;
  const finish = (x: number, z: number): void => {
    const m = roundDrop(gainConst > 0 ? x * gainConst : x, magDrop);
    lastMag = m < magMin ? magMin : m > magMax ? magMax : m;
    const a = roundDrop(z, zDrop);
    // A binary angle wraps at a full turn (a negative angle reads as a turn minus it); radians saturate.
    lastAngle = turn ? a - Math.floor(a / angleSpan) * angleSpan : a < angMin ? angMin : a > angMax ? angMax : a;
  };

  // Pre-rotation into the iteration's range (|angle| < Σ atan 2^−i ≈ 99.9°), leaving x, y, z in
  // closure variables so nothing allocates per pair.
  let px = 0;
  let py = 0;
  let pz = 0;
  const prerotate = (xIn: number, yIn: number): void => {
    const x = xIn * guard;
    const y = yIn * guard;
    if (x >= 0 || prerot === 'none') {
      px = x;
      py = y;
      pz = 0;
    } else if (prerot === 'half-turn') {
      // 0 − v keeps zeros positive.
      px = 0 - x;
      py = 0 - y;
      pz = y >= 0 ? zHalf : -zHalf;
    } else if (y >= 0) {
      // Second quadrant: turn by −90°, (x, y) → (y, −x), and count +90°.
      px = y;
      py = 0 - x;
      pz = zQuarter;
    } else {
      // Third quadrant: turn by +90°, (x, y) → (−y, x), and count −90°.
      px = 0 - y;
      py = x;
      pz = -zQuarter;
    }
  };

  const runFloat = (xIn: number, yIn: number): void => {
    prerotate(xIn, yIn);
    let x = px;
    let y = py;
    let z = pz;
    for (let i = 0; i < n; i++) {
      const sx = shift(x, i, nearestShift);
      const sy = shift(y, i, nearestShift);
      // Drive y to zero: a vector above the x axis (y ≥ 0) turns clockwise, d = −1.
      if (y < 0) {
        x -= sy;
        y += sx;
        z -= atan[i];
      } else {
        x += sy;
        y -= sx;
        z += atan[i];
      }
    }
    finish(x, z);
  };

  // The same arithmetic in 32-bit integers; the direction is a sign mask (no branch to mispredict).
  const atan32 = Int32Array.from(atan);
  const roundAdd32 = shiftRoundAddends32(n, nearestShift);
  const runInt32 = (xIn: number, yIn: number): void => {
    prerotate(xIn, yIn);
    let x = px | 0;
    let y = py | 0;
    let z = pz | 0;
    for (let i = 0; i < n; i++) {
      // d = +1 when y < 0, −1 otherwise; s = y >> 31 is −1 or 0, and (v ^ m) − m with m = ~s
      // negates v when y ≥ 0: the update x − d·sy, y + d·sx, z − d·atan.
      const m = ~(y >> 31);
      const ra = roundAdd32[i];
      const sx = (x + ra) >> i;
      const sy = (y + ra) >> i;
      x = (x - ((sy ^ m) - m)) | 0;
      y = (y + ((sx ^ m) - m)) | 0;
      z = (z - ((atan32[i] ^ m) - m)) | 0;
    }
    finish(x, z);
  };

  const run = arithmetic === 'float' || !vectorFitsInt32(config, tables) ? runFloat : runInt32;
  const answerOne = (x: number, y: number): void => {
    if (zeroIsZero && x === 0 && y === 0) {
      lastAngle = 0;
      lastMag = 0;
    } else {
      run(x, y);
    }
  };

  const isCode = (v: number) => Number.isInteger(v) && v >= inMin && v <= inMax;
  const check = (x: number, y: number, where: string): void => {
    const bad = !isCode(x) ? `x ${x}` : !isCode(y) ? `y ${y}` : null;
    if (bad) throw new VectorInputError(`${where}input ${bad} is not an integer ${inMin}..${inMax} (${config.inBits} bits)`);
  };

  return {
    config,
    tables,
    answer(x, y) {
      check(x, y, '');
      answerOne(x, y);
      return { angle: lastAngle, magnitude: lastMag };
    },
    answerInto(xs, ys, angles, magnitudes) {
      if (ys.length !== xs.length) throw new RangeError(`x and y differ in length (${xs.length}, ${ys.length})`);
      if (angles.length < xs.length || magnitudes.length < xs.length) {
        throw new RangeError(`output arrays hold ${Math.min(angles.length, magnitudes.length)} results, ${xs.length} inputs given`);
      }
      for (let k = 0; k < xs.length; k++) {
        const x = xs[k];
        const y = ys[k];
        // The message is only built for a bad pair.
        if (!(isCode(x) && isCode(y))) check(x, y, `inputs[${k}]: `);
        answerOne(x, y);
        angles[k] = lastAngle;
        magnitudes[k] = lastMag;
      }
    },
  };
}
