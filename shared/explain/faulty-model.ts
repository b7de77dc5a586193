// The model's iteration with one catalogue defect in it (docs/explain.md): the same steps as
// shared/numeric/cordic-model.ts, with each step's constants taken from per-iteration tables a
// defect may change (direction, shift, arctangent, start value, register width), and the output
// stage's defects applied after rounding. Without a defect, createFaultyModel hands out the
// reference model itself, so the healthy path is the model's own and costs nothing extra.
import { angleCodeRange, buildCordicTables, cordicGain, createCordicModel, roundHalfAwayFromZero, outputCodeRange, parseModelConfig, type CordicStep, type CordicTables, type CordicTrace, type ModelConfig } from '../numeric';
import { fitsInt32, readAngle } from '../numeric/cordic-model';
import { AngleCodeError } from '../numeric/errors';
import { checkFault, type Fault } from './fault';

/** A core with (or without) one defect, evaluated bit-exactly. */
export interface FaultyModel {
  readonly config: Readonly<ModelConfig>;
  readonly fault: Fault | null;
  /** Cos and sin output codes for one angle code. @throws AngleCodeError */
  evaluate(code: number): { cos: number; sin: number };
  /** Many codes into caller-owned arrays. @throws AngleCodeError naming the index */
  evaluateInto(codes: ArrayLike<number>, cosOut: Int32Array, sinOut: Int32Array): void;
}

/** Everything one evaluation needs: the model's tables with the defect folded in. */
interface Datapath {
  config: ModelConfig;
  tables: CordicTables;
  x0: number;
  atan: Float64Array;
  /** Right shift of iteration i, its reciprocal power of two and its rounding addend. */
  shift: Int32Array;
  inv: Float64Array;
  roundAdd: Float64Array;
  slip: number;
  zeroNegative: boolean;
  blocking: boolean;
  /** Register width when a shifter is logical (x/y then wrap in it), else 0. */
  width: number;
  logicalX: boolean;
  logicalY: boolean;
  angleOffset: number;
  /** An angle register bit stuck: its weight and value, or null. */
  angleStuck: { bit: number; value: 0 | 1 } | null;
  negateFolded: boolean;
  outWrap: boolean;
  stuck: { cos: boolean; sin: boolean; bit: number; value: number } | null;
  swap: boolean;
  negateCos: boolean;
  negateSin: boolean;
  outMin: number;
  outMax: number;
}

function buildDatapath(config: ModelConfig, fault: Fault | null): Datapath {
  checkFault(config, fault);
  const tables = buildCordicTables(config);
  const n = config.iterations;
  const f = fault;
  const atan = Float64Array.from(tables.atan);
  if (f?.kind === 'atan-entry') {
    const a = atan[f.iteration];
    if ('flipBit' in f) atan[f.iteration] = Math.floor(a / 2 ** f.flipBit) % 2 === 1 ? a - 2 ** f.flipBit : a + 2 ** f.flipBit;
    else atan[f.iteration] = a + f.delta;
  }
  const shift = Int32Array.from({ length: n }, (_, i) => (f?.kind === 'shift' && f.iteration === i ? i + f.by : i));
  const nearest = config.shiftRounding === 'nearest';
  // The rounding addend follows the shift the hardware actually makes: half of what it drops.
  const roundAdd = Float64Array.from(shift, (s) => (nearest && s > 0 ? 2 ** (s - 1) : 0));
  const inv = Float64Array.from(shift, (s) => 2 ** -s);
  const logical = f?.kind === 'logical-shift';
  return {
    config,
    tables,
    // K of another iteration count; K_0 = 1 is a core with no gain compensation at all.
    x0: f?.kind === 'gain' ? roundHalfAwayFromZero(cordicGain(f.iterations) * 2 ** tables.xyFrac) : tables.x0,
    atan,
    shift,
    inv,
    roundAdd,
    slip: f?.kind === 'sign-slip' ? f.iteration : -1,
    zeroNegative: f?.kind === 'zero-direction',
    blocking: f?.kind === 'blocking-update',
    // Output width plus guard bits plus one bit of headroom for the rotation's growth.
    width: logical ? config.outBits + config.guardBits + 1 : 0,
    logicalX: logical && f.register === 'x',
    logicalY: logical && f.register === 'y',
    angleOffset: f?.kind === 'angle-offset' ? f.codes : 0,
    angleStuck: f?.kind === 'angle-bit' ? { bit: f.bit, value: f.value } : null,
    negateFolded: f?.kind !== 'fold-sign',
    outWrap: f?.kind === 'wrap',
    stuck: f?.kind === 'stuck-bit' ? { cos: f.channel !== 'sin', sin: f.channel !== 'cos', bit: f.bit, value: f.value } : null,
    swap: f?.kind === 'swap',
    negateCos: f?.kind === 'negate' && f.channel === 'cos',
    negateSin: f?.kind === 'negate' && f.channel === 'sin',
    outMin: outputCodeRange(config).min,
    outMax: outputCodeRange(config).max,
  };
}

