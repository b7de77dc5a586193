import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { ModelConfigError } from '../../../shared/numeric/errors';
import { VectorInputError } from '../../../shared/vectoring/errors';
import { inputRange, type VectorConfig } from '../../../shared/vectoring/vector-config';
import { createVectorModel, vectorFitsInt32 } from '../../../shared/vectoring/vector-model';

/**
 * The definition in docs/model.md ("Vectoring cores") written out line by line in BigInt, with
 * real arithmetic shifts and none of the model's helpers: an independent second reading that
 * proves the model neither wraps at 32 bits nor loses integers at 52.
 */
function bigIntVector(c: VectorConfig, xIn: number, yIn: number): { angle: number; magnitude: number } {
  const B = BigInt;
  if (c.zeroVector === 'zero' && xIn === 0 && yIn === 0) return { angle: 0, magnitude: 0 };
  const round = (v: number) => B(v < 0 ? -Math.round(-v) : Math.round(v));
  let half: bigint;
  let quarter: bigint;
  let atan: bigint[];
  if (c.angleFormat === 'turn') {
    const zBits = c.angleBits + c.zGuardBits;
    half = 1n << B(zBits - 1);
    quarter = 1n << B(zBits - 2);
    atan = Array.from({ length: c.iterations }, (_, i) => round((Math.atan(2 ** -i) / (2 * Math.PI)) * 2 ** zBits));
  } else {
    const zFrac = c.angleFrac + c.zGuardBits;
    half = round(Math.PI * 2 ** zFrac);
    quarter = round((Math.PI / 2) * 2 ** zFrac);
    atan = Array.from({ length: c.iterations }, (_, i) => round(Math.atan(2 ** -i) * 2 ** zFrac));
  }
  let x = B(xIn) << B(c.guardBits);
  let y = B(yIn) << B(c.guardBits);
  let z = 0n;
  if (x < 0n && c.prerotation === 'half-turn') [x, y, z] = [-x, -y, y >= 0n ? half : -half];
  else if (x < 0n && c.prerotation === 'quadrant') [x, y, z] = y >= 0n ? [y, -x, quarter] : [-y, x, -quarter];
  const shift = (v: bigint, i: number) => (c.shiftRounding === 'nearest' && i > 0 ? (v + (1n << B(i - 1))) >> B(i) : v >> B(i));
  for (let i = 0; i < c.iterations; i++) {
    const d = y < 0n ? 1n : -1n;
    const sx = shift(x, i);
    const sy = shift(y, i);
    [x, y, z] = [x - d * sy, y + d * sx, z - d * atan[i]];
  }
  const drop = (v: bigint, bits: number) => {
    if (bits <= 0) return v << B(-bits);
    return c.outputRounding === 'nearest' ? (v + (1n << B(bits - 1))) >> B(bits) : v >> B(bits);
  };
  let inverseGrowth = 1;
  for (let i = 0; i < c.iterations; i++) inverseGrowth /= Math.sqrt(1 + 4 ** -i);
  const scaled = inverseGrowth * 2 ** c.gainBits;
  const gain = c.gainCompensation === 'multiply' ? B(c.gainRounding === 'nearest' ? Math.round(scaled) : Math.floor(scaled)) : 1n;
  const gainBits = c.gainCompensation === 'multiply' ? c.gainBits : 0;
  const magLo = -(1n << B(c.magBits - 1));
  const magHi = (1n << B(c.magBits - 1)) - 1n;
  let m = drop(x * gain, c.inFrac + c.guardBits + gainBits - c.magFrac);
  m = m < magLo ? magLo : m > magHi ? magHi : m;
  let a = drop(z, c.zGuardBits);
  if (c.angleFormat === 'turn') {
    a = BigInt.asUintN(c.angleBits, a);
  } else {
    const lo = -(1n << B(c.angleBits - 1));
    const hi = (1n << B(c.angleBits - 1)) - 1n;
    a = a < lo ? lo : a > hi ? hi : a;
  }
  return { angle: Number(a), magnitude: Number(m) };
}

const configArb = fc
  .record({
    inBits: fc.integer({ min: 2, max: 24 }),
    iterations: fc.integer({ min: 1, max: 40 }),
    guardBits: fc.integer({ min: 0, max: 16 }),
    zGuardBits: fc.integer({ min: 0, max: 8 }),
    shiftRounding: fc.constantFrom('floor' as const, 'nearest' as const),
    outputRounding: fc.constantFrom('truncate' as const, 'nearest' as const),
    prerotation: fc.constantFrom('none' as const, 'half-turn' as const, 'quadrant' as const),
    gainCompensation: fc.constantFrom('none' as const, 'multiply' as const),
    gainBits: fc.integer({ min: 2, max: 32 }),
    gainRounding: fc.constantFrom('truncate' as const, 'nearest' as const),
    magBits: fc.integer({ min: 2, max: 32 }),
    angleFormat: fc.constantFrom('turn' as const, 'rad' as const),
    angleBits: fc.integer({ min: 2, max: 31 }),
    zeroVector: fc.constantFrom('zero' as const, 'iterate' as const),
    inShare: fc.double({ min: 0, max: 1, noNaN: true }),
    fracShare: fc.double({ min: 0, max: 1, noNaN: true }),
  })
  .map(({ inShare, fracShare, ...c }) => ({
    ...c,
    inFrac: Math.min(c.inBits - 1, Math.round(inShare * c.inBits)),
    // Keep the product within the bound the configuration enforces.
    gainBits: Math.max(2, Math.min(c.gainBits, 51 - c.inBits - c.guardBits)),
    magFrac: Math.min(c.magBits - 1, Math.round(fracShare * c.magBits)),
    angleFrac: c.angleFormat === 'rad' ? Math.round(fracShare * c.angleBits) : undefined,
  }));

