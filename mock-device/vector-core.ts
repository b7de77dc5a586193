// The simulated board's vectoring core: shared/vectoring's model when healthy; with a
// `--core-fault`, one of the defects of the catalogue that a vectoring core can have (a stuck
// output bit, an iteration turning the wrong way, a wrong arctangent table entry, a missing or
// wrong gain-compensating constant) or a configuration the RTL has differently (`key=value`).
//
// The model keeps its iteration closed, so the two defects inside the loop (sign-slip and
// atan-entry) and the wrong constant run through a second reading of the model's arithmetic
// below, the steps of docs/model.md "Vectoring cores"; tests/unit/mock-device/vector-core.test.ts
// holds it bit-exact with createVectorModel when it carries no defect.
import { cordicGain } from '../shared/numeric/cordic-tables';
import { angleOutputRange, buildVectorTables, createVectorModel, magnitudeRange, ModelConfigError, parseVectorConfig, type VectorConfig, type VectorConfigInput } from '../shared/vectoring';

/** One defect of a vectoring core. */
export type VectorFault =
  /** Iteration `iteration` turns the wrong way (x, y and z alike). */
  | { kind: 'sign-slip'; iteration: number }
  /** The arctangent table entry `iteration` off by `delta` z units. */
  | { kind: 'atan-entry'; iteration: number; delta: number }
  /** The arctangent table entry `iteration` with bit `flipBit` flipped. */
  | { kind: 'atan-entry'; iteration: number; flipBit: number }
  /** An output bit stuck at 0 or 1, on the angle, the magnitude or both. */
  | { kind: 'stuck-bit'; channel: 'angle' | 'magnitude' | 'both'; bit: number; value: 0 | 1 }
  /** The gain-compensating constant of `iterations` iterations; 0: no compensation at all. */
  | { kind: 'gain'; iterations: number };

/** What `--core-fault` injects into a vectoring board: configuration keys the RTL has differently, and/or one defect. */
export interface VectorDeviation {
  config: Partial<VectorConfig>;
  fault: VectorFault | null;
}

/** Configuration keys a vectoring RTL can get wrong without changing its ports. */
export const VECTOR_DEVIATION_KEYS = ['iterations', 'guardBits', 'zGuardBits', 'shiftRounding', 'outputRounding', 'prerotation', 'gainCompensation', 'gainBits', 'gainRounding', 'zeroVector'] as const;

export const VECTOR_FAULT_SPELLINGS = ['sign-slip:K', 'atan-entry:K:±D', 'atan-entry:K:flipB', 'stuck-bit:angle|magnitude|both:B:0|1', 'gain', 'gain:M'] as const;

const UINT = /^\d+$/;
const SINT = /^[+-]?\d+$/;

/**
 * Reads `--core-fault` for a vectoring board: a defect (VECTOR_FAULT_SPELLINGS; `sign:K` and
 * `stuck:B` as on the rotating board; `gain` alone is a core that skips its compensating multiply)
 * or one deviation `key=value` (`iterations=15`, `gainCompensation=none`, …).
 * @throws Error naming the option and what is wrong
 */
