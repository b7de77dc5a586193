import { describe, expect, it } from 'vitest';
import { cordicGain } from '../../../shared/numeric/cordic-tables';
import { parseVectorConfig, type VectorConfig, type VectorConfigInput } from '../../../shared/vectoring/vector-config';
import { exactVector } from '../../../shared/vectoring/vector-exact';
import { createVectorModel } from '../../../shared/vectoring/vector-model';
import { planVectors } from '../../../shared/vectoring/vector-plans';
import { wrapAngleError } from '../../../shared/vectoring/vector-score';

/** Largest |model − exact| in angle and magnitude LSB over the pairs of at least `minRadius` codes. */
function worstErrors(c: VectorConfig, xs: Int32Array, ys: Int32Array, minRadius: number) {
  const m = createVectorModel(c);
  const period = c.angleFormat === 'turn' ? 2 ** c.angleBits : 2 * Math.PI * 2 ** c.angleFrac;
  let angle = 0;
  let magnitude = 0;
  for (let k = 0; k < xs.length; k++) {
    if (Math.hypot(xs[k], ys[k]) < minRadius) continue;
    const a = m.answer(xs[k], ys[k]);
    const e = exactVector(c, xs[k], ys[k]);
    angle = Math.max(angle, Math.abs(wrapAngleError(a.angle - e.angle, period)));
    magnitude = Math.max(magnitude, Math.abs(a.magnitude - e.magnitude));
  }
  return { angle, magnitude };
}

/**
 * Error bounds for vectors of at least r input codes, in output LSB:
 * - angle: the angle left after n iterations, at most atan(2^-(n-1)) (Volder 1959), half a z unit
 *   per rounded table entry, and the datapath's rounding (at most about √2 per step, in units of
 *   2^-guardBits input codes; Hu 1992, from memory) seen as an angle from radius r; then the
 *   output rounding;
 * - magnitude: the same datapath rounding grown by A_n at most, the constant's rounding times the
 *   largest x, and the output rounding.
 */
function bounds(c: VectorConfig, r: number) {
  const n = c.iterations;
  const lsbRad = c.angleFormat === 'turn' ? (2 * Math.PI) / 2 ** c.angleBits : 2 ** -c.angleFrac;
  const out = c.outputRounding === 'nearest' ? 0.5 : 1;
  const datapath = (0.5 + Math.SQRT2 * n) * 2 ** -c.guardBits; // input codes
  const angle = (Math.atan(2 ** -(n - 1)) + (lsbRad / 2 ** c.zGuardBits) * (0.5 * n + 1) + datapath / r) / lsbRad + out;
  const growth = 1 / cordicGain(n);
  const xMax = growth * Math.SQRT2 * 2 ** (c.inBits - 1); // input codes
  const constant = c.gainCompensation === 'multiply' ? xMax * (c.gainRounding === 'nearest' ? 0.5 : 1) * 2 ** -c.gainBits : 0;
  const magnitude = (datapath * growth + constant) * 2 ** (c.magFrac - c.inFrac) + out;
  return { angle, magnitude };
}

describe('how far from exact a correct vectoring model is', () => {
  it('stays within the bound across iterations, word lengths, roundings, pre-rotations and formats', () => {
    const configs: VectorConfigInput[] = [
      {},
      { iterations: 8 },
      { iterations: 12, guardBits: 0, shiftRounding: 'nearest' },
      { inBits: 20, inFrac: 18, iterations: 20, guardBits: 5, zGuardBits: 4, angleBits: 20 },
      { angleFormat: 'rad', gainCompensation: 'multiply', prerotation: 'quadrant' },
      { gainCompensation: 'multiply', gainBits: 10, gainRounding: 'truncate', outputRounding: 'truncate', magBits: 20, magFrac: 16 },
    ];
    for (const input of configs) {
      const c = parseVectorConfig(input);
      const r = 2 ** (c.inBits - 3); // a quarter of full scale and beyond
      const { xs, ys } = planVectors({ kind: 'random', seed: 5, count: 20000 }, c);
      const got = worstErrors(c, xs, ys, r);
      const limit = bounds(c, r);
      expect(got.angle).toBeLessThanOrEqual(limit.angle);
      expect(got.magnitude).toBeLessThanOrEqual(limit.magnitude);
    }
  });

  it('gains about one bit of angle accuracy per iteration when the datapath is wide', () => {
    // Rule of thumb: about one bit per iteration (Andraka 1998; common practice).
    const errs: number[] = [];
    for (let n = 6; n <= 18; n++) {
      const c = parseVectorConfig({ inBits: 20, inFrac: 18, guardBits: 8, zGuardBits: 4, angleBits: 24, iterations: n });
      const { xs, ys } = planVectors({ kind: 'circle', radius: 400000, points: 2048 }, c);
      errs.push(worstErrors(c, xs, ys, 0).angle);
    }
    for (let k = 1; k < errs.length; k++) {
      expect(errs[k] / errs[k - 1]).toBeGreaterThan(0.4);
      expect(errs[k] / errs[k - 1]).toBeLessThan(0.6);
    }
  });

  it('loses angle resolution near the origin, where a code of x or y is a large angle', () => {
    // (1, 1) with 2 guard bits: the iterations see a vector of 4 datapath units, so the shifts floor
    // to nothing after a few steps; the angle is far from 45°. At full scale it is within a few codes.
    const c = parseVectorConfig({});
    const near = worstErrors(c, Int32Array.from([1, 2, -1]), Int32Array.from([1, 1, 2]), 0).angle;
    const far = worstErrors(c, Int32Array.from([30000, -20000]), Int32Array.from([30000, 25000]), 0).angle;
    expect(near).toBeGreaterThan(100);
    expect(far).toBeLessThan(3);
  });
});