const pointArb = fc.tuple(fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }), fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }));

function pointIn(c: VectorConfig, [u, v]: [number, number]): [number, number] {
  const r = inputRange(c);
  const span = r.max - r.min + 1;
  return [r.min + Math.floor(u * span), r.min + Math.floor(v * span)];
}

describe('the vectoring reference model', () => {
  it('computes exactly what the definition says, for random configurations (seeded)', () => {
    fc.assert(
      fc.property(configArb, pointArb, pointArb, (input, p, q) => {
        const m = createVectorModel(input);
        for (const [x, y] of [pointIn(m.config, p), pointIn(m.config, q), [0, 0] as [number, number]]) {
          expect(m.answer(x, y)).toEqual(bigIntVector(m.config, x, y));
        }
      }),
      { numRuns: 3000, seed: 20 },
    );
  });

  it('computes exactly what the definition says on every input of a 6 + 6-bit core, each pre-rotation and format', () => {
    for (const prerotation of ['none', 'half-turn', 'quadrant'] as const) {
      for (const angleFormat of ['turn', 'rad'] as const) {
        const m = createVectorModel({ inBits: 6, inFrac: 4, iterations: 8, guardBits: 3, angleBits: 10, prerotation, angleFormat, shiftRounding: 'nearest', zeroVector: 'iterate' });
        for (let x = -32; x < 32; x++) for (let y = -32; y < 32; y++) expect(m.answer(x, y)).toEqual(bigIntVector(m.config, x, y));
      }
    }
  });

  it('gives the same answers in 32-bit integers as in the general arithmetic, whenever the datapath fits', () => {
    let fitting = 0;
    fc.assert(
      fc.property(configArb, (input) => {
        const m = createVectorModel(input);
        if (!vectorFitsInt32(m.config, m.tables)) return;
        fitting++;
        const general = createVectorModel(input, 'float');
        const r = inputRange(m.config);
        const xs = Int32Array.from({ length: 256 }, (_, k) => r.min + Math.floor(((k + 0.5) * (r.max - r.min + 1)) / 256));
        const ys = xs.slice().reverse();
        const got = [new Int32Array(256), new Int32Array(256)] as const;
        const want = [new Int32Array(256), new Int32Array(256)] as const;
        m.answerInto(xs, ys, got[0], got[1]);
        general.answerInto(xs, ys, want[0], want[1]);
        expect(got).toEqual(want);
      }),
      { numRuns: 1000, seed: 21 },
    );
    expect(fitting).toBeGreaterThan(100); // the random configurations do reach the 32-bit path
  });

  it('is exact at the widest datapath the 32-bit path takes and at the widest the configuration allows', () => {
    const widest = createVectorModel({ inBits: 24, guardBits: 5, iterations: 30, angleBits: 27, zGuardBits: 2, shiftRounding: 'nearest', gainCompensation: 'multiply', gainBits: 20 });
    expect(vectorFitsInt32(widest.config, widest.tables)).toBe(true);
    expect(vectorFitsInt32(createVectorModel({ ...widest.config, guardBits: 6 }).config, widest.tables)).toBe(false);
    const huge = createVectorModel({ inBits: 24, guardBits: 16, iterations: 40, angleBits: 31, zGuardBits: 8, gainCompensation: 'multiply', gainBits: 11, magBits: 32, magFrac: 20 });
    for (const m of [widest, huge]) {
      const { min, max } = inputRange(m.config);
      for (const x of [min, min + 1, -1, 0, 1, max - 1, max]) {
        for (const y of [min, -1, 0, 1, max, Math.floor(max / 3)]) expect(m.answer(x, y)).toEqual(bigIntVector(m.config, x, y));
      }
    }
  });

  it('shares one model per configuration', () => {
    expect(createVectorModel({ iterations: 12 })).toBe(createVectorModel({ iterations: 12, angleFormat: 'turn' }));
    expect(createVectorModel({ iterations: 12 })).not.toBe(createVectorModel({ iterations: 13 }));
  });

  it('answers the axes and the diagonal of the default core with binary angles of 0, ¼, ½, ¾ and ⅛ turn', () => {
    // 16-bit binary angles: 45° = 0x2000, 90° = 0x4000, 180° = 0x8000, 270° = 0xC000 (docs/references.md "Number formats").
    const m = createVectorModel();
    expect(m.answer(8192, 0).angle).toBe(0);
    expect(m.answer(0, 8192).angle).toBe(0x4000);
    expect(m.answer(-8192, 0).angle).toBe(0x8000);
    expect(m.answer(0, -8192).angle).toBe(0xc000);
    expect(m.answer(8192, 8192).angle).toBe(0x2000);
  });

  it('leaves the magnitude grown by the CORDIC gain, or compensates it with the constant multiply', () => {
    // docs/references.md "CORDIC, rotation mode": 1/K_16 = 1.6467602578654548145 (Volder 1959; Walther 1971).
    const grown = createVectorModel({ iterations: 16 });
    expect(Math.abs(grown.answer(8192, 0).magnitude - 8192 * Number('1.6467602578654548145'))).toBeLessThan(1);
    const compensated = createVectorModel({ iterations: 16, gainCompensation: 'multiply', gainBits: 18 });
    // Within the rounding of 16 floored shifts (2 guard bits) and the output: a couple of LSB.
    expect(Math.abs(compensated.answer(8192, 0).magnitude - 8192)).toBeLessThanOrEqual(2);
    expect(Math.abs(compensated.answer(-5000, 7000).magnitude - Math.hypot(5000, 7000))).toBeLessThanOrEqual(2);
  });

  it('needs a pre-rotation for vectors left of the y axis: without one the angle stops near ±99.9°', () => {
    // docs/references.md "CORDIC, rotation mode": the iterations reach at most Σ atan(2^-i) ≈ 99.88° (Walther; Andraka).
    const toDegrees = (code: number) => ((code >= 32768 ? code - 65536 : code) * 360) / 65536;
    const none = createVectorModel({ prerotation: 'none' });
    expect(Math.abs(toDegrees(none.answer(-8192, 1).angle) - 99.88)).toBeLessThan(0.1);
    for (const prerotation of ['half-turn', 'quadrant'] as const) {
      const m = createVectorModel({ prerotation });
      expect(Math.abs(toDegrees(m.answer(-8192, 8192).angle) - 135)).toBeLessThan(0.02);
      expect(Math.abs(toDegrees(m.answer(-8192, -8192).angle) + 135)).toBeLessThan(0.02);
    }
  });

  it('answers the zero vector with angle 0 and magnitude 0, or with whatever the iteration gives', () => {
    expect(createVectorModel({ zeroVector: 'zero' }).answer(0, 0)).toEqual({ angle: 0, magnitude: 0 });
    // With y = 0 every step turns clockwise and counts +atan(2^-i): Σ ≈ 99.88°, about 18185 codes of 65536.
    const it = createVectorModel({ zeroVector: 'iterate' }).answer(0, 0);
    expect(it.magnitude).toBe(0);
    expect(Math.abs(it.angle - (99.88 / 360) * 65536)).toBeLessThan(20);
  });

  it('saturates the magnitude, and wraps binary angles while saturating radians', () => {
    const m = createVectorModel({ inBits: 8, inFrac: 6, magBits: 8, magFrac: 6 });
    expect(m.answer(127, 127).magnitude).toBe(127);
    const rad = createVectorModel({ angleFormat: 'rad', angleBits: 8, angleFrac: 6 }); // [−2, 2) rad cannot hold ±π
    expect(rad.answer(-8192, 1).angle).toBe(127);
    expect(rad.answer(-8192, -1).angle).toBe(-128);
    expect(createVectorModel().answer(8192, -1).angle).toBeGreaterThan(65000); // −ε reads as a turn minus ε
  });

  it('fills caller arrays in a batch with the same answers as one pair at a time', () => {
    const m = createVectorModel({ angleFormat: 'rad', gainCompensation: 'multiply' });
    const xs = Int32Array.from({ length: 500 }, (_, k) => -32768 + k * 131);
    const ys = Int32Array.from({ length: 500 }, (_, k) => 32767 - k * 97);
    const angles = new Int32Array(500);
    const mags = new Int32Array(500);
    m.answerInto(xs, ys, angles, mags);
    xs.forEach((x, k) => expect({ angle: angles[k], magnitude: mags[k] }).toEqual(m.answer(x, ys[k])));
  });

  it('names the first bad input of a batch, and refuses short or unequal arrays and bad configurations', () => {
    const m = createVectorModel({ inBits: 8 });
    const out = new Int32Array(3);
    expect(() => m.answerInto([0, 1, 2], [0, 128, 1], out, out)).toThrow(/inputs\[1\]: input y 128 is not an integer -128\.\.127/);
    expect(() => m.answerInto([0, 1, 2, 3], [0, 1, 2, 3], out, out)).toThrow(RangeError);
    expect(() => m.answerInto([0, 1], [0], out, out)).toThrow(/differ in length/);
    expect(() => m.answer(0.5, 0)).toThrow(VectorInputError);
    expect(() => createVectorModel({ iterations: 0 })).toThrow(ModelConfigError);
    expect(() => createVectorModel({ iterations: 0 })).toThrow(/^iterations: /);
  });
});
