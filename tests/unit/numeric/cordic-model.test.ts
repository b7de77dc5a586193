import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createCordicModel, fitsInt32, type CordicModel } from '../../../shared/numeric/cordic-model';
import { traceCordic } from '../../../shared/numeric/cordic-trace';
import { cordicGain } from '../../../shared/numeric/cordic-tables';
import { AngleCodeError, ModelConfigError } from '../../../shared/numeric/errors';
import { exactSinCos } from '../../../shared/numeric/exact-reference';
import { angleCodeRange } from '../../../shared/numeric/formats';
import type { ModelConfig } from '../../../shared/numeric/model-config';

/**
 * The definition of issue 3 written out line by line in BigInt, with real arithmetic shifts: an
 * independent second reading that proves the double-based model neither wraps at 32 bits nor
 * loses integers at 40.
 */
function bigIntModel(c: ModelConfig, code: number): { cos: number; sin: number } {
  const B = BigInt;
  const round = (v: number) => B(v < 0 ? -Math.round(-v) : Math.round(v));
  const F = c.outFrac + c.guardBits;
  let z: bigint;
  let turn: bigint;
  let half: bigint;
  let quarter: bigint;
  let atan: bigint[];
  if (c.angleFormat === 'turn') {
    const zBits = c.angleBits + c.zGuardBits;
    z = BigInt.asIntN(zBits, B(code) << B(c.zGuardBits));
    turn = 1n << B(zBits);
    half = turn / 2n;
    quarter = turn / 4n;
    atan = Array.from({ length: c.iterations }, (_, i) => round((Math.atan(2 ** -i) / (2 * Math.PI)) * 2 ** zBits));
  } else {
    const zFrac = c.angleFrac + c.zGuardBits;
    z = B(code) << B(c.zGuardBits);
    turn = round(2 * Math.PI * 2 ** zFrac);
    half = round(Math.PI * 2 ** zFrac);
    quarter = round((Math.PI / 2) * 2 ** zFrac);
    // Fewest whole turns into [−half, +half] (ceiling division: BigInt division truncates).
    if (z > half) z -= ((z - half + turn - 1n) / turn) * turn;
    if (z < -half) z += ((-half - z + turn - 1n) / turn) * turn;
    atan = Array.from({ length: c.iterations }, (_, i) => round(Math.atan(2 ** -i) * 2 ** zFrac));
  }
  let neg = false;
  if (c.fold && z > quarter) [z, neg] = [z - half, true];
  else if (c.fold && z < -quarter) [z, neg] = [z + half, true];
  let x = round(cordicGain(c.iterations) * 2 ** F);
  let y = 0n;
  const shift = (v: bigint, i: number) => (c.shiftRounding === 'nearest' && i > 0 ? (v + (1n << B(i - 1))) >> B(i) : v >> B(i));
  for (let i = 0; i < c.iterations; i++) {
    const d = z >= 0n ? 1n : -1n;
    const sx = shift(x, i);
    const sy = shift(y, i);
    [x, y, z] = [x - d * sy, y + d * sx, z - d * atan[i]];
  }
  if (neg) [x, y] = [-x, -y];
  const g = B(c.guardBits);
  const lo = -(1n << B(c.outBits - 1));
  const hi = (1n << B(c.outBits - 1)) - 1n;
  const out = (v: bigint) => {
    const r = c.guardBits === 0 ? v : c.outputRounding === 'nearest' ? (v + (1n << (g - 1n))) >> g : v >> g;
    return Number(r < lo ? lo : r > hi ? hi : r);
  };
  return { cos: out(x), sin: out(y) };
}