export function parseVectorCoreFault(text: string): VectorDeviation {
  const whole = text.trim();
  const fail = (why: string): never => {
    throw new Error(`--core-fault "${whole}": ${why}`);
  };
  const eq = whole.indexOf('=');
  if (eq > 0) {
    const key = whole.slice(0, eq);
    const raw = whole.slice(eq + 1);
    if (!(VECTOR_DEVIATION_KEYS as readonly string[]).includes(key)) fail(`${key} is not a key a vectoring core can deviate in (${VECTOR_DEVIATION_KEYS.join(', ')})`);
    const value: unknown = SINT.test(raw) ? Number(raw) : raw;
    return { config: { [key]: value } as Partial<VectorConfig>, fault: null };
  }
  const [name, ...args] = whole.split(':');
  const arity = (n: number) => args.length === n || fail(`${name} takes ${n} parameter${n === 1 ? '' : 's'}`);
  const uint = (t: string, what: string) => (UINT.test(t) ? Number(t) : fail(`${what} must be a whole number ≥ 0`));
  const fault = (f: VectorFault): VectorDeviation => ({ config: {}, fault: f });
  switch (name) {
    case 'sign':
    case 'sign-slip':
      arity(1);
      return fault({ kind: 'sign-slip', iteration: uint(args[0], 'the iteration') });
    case 'atan-entry': {
      arity(2);
      const iteration = uint(args[0], 'the iteration');
      if (args[1].startsWith('flip')) return fault({ kind: 'atan-entry', iteration, flipBit: uint(args[1].slice(4), 'the flipped bit') });
      if (!SINT.test(args[1]) || Number(args[1]) === 0) fail('the delta must be a non-zero integer such as +1 or -2');
      return fault({ kind: 'atan-entry', iteration, delta: Number(args[1]) });
    }
    case 'stuck':
      arity(1);
      return fault({ kind: 'stuck-bit', channel: 'both', bit: uint(args[0], 'the bit'), value: 1 });
    case 'stuck-bit': {
      arity(3);
      const channel = args[0];
      if (channel !== 'angle' && channel !== 'magnitude' && channel !== 'both') fail('the channel must be angle, magnitude or both');
      if (args[2] !== '0' && args[2] !== '1') fail('the value must be 0 or 1');
      return fault({ kind: 'stuck-bit', channel: channel as 'angle' | 'magnitude' | 'both', bit: uint(args[1], 'the bit'), value: Number(args[2]) as 0 | 1 });
    }
    case 'gain':
      if (args.length === 0) return fault({ kind: 'gain', iterations: 0 });
      arity(1);
      return fault({ kind: 'gain', iterations: uint(args[0], 'the iteration count') });
    default:
      return fail(`not a vectoring core fault; known: ${VECTOR_FAULT_SPELLINGS.join(', ')}, or key=value (${VECTOR_DEVIATION_KEYS.join(', ')})`);
  }
}

/** The core a vectoring board answers with. */
export interface SimVectorCore {
  /** The declared configuration, which MODE_INFO reports whatever the fault. */
  config: VectorConfig;
  answer(x: number, y: number): { angle: number; magnitude: number };
}

/** @throws Error naming the option when the fault does not fit the core (an iteration or bit it lacks). */
export function createSimVectorCore(input: VectorConfigInput, deviation?: VectorDeviation): SimVectorCore {
  const config = parseVectorConfig(input);
  if (!deviation) return { config, answer: createVectorModel(config).answer };
  let actual: VectorConfig;
  try {
    actual = parseVectorConfig({ ...config, ...deviation.config });
  } catch (e) {
    if (e instanceof ModelConfigError) throw new Error(`--core-fault ${e.message}`);
    throw e;
  }
  const f = deviation.fault;
  if (!f) return { config, answer: createVectorModel(actual).answer };
  checkFault(actual, f);
  if (f.kind === 'stuck-bit') {
    const model = createVectorModel(actual);
    return { config, answer: stuckOutputs(actual, f, model.answer) };
  }
  return { config, answer: faultyIteration(actual, f) };
}

function checkFault(c: VectorConfig, f: VectorFault): void {
  const bad = (why: string): never => {
    throw new Error(`--core-fault: ${why}`);
  };
  if ((f.kind === 'sign-slip' || f.kind === 'atan-entry') && f.iteration >= c.iterations) bad(`the core has iterations 0..${c.iterations - 1}, not ${f.iteration}`);
  if (f.kind === 'atan-entry' && 'flipBit' in f && f.flipBit > 40) bad(`the arctangent entries have no bit ${f.flipBit}`);
  if (f.kind === 'stuck-bit') {
    const width = f.channel === 'angle' ? c.angleBits : f.channel === 'magnitude' ? c.magBits : Math.min(c.angleBits, c.magBits);
    if (f.bit >= width) bad(`the ${f.channel === 'both' ? 'narrower output' : f.channel} has bits 0..${width - 1}, not ${f.bit}`);
  }
  if (f.kind === 'gain' && c.gainCompensation === 'none') bad('the declared core has no gain compensation to get wrong (declare gainCompensation "multiply", or deviate with gainCompensation=multiply)');
}

/** Bit `bit` of a `width`-bit code forced to `value`; signed codes stay two's complement. */
function forceBit(v: number, width: number, signed: boolean, bit: number, value: 0 | 1): number {
  const m = 2 ** width;
  const u = v < 0 ? v + m : v;
  const has = Math.floor(u / 2 ** bit) % 2 === 1;
  const w = value === 1 ? (has ? u : u + 2 ** bit) : has ? u - 2 ** bit : u;
  return signed && w >= m / 2 ? w - m : w;
}