/** A two's complement value of `bits` bits: v wrapped into [−2^(bits−1), 2^(bits−1)). */
function wrapSigned(v: number, bits: number): number {
  const span = 2 ** bits;
  const u = v - Math.floor(v / span) * span;
  return u >= span / 2 ? u - span : u;
}

/** The angle code as the angle register holds it: offset, or with a bit stuck, by a defect. */
function angleRegister(p: Datapath, code: number): number {
  const c = p.config;
  if (p.angleStuck) {
    // stick() reads the code's bit pattern and answers a signed code; a `turn` code is unsigned.
    const v = stick(code, p.angleStuck.bit, p.angleStuck.value, c.angleBits);
    return c.angleFormat === 'turn' && v < 0 ? v + 2 ** c.angleBits : v;
  }
  if (p.angleOffset === 0) return code;
  if (c.angleFormat === 'turn') {
    const span = 2 ** c.angleBits;
    return (((code + p.angleOffset) % span) + span) % span;
  }
  return wrapSigned(code + p.angleOffset, c.angleBits);
}

interface Run {
  zRead: number;
  zStart: number;
  negate: boolean;
  xEnd: number;
  yEnd: number;
  cos: number;
  sin: number;
}

// One evaluation, results into `r` (reused by the batch path, so nothing allocates per code).
// `steps`, when given, receives every iteration for the trace.
function run(p: Datapath, code: number, r: Run, steps: CordicStep[] | null): void {
  const c = p.config;
  const t = p.tables;
  const zRead = readAngle(c, t, angleRegister(p, code));
  let z = zRead;
  let negate = false;
  if (c.fold && z > t.zQuarter) {
    z -= t.zHalf;
    negate = true;
  } else if (c.fold && z < -t.zQuarter) {
    z += t.zHalf;
    negate = true;
  }
  r.zRead = zRead;
  r.zStart = z;
  r.negate = negate;
  const n = c.iterations;
  const w = p.width;
  const span = w > 0 ? 2 ** w : 0;
  let x = p.x0;
  let y = 0;
  for (let i = 0; i < n; i++) {
    let d: 1 | -1 = z > 0 || (z === 0 && !p.zeroNegative) ? 1 : -1;
    if (i === p.slip) d = d === 1 ? -1 : 1;
    const inv = p.inv[i];
    const ra = p.roundAdd[i];
    // A logical shifter sees the register's unsigned pattern; i = 0 shifts nothing either way.
    const sy = Math.floor((p.logicalY && p.shift[i] > 0 ? (y + ra + span) % span : y + ra) * inv);
    const xBefore = x;
    x -= d * sy;
    if (w > 0) x = wrapSigned(x, w);
    // A blocking update reads the x just written; the definition reads the x of the step before.
    const xs = p.blocking ? x : xBefore;
    const sx = Math.floor((p.logicalX && p.shift[i] > 0 ? (xs + ra + span) % span : xs + ra) * inv);
    y += d * sx;
    if (w > 0) y = wrapSigned(y, w);
    z -= d * p.atan[i];
    if (steps) steps.push({ i, d, sx, sy, atan: p.atan[i], x, y, z });
  }
  if (negate && p.negateFolded) {
    x = 0 - x;
    y = 0 - y;
  }
  r.xEnd = x;
  r.yEnd = y;
  outputDefects(p, outputStage(p, x), outputStage(p, y), r);
}