const configArb = fc
  .record({
    angleFormat: fc.constantFrom('turn' as const, 'rad' as const),
    angleBits: fc.integer({ min: 2, max: 32 }),
    outBits: fc.integer({ min: 2, max: 24 }),
    iterations: fc.integer({ min: 1, max: 40 }),
    guardBits: fc.integer({ min: 0, max: 16 }),
    zGuardBits: fc.integer({ min: 0, max: 8 }),
    shiftRounding: fc.constantFrom('floor' as const, 'nearest' as const),
    outputRounding: fc.constantFrom('truncate' as const, 'nearest' as const),
    fold: fc.boolean(),
    fracShare: fc.double({ min: 0, max: 1, noNaN: true }),
  })
  .map(({ fracShare, ...c }) => ({
    ...c,
    angleFrac: c.angleFormat === 'rad' ? Math.round(fracShare * c.angleBits) : undefined,
    outFrac: Math.min(c.outBits - 1, Math.round(fracShare * c.outBits)),
  }));

/** Largest |model − exact| in output LSB over the given codes, both channels. */
function maxErrorLsb(m: CordicModel, codes: Iterable<number>): number {
  const scale = 2 ** m.config.outFrac;
  let worst = 0;
  for (const code of codes) {
    const r = m.evaluate(code);
    const e = exactSinCos(m.config, code);
    worst = Math.max(worst, Math.abs(r.cos - e.cos * scale), Math.abs(r.sin - e.sin * scale));
  }
  return worst;
}

/**
 * The error bound for n iterations and the word lengths, in output LSB:
 * - angle left after n iterations, |z_n| ≤ atan(2^-(n-1)) (Volder 1959), plus half a z unit per
 *   rounded table entry and per folding or turn reduction step;
 * - rounding of x0 and of each shifted term (≤ 1 unit of 2^-F per channel, √2 as a vector),
 *   grown by at most 1/K_n afterwards (Hu 1992, from memory: rounding costs about log2(n) bits);
 * - the final rounding to the output format (½ LSB nearest, 1 LSB truncate).
 */
function errorBoundLsb(c: ModelConfig): number {
  const n = c.iterations;
  const zUnitRad = c.angleFormat === 'turn' ? (2 * Math.PI) / 2 ** (c.angleBits + c.zGuardBits) : 2 ** -(c.angleFrac + c.zGuardBits);
  const turnsSpanned = c.angleFormat === 'rad' ? 2 ** (c.angleBits - 1 - c.angleFrac) / (2 * Math.PI) + 1 : 0;
  const angleRad = Math.atan(2 ** -(n - 1)) + zUnitRad * (0.5 * n + 1 + turnsSpanned);
  const datapath = ((0.5 + Math.SQRT2 * n) / cordicGain(n)) * 2 ** -c.guardBits;
  const output = c.outputRounding === 'nearest' ? 0.5 : 1;
  return angleRad * 2 ** c.outFrac + datapath + output;
}

function* allCodes(m: CordicModel) {
  const r = angleCodeRange(m.config);
  for (let k = r.min; k <= r.max; k++) yield k;
}

function* spreadCodes(m: CordicModel, count: number) {
  const r = angleCodeRange(m.config);
  for (let k = 0; k < count; k++) yield r.min + Math.floor(((k + 0.5) * r.count) / count);
}