function stuckOutputs(c: VectorConfig, f: Extract<VectorFault, { kind: 'stuck-bit' }>, answer: SimVectorCore['answer']): SimVectorCore['answer'] {
  const angleSigned = c.angleFormat === 'rad';
  return (x, y) => {
    const r = answer(x, y);
    return {
      angle: f.channel === 'magnitude' ? r.angle : forceBit(r.angle, c.angleBits, angleSigned, f.bit, f.value),
      magnitude: f.channel === 'angle' ? r.magnitude : forceBit(r.magnitude, c.magBits, true, f.bit, f.value),
    };
  };
}

/**
 * The vectoring arithmetic with a defect in the loop or the gain constant (null: none, for the
 * test that holds this reading to the model), in doubles: every value an exact integer below
 * 2^53, as the configuration's bounds guarantee.
 */
export function faultyIteration(c: VectorConfig, f: Exclude<VectorFault, { kind: 'stuck-bit' }> | null): SimVectorCore['answer'] {
  const t = buildVectorTables(c);
  const n = c.iterations;
  const atan = Float64Array.from(t.atan);
  if (f?.kind === 'atan-entry') {
    const a = atan[f.iteration];
    if ('flipBit' in f) atan[f.iteration] = Math.floor(a / 2 ** f.flipBit) % 2 === 1 ? a - 2 ** f.flipBit : a + 2 ** f.flipBit;
    else atan[f.iteration] = a + f.delta;
  }
  const slip = f?.kind === 'sign-slip' ? f.iteration : -1;
  let gainConst = t.gainConst;
  if (f?.kind === 'gain') {
    const exact = f.iterations === 0 ? 0 : cordicGain(f.iterations) * 2 ** c.gainBits;
    gainConst = exact === 0 ? 0 : c.gainRounding === 'nearest' ? Math.round(exact) : Math.floor(exact);
  }
  const guard = 2 ** c.guardBits;
  const nearestShift = c.shiftRounding === 'nearest';
  const roundDrop = (v: number, drop: number): number => {
    if (drop <= 0) return v * 2 ** -drop;
    const bias = c.outputRounding === 'nearest' ? 2 ** (drop - 1) : 0;
    return Math.floor((v + bias) * 2 ** -drop);
  };
  // The magnitude's fraction bits follow the multiply the hardware has: none when it is missing.
  const magDrop = t.xyFrac + (gainConst > 0 ? c.gainBits : 0) - c.magFrac;
  const mag = magnitudeRange(c);
  const ang = angleOutputRange(c);
  const span = 2 ** c.angleBits;
  return (xIn, yIn) => {
    if (c.zeroVector === 'zero' && xIn === 0 && yIn === 0) return { angle: 0, magnitude: 0 };
    let x = xIn * guard;
    let y = yIn * guard;
    let z = 0;
    if (x < 0 && c.prerotation === 'half-turn') {
      z = y >= 0 ? t.zHalf : -t.zHalf;
      x = 0 - x;
      y = 0 - y;
    } else if (x < 0 && c.prerotation === 'quadrant') {
      const [px, py] = y >= 0 ? [y, 0 - x] : [0 - y, x];
      z = y >= 0 ? t.zQuarter : -t.zQuarter;
      x = px;
      y = py;
    }
    for (let i = 0; i < n; i++) {
      const add = nearestShift && i > 0 ? 2 ** (i - 1) : 0;
      const sx = Math.floor((x + add) / 2 ** i);
      const sy = Math.floor((y + add) / 2 ** i);
      // y < 0 turns counter-clockwise; the slipped iteration turns the other way.
      const up = (y < 0) !== (i === slip);
      if (up) {
        x -= sy;
        y += sx;
        z -= atan[i];
      } else {
        x += sy;
        y -= sx;
        z += atan[i];
      }
    }
    const m = roundDrop(gainConst > 0 ? x * gainConst : x, magDrop);
    const a = roundDrop(z, c.zGuardBits);
    return {
      angle: c.angleFormat === 'turn' ? a - Math.floor(a / span) * span : Math.min(ang.max, Math.max(ang.min, a)),
      magnitude: Math.min(mag.max, Math.max(mag.min, m)),
    };
  };
}
