// A vectoring core with one defect (docs/explain.md "Vectoring cores"): the simulated vectoring
// board answers through it and the explain search evaluates its hypotheses with it. Without a
// defect it is the reference model itself. The model keeps its iteration closed, so the defects
// inside the loop (sign-slip, atan-entry) and the wrong constant run through a second reading of
// the model's arithmetic below, the steps of docs/model.md "Vectoring cores";
// tests/unit/mock-device/vector-core.test.ts holds it bit-exact with createVectorModel when it
// carries no defect. A stuck output bit acts on the model's own answers.
import { cordicGain } from '../numeric/cordic-tables';
import { angleOutputRange, buildVectorTables, createVectorModel, inputRange, magnitudeRange, parseVectorConfig, VectorInputError, type AngleMagnitude, type VectorConfig } from '../vectoring';
import { checkVectorFault, type VectorFault } from './vector-fault';

/** A vectoring core with its defect: answers one pair, or many into caller-owned arrays. */
export interface VectorFaultyModel {
  readonly config: Readonly<VectorConfig>;
  readonly fault: VectorFault | null;
  answer(x: number, y: number): AngleMagnitude;
  answerInto(xs: ArrayLike<number>, ys: ArrayLike<number>, angles: Int32Array, magnitudes: Int32Array): void;
}

type Answer = (x: number, y: number) => AngleMagnitude;

/** Bit `bit` of a `width`-bit code forced to `value`; signed codes stay two's complement. */
function forceBit(v: number, width: number, signed: boolean, bit: number, value: 0 | 1): number {
  const m = 2 ** width;
  const u = v < 0 ? v + m : v;
  const has = Math.floor(u / 2 ** bit) % 2 === 1;
  const w = value === 1 ? (has ? u : u + 2 ** bit) : has ? u - 2 ** bit : u;
  return signed && w >= m / 2 ? w - m : w;
}

function stuckOutputs(c: VectorConfig, f: Extract<VectorFault, { kind: 'stuck-bit' }>, answer: Answer): Answer {
  const angleSigned = c.angleFormat === 'rad';
  return (x, y) => {
    const r = answer(x, y);
    return {
      angle: f.channel === 'magnitude' ? r.angle : forceBit(r.angle, c.angleBits, angleSigned, f.bit, f.value),
      magnitude: f.channel === 'angle' ? r.magnitude : forceBit(r.magnitude, c.magBits, true, f.bit, f.value),
    };
  };
}

/** Runs one pair; the answer is left in `out` (reused, so the batch path allocates nothing). */
type Runner = (x: number, y: number, out: AngleMagnitude) => void;

/**
 * The vectoring arithmetic with a defect in the loop or the gain constant (null: none, for the
 * test that holds this reading to the model), in doubles: every value an exact integer below
 * 2^53, as the configuration's bounds guarantee. Inputs are not checked.
 */
export function faultyIteration(c: VectorConfig, f: Exclude<VectorFault, { kind: 'stuck-bit' }> | null): Answer {
  const run = faultyRunner(c, f);
  return (x, y) => {
    const out = { angle: 0, magnitude: 0 };
    run(x, y, out);
    return out;
  };
}

function faultyRunner(c: VectorConfig, f: Exclude<VectorFault, { kind: 'stuck-bit' }> | null): Runner {
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
  // Multiplying by 2^−i is exact, as dividing by 2^i is, and cheaper in the loop.
  const inv = Float64Array.from({ length: n }, (_, i) => 2 ** -i);
  const add = Float64Array.from({ length: n }, (_, i) => (c.shiftRounding === 'nearest' && i > 0 ? 2 ** (i - 1) : 0));
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
  const turn = c.angleFormat === 'turn';
  const zeroIsZero = c.zeroVector === 'zero';
  return (xIn, yIn, out) => {
    if (zeroIsZero && xIn === 0 && yIn === 0) {
      out.angle = 0;
      out.magnitude = 0;
      return;
    }
    let x = xIn * guard;
    let y = yIn * guard;
    let z = 0;
    if (x < 0 && c.prerotation === 'half-turn') {
      z = y >= 0 ? t.zHalf : -t.zHalf;
      x = 0 - x;
      y = 0 - y;
    } else if (x < 0 && c.prerotation === 'quadrant') {
      const px = y >= 0 ? y : 0 - y;
      const py = y >= 0 ? 0 - x : x;
      z = y >= 0 ? t.zQuarter : -t.zQuarter;
      x = px;
      y = py;
    }
    for (let i = 0; i < n; i++) {
      const sx = Math.floor((x + add[i]) * inv[i]);
      const sy = Math.floor((y + add[i]) * inv[i]);
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
    out.angle = turn ? a - Math.floor(a / span) * span : Math.min(ang.max, Math.max(ang.min, a));
    out.magnitude = Math.min(mag.max, Math.max(mag.min, m));
  };
}

/**
 * A vectoring core of configuration `config` with one defect (or none: then the reference model
 * itself). @throws ModelConfigError for a bad configuration, FaultError when the defect does not fit the core
 */
export function createVectorFaultyModel(input: VectorConfig, fault: VectorFault | null): VectorFaultyModel {
  const config = Object.freeze(parseVectorConfig(input));
  const model = createVectorModel(config);
  if (!fault) return { config: model.config, fault: null, answer: model.answer, answerInto: model.answerInto };
  checkVectorFault(config, fault);
  const r: AngleMagnitude = { angle: 0, magnitude: 0 };
  let run: Runner;
  if (fault.kind === 'stuck-bit') {
    const stuck = stuckOutputs(config, fault, model.answer);
    run = (x, y, out) => Object.assign(out, stuck(x, y));
  } else run = faultyRunner(config, fault);
  const { min, max } = inputRange(config);
  const isCode = (v: number) => Number.isInteger(v) && v >= min && v <= max;
  const check = (x: number, y: number, where: string) => {
    const bad = !isCode(x) ? `x ${x}` : !isCode(y) ? `y ${y}` : null;
    if (bad) throw new VectorInputError(`${where}input ${bad} is not an integer ${min}..${max} (${config.inBits} bits)`);
  };
  return {
    config,
    fault,
    answer(x, y) {
      check(x, y, '');
      const out = { angle: 0, magnitude: 0 };
      run(x, y, out);
      return out;
    },
    answerInto(xs, ys, angles, magnitudes) {
      if (ys.length !== xs.length) throw new RangeError(`x and y differ in length (${xs.length}, ${ys.length})`);
      if (angles.length < xs.length || magnitudes.length < xs.length) throw new RangeError(`output arrays hold ${Math.min(angles.length, magnitudes.length)} results, ${xs.length} inputs given`);
      for (let k = 0; k < xs.length; k++) {
        if (!(isCode(xs[k]) && isCode(ys[k]))) check(xs[k], ys[k], `inputs[${k}]: `);
        run(xs[k], ys[k], r);
        angles[k] = r.angle;
        magnitudes[k] = r.magnitude;
      }
    },
  };
}