describe('the CORDIC reference model', () => {
  it('computes exactly what the definition says, for random configurations up to 32-bit angles and 24-bit outputs', () => {
    fc.assert(
      fc.property(configArb, fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }), (input, at) => {
        const m = createCordicModel(input);
        const r = angleCodeRange(m.config);
        const code = r.min + Math.floor(at * r.count);
        expect(m.evaluate(code)).toEqual(bigIntModel(m.config, code));
      }),
      { numRuns: 3000 },
    );
  });

  it('gives the same answers in 32-bit integers as in the general arithmetic, whenever the datapath fits', () => {
    let fitting = 0;
    fc.assert(
      fc.property(configArb, (input) => {
        const m = createCordicModel(input);
        if (!fitsInt32(m.config, m.tables)) return;
        fitting++;
        const general = createCordicModel(input, 'float');
        const codes = Float64Array.from(spreadCodes(m, 256));
        const got = [new Int32Array(256), new Int32Array(256)] as const;
        const want = [new Int32Array(256), new Int32Array(256)] as const;
        m.evaluateInto(codes, got[0], got[1]);
        general.evaluateInto(codes, want[0], want[1]);
        expect(got).toEqual(want);
      }),
      { numRuns: 1500 },
    );
    expect(fitting).toBeGreaterThan(100); // the random configurations do reach the 32-bit path
  });

  it('is exact at the widest datapath the 32-bit path takes, and on every code of the default core', () => {
    // F = outFrac + guardBits = 28, 30 iterations, 2^29 z units per turn: each at its bound.
    const widest = createCordicModel({ angleBits: 27, zGuardBits: 2, outBits: 24, outFrac: 23, guardBits: 5, iterations: 30, shiftRounding: 'nearest' });
    expect(fitsInt32(widest.config, widest.tables)).toBe(true);
    for (const code of spreadCodes(widest, 2000)) expect(widest.evaluate(code)).toEqual(bigIntModel(widest.config, code));
    const wider = createCordicModel({ ...widest.config, guardBits: 6 });
    expect(fitsInt32(wider.config, wider.tables)).toBe(false);
    const m = createCordicModel();
    expect(fitsInt32(m.config, m.tables)).toBe(true);
    for (const code of allCodes(m)) expect(m.evaluate(code)).toEqual(bigIntModel(m.config, code));
  });

  it('shares one model per configuration', () => {
    expect(createCordicModel({ iterations: 12 })).toBe(createCordicModel({ iterations: 12, angleFormat: 'turn' }));
    expect(createCordicModel({ iterations: 12 })).not.toBe(createCordicModel({ iterations: 13 }));
    expect(createCordicModel({ iterations: 12 }, 'float')).not.toBe(createCordicModel({ iterations: 12 }));
  });

  it('computes exactly what the definition says at the ends of a 32-bit angle range', () => {
    for (const angleFormat of ['turn', 'rad'] as const) {
      const m = createCordicModel({ angleFormat, angleBits: 32, angleFrac: 29, outBits: 24, outFrac: 22, guardBits: 16, zGuardBits: 8, iterations: 40 });
      const r = angleCodeRange(m.config);
      for (const code of [r.min, r.min + 1, 0, 1, r.max - 1, r.max, Math.floor(r.max / 3)]) {
        expect(m.evaluate(code)).toEqual(bigIntModel(m.config, code));
      }
    }
  });

  it('stays within the literature bound of exact sin and cos on every 16-bit code of the default core', () => {
    const m = createCordicModel();
    const err = maxErrorLsb(m, allCodes(m));
    expect(err).toBeLessThanOrEqual(errorBoundLsb(m.config));
    expect(err).toBeGreaterThan(0.5); // the default core is not ideal: 2 z guard bits cost accuracy
  });

  it('stays within the bound across iterations, word lengths, roundings and formats', () => {
    const configs = [
      { iterations: 8 },
      { iterations: 12, guardBits: 0, shiftRounding: 'nearest' as const },
      { iterations: 20, angleBits: 20, outBits: 20, outFrac: 18, guardBits: 5, zGuardBits: 4 },
      { angleFormat: 'rad' as const, angleBits: 16, angleFrac: 12 },
      { angleFormat: 'rad' as const, angleBits: 24, angleFrac: 20, outBits: 18, outFrac: 16, iterations: 18, guardBits: 4, outputRounding: 'truncate' as const },
      { angleBits: 32, outBits: 24, outFrac: 22, iterations: 26, guardBits: 6, zGuardBits: 2 },
    ];
    for (const cfg of configs) {
      const m = createCordicModel(cfg);
      expect(maxErrorLsb(m, spreadCodes(m, 20000))).toBeLessThanOrEqual(errorBoundLsb(m.config));
    }
  });

  it('gains about one bit of accuracy per iteration when the datapath is wide', () => {
    // Rule of thumb: about one bit per iteration (Andraka 1998; common practice).
    const errs: number[] = [];
    for (let n = 6; n <= 18; n++) {
      const m = createCordicModel({ angleBits: 24, outBits: 24, outFrac: 22, guardBits: 8, zGuardBits: 4, iterations: n });
      errs.push(maxErrorLsb(m, spreadCodes(m, 4096)));
    }
    for (let k = 1; k < errs.length; k++) {
      const ratio = errs[k] / errs[k - 1];
      expect(ratio).toBeGreaterThan(0.4);
      expect(ratio).toBeLessThan(0.6);
    }
  });

  it('needs the quadrant fold beyond about ±99.88°, the convergence range', () => {
    // docs/references.md "CORDIC, rotation mode": without pre-rotation CORDIC converges within Σ atan(2^-i) ≈ 99.88° (Walther; Andraka).
    const unfolded = createCordicModel({ fold: false });
    const folded = createCordicModel({ fold: true });
    const at = (deg: number) => (Math.round((deg / 360) * 65536) + 65536) % 65536;
    expect(maxErrorLsb(unfolded, [at(95), at(-95)])).toBeLessThan(4);
    expect(maxErrorLsb(unfolded, [at(135), at(-135), at(180)])).toBeGreaterThan(1000);
    expect(maxErrorLsb(folded, [at(135), at(-135), at(180)])).toBeLessThan(4);
  });

  it('saturates instead of wrapping when the output format cannot hold 1.0', () => {
    // Q15 cannot hold +1.0 (docs/references.md "Number formats"); a wrap would give -32768.
    const m = createCordicModel({ outBits: 16, outFrac: 15, guardBits: 4, iterations: 20 });
    expect(m.evaluate(0).cos).toBe(32767);
    expect(m.evaluate(0x8000).cos).toBe(-32768);
  });

  it('fills caller arrays in a batch with the same answers as one code at a time', () => {
    const m = createCordicModel({ angleFormat: 'rad' });
    const codes = Float64Array.from({ length: 500 }, (_, k) => -32768 + k * 131);
    const cos = new Int32Array(codes.length);
    const sin = new Int32Array(codes.length);
    m.evaluateInto(codes, cos, sin);
    codes.forEach((code, k) => expect({ cos: cos[k], sin: sin[k] }).toEqual(m.evaluate(code)));
  });

  it('names the index of the first bad code in a batch, and refuses short output arrays', () => {
    const m = createCordicModel();
    const out = new Int32Array(3);
    expect(() => m.evaluateInto([0, 65536, 1], out, out)).toThrow(/codes\[1\]: angle code 65536/);
    expect(() => m.evaluateInto([0, 1, 2, 3], out, out)).toThrow(RangeError);
    expect(() => m.evaluate(-1)).toThrow(AngleCodeError);
  });

  it('refuses a bad configuration with the key at fault', () => {
    expect(() => createCordicModel({ iterations: 0 })).toThrow(ModelConfigError);
    expect(() => createCordicModel({ iterations: 0 })).toThrow(/^iterations: /);
  });
});

describe('the iteration trace', () => {
  it('ends where the model ends and keeps x, y, z consistent at every step', () => {
    fc.assert(
      fc.property(configArb, fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }), (input, at) => {
        const m = createCordicModel(input);
        const r = angleCodeRange(m.config);
        const code = r.min + Math.floor(at * r.count);
        const t = traceCordic(m, code);
        expect({ cos: t.cos, sin: t.sin }).toEqual(m.evaluate(code));
        expect(t.steps).toHaveLength(m.config.iterations);
        let z = t.zStart;
        for (const s of t.steps) {
          expect(s.d).toBe(z >= 0 ? 1 : -1);
          z -= s.d * s.atan;
          expect(s.z).toBe(z);
        }
      }),
      { numRuns: 500 },
    );
  });
});