/** The output stage's defects, after rounding and saturation (or wrapping); results into r. */
function outputDefects(p: Datapath, cos: number, sin: number, r: Run): void {
  const ob = p.config.outBits;
  // Negation in hardware wraps: the most negative code negates to itself.
  if (p.negateCos) cos = wrapSigned(0 - cos, ob);
  if (p.negateSin) sin = wrapSigned(0 - sin, ob);
  if (p.swap) [cos, sin] = [sin, cos];
  if (p.stuck) {
    if (p.stuck.cos) cos = stick(cos, p.stuck.bit, p.stuck.value, ob);
    if (p.stuck.sin) sin = stick(sin, p.stuck.bit, p.stuck.value, ob);
  }
  r.cos = cos;
  r.sin = sin;
}

function outputStage(p: Datapath, v: number): number {
  const c = p.config;
  const g = c.guardBits;
  const bias = c.outputRounding === 'nearest' && g > 0 ? 2 ** (g - 1) : 0;
  const r = g === 0 ? v : Math.floor((v + bias) * 2 ** -g);
  if (p.outWrap) return wrapSigned(r, c.outBits);
  return r < p.outMin ? p.outMin : r > p.outMax ? p.outMax : r;
}

function stick(code: number, bit: number, value: number, bits: number): number {
  const span = 2 ** bits;
  const u = code < 0 ? code + span : code;
  const m = 2 ** bit;
  const set = Math.floor(u / m) % 2 === 1;
  const s = value === 1 ? (set ? u : u + m) : set ? u - m : u;
  return s >= span / 2 ? s - span : s;
}

function codeChecker(config: ModelConfig): (code: number, where: string) => void {
  const { min, max } = angleCodeRange(config);
  return (code, where) => {
    if (!(Number.isInteger(code) && code >= min && code <= max)) {
      throw new AngleCodeError(`${where}angle code ${code} is not an integer ${min}..${max} (${config.angleFormat}, ${config.angleBits} bits)`);
    }
  };
}

/**
 * Whether the 32-bit path may run this datapath: the model's own bound (fitsInt32) with two more
 * bits of headroom, since a defect can grow x and y beyond the healthy rotation's length, and
 * table entries and a logical shifter's register that fit too.
 */
function fitsInt32Faulty(p: Datapath): boolean {
  const c = p.config;
  return fitsInt32(c, p.tables) && p.tables.xyFrac <= 26 && p.width <= 31 && p.atan.every((a) => Math.abs(a) < 2 ** 29);
}

// The same steps as run() in 32-bit integers, as the model's own fast path: `>>` is the floor
// division, the direction a sign mask (0 for +1, −1 for −1). Several times faster than run().
function int32Runner(p: Datapath, r: Run): (code: number) => void {
  const c = p.config;
  const t = p.tables;
  const n = c.iterations;
  const atan = Int32Array.from(p.atan);
  const shift = p.shift;
  const roundAdd = Int32Array.from(p.roundAdd);
  const slipMask = Int32Array.from({ length: n }, (_, i) => (i === p.slip ? -1 : 0));
  const zeroBias = p.zeroNegative ? 1 : 0;
  const blocking = p.blocking;
  const w = p.width;
  const wShift = 32 - w;
  const mask = w > 0 ? 2 ** w - 1 : 0;
  const lx = p.logicalX;
  const ly = p.logicalY;
  const x0 = p.x0 | 0;
  const g = c.guardBits;
  const outBias = c.outputRounding === 'nearest' && g > 0 ? 2 ** (g - 1) : 0;
  const { min, max } = outputCodeRange(c);
  const oShift = 32 - c.outBits;
  const outWrap = p.outWrap;
  const out = (v: number): number => {
    const q = g === 0 ? v : (v + outBias) >> g;
    if (outWrap) return (q << oShift) >> oShift;
    return q < min ? min : q > max ? max : q;
  };
  const turn = c.angleFormat === 'turn';
  const zUnit = 2 ** c.zGuardBits;
  const codeHalf = 2 ** (c.angleBits - 1);
  const codeTurn = 2 ** c.angleBits;
  const moved = p.angleOffset !== 0 || p.angleStuck !== null;
  const outputDefect = p.negateCos || p.negateSin || p.swap || p.stuck !== null;
  return (code) => {
    const a = moved ? angleRegister(p, code) : code;
    // readAngle for `turn`, inlined as the model does.
    const zRead = turn ? (a >= codeHalf ? a - codeTurn : a) * zUnit : readAngle(c, t, a);
    let z = zRead;
    let negate = false;
    if (c.fold && z > t.zQuarter) {
      z -= t.zHalf;
      negate = true;
    } else if (c.fold && z < -t.zQuarter) {
      z += t.zHalf;
      negate = true;
    }
    z |= 0;
    let x = x0;
    let y = 0;
    for (let i = 0; i < n; i++) {
      const d = ((z - zeroBias) >> 31) ^ slipMask[i]; // z − 1 < 0 is z ≤ 0: zero turns negative
      const s = shift[i];
      const ra = roundAdd[i];
      const sy = ly && s > 0 ? ((y + ra) & mask) >>> s : (y + ra) >> s;
      const xBefore = x;
      x = (x - ((sy ^ d) - d)) | 0;
      if (w > 0) x = (x << wShift) >> wShift;
      const xs = blocking ? x : xBefore;
      const sx = lx && s > 0 ? ((xs + ra) & mask) >>> s : (xs + ra) >> s;
      y = (y + ((sx ^ d) - d)) | 0;
      if (w > 0) y = (y << wShift) >> wShift;
      z = (z - ((atan[i] ^ d) - d)) | 0;
    }
    if (negate && p.negateFolded) {
      x = -x | 0;
      y = -y | 0;
    }
    r.xEnd = x;
    r.yEnd = y;
    if (outputDefect) outputDefects(p, out(x), out(y), r);
    else {
      r.cos = out(x);
      r.sin = out(y);
    }
  };
}

/**
 * The defect's core through the generic iteration, even without a defect (tests hold that to the
 * reference model). `arithmetic: 'float'` forces the double path so tests can compare the two.
 * The configuration must be complete and valid (parseModelConfig's output).
 */
export function createGenericModel(config: Readonly<ModelConfig>, fault: Fault | null, arithmetic: 'auto' | 'float' = 'auto'): FaultyModel {
  const p = buildDatapath(config, fault);
  const check = codeChecker(config);
  const r: Run = { zRead: 0, zStart: 0, negate: false, xEnd: 0, yEnd: 0, cos: 0, sin: 0 };
  const step = arithmetic === 'auto' && fitsInt32Faulty(p) ? int32Runner(p, r) : (code: number) => run(p, code, r, null);
  const { min, max } = angleCodeRange(config);
  return {
    config,
    fault,
    evaluate(code) {
      check(code, '');
      step(code);
      return { cos: r.cos, sin: r.sin };
    },
    evaluateInto(codes, cosOut, sinOut) {
      if (cosOut.length < codes.length || sinOut.length < codes.length) throw new RangeError(`output arrays hold ${Math.min(cosOut.length, sinOut.length)} results, ${codes.length} codes given`);
      for (let k = 0; k < codes.length; k++) {
        const code = codes[k];
        if (!(Number.isInteger(code) && code >= min && code <= max)) check(code, `codes[${k}]: `);
        step(code);
        cosOut[k] = r.cos;
        sinOut[k] = r.sin;
      }
    },
  };
}

/**
 * A core of configuration `config` with one defect (or none: then the reference model itself).
 * @throws ModelConfigError, FaultError when the defect does not fit the core
 */
export function createFaultyModel(config: ModelConfig, fault: Fault | null): FaultyModel {
  if (fault) return createGenericModel(Object.freeze(parseModelConfig(config)), fault);
  const model = createCordicModel(config);
  return { config: model.config, fault: null, evaluate: model.evaluate, evaluateInto: model.evaluateInto };
}

/**
 * One code through the core with its defect, step by step, in the shape of the model's own
 * trace (traceCordic), so the two can be laid side by side. @throws AngleCodeError, FaultError
 */
export function traceFaulty(input: ModelConfig, fault: Fault | null, code: number): CordicTrace {
  const config = parseModelConfig(input);
  codeChecker(config)(code, '');
  const p = buildDatapath(config, fault);
  const r: Run = { zRead: 0, zStart: 0, negate: false, xEnd: 0, yEnd: 0, cos: 0, sin: 0 };
  const steps: CordicStep[] = [];
  run(p, code, r, steps);
  return { code, zRead: r.zRead, zStart: r.zStart, negate: r.negate, x0: p.x0, steps, xEnd: r.xEnd, yEnd: r.yEnd, cos: r.cos, sin: r.sin };
}
