import Decimal from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { createFaultyModel, parseFault, traceFaulty, type Fault } from '../../../shared/explain';
import { defectCandidates, deviationCandidates } from '../../../shared/explain/catalogue';
import { createGenericModel } from '../../../shared/explain/faulty-model';
import { createCordicModel, DEFAULT_MODEL_CONFIG, parseModelConfig, traceCordic, type ModelConfig } from '../../../shared/numeric';

const CONFIGS: ModelConfig[] = [
  DEFAULT_MODEL_CONFIG,
  parseModelConfig({ angleFormat: 'rad', angleBits: 16, angleFrac: 12, shiftRounding: 'nearest' }),
  parseModelConfig({ angleBits: 12, outBits: 24, outFrac: 22, outputRounding: 'truncate', iterations: 22 }),
  parseModelConfig({ angleBits: 12, outFrac: 15, guardBits: 0, zGuardBits: 0, fold: false, iterations: 9 }),
];

function codesOf(c: ModelConfig, count = 4096): Float64Array {
  const span = 2 ** c.angleBits;
  const lo = c.angleFormat === 'turn' ? 0 : -span / 2;
  const step = Math.max(1, Math.floor(span / count));
  return Float64Array.from({ length: Math.ceil(span / step) }, (_, k) => lo + k * step);
}

function answers(m: { evaluateInto(codes: ArrayLike<number>, c: Int32Array, s: Int32Array): void }, codes: Float64Array) {
  const cos = new Int32Array(codes.length);
  const sin = new Int32Array(codes.length);
  m.evaluateInto(codes, cos, sin);
  return { cos, sin };
}

describe('the faulty iteration', { timeout: 120_000 }, () => {
  it('without a defect gives exactly the reference model, on both of its paths', () => {
    for (const c of CONFIGS) {
      const codes = codesOf(c);
      const reference = answers(createCordicModel(c), codes);
      expect(answers(createGenericModel(c, null), codes)).toEqual(reference);
      expect(answers(createGenericModel(c, null, 'float'), codes)).toEqual(reference);
    }
  });

  it('gives the same answers on its 32-bit and double paths for every catalogue hypothesis', () => {
    for (const c of CONFIGS) {
      const codes = codesOf(c, 512);
      for (const h of [...deviationCandidates(c), ...defectCandidates(c, 2, 5)]) {
        const a = answers(createGenericModel(h.config, h.fault), codes);
        const b = answers(createGenericModel(h.config, h.fault, 'float'), codes);
        if (a.cos.some((v, k) => v !== b.cos[k]) || a.sin.some((v, k) => v !== b.sin[k])) expect.fail(`paths differ for ${JSON.stringify(h)}`);
      }
    }
  });

  it('applies the output-stage defects to the healthy answers as stated', () => {
    const codes = codesOf(DEFAULT_MODEL_CONFIG);
    const healthy = answers(createCordicModel({}), codes);
    const faulty = (f: string) => answers(createFaultyModel(DEFAULT_MODEL_CONFIG, parseFault(f)), codes);
    expect(faulty('swap')).toEqual({ cos: healthy.sin, sin: healthy.cos });
    expect(faulty('negate:cos')).toEqual({ cos: healthy.cos.map((v) => -v), sin: healthy.sin });
    const stuck = faulty('stuck-bit:sin:3:1');
    expect(stuck.cos).toEqual(healthy.cos);
    expect(stuck.sin).toEqual(healthy.sin.map((v) => v | 8)); // two's complement: bit 3 set
    const low = faulty('stuck-bit:both:0:0');
    expect(low.cos).toEqual(healthy.cos.map((v) => v & ~1));
    expect(faulty('angle-offset:+5')).toEqual(answers(createCordicModel({}), codes.map((c) => (c + 5) % 65_536)));
    expect(faulty('angle-bit:15:1')).toEqual(answers(createCordicModel({}), codes.map((c) => c | 0x8000)));
    expect(faulty('angle-bit:2:0')).toEqual(answers(createCordicModel({}), codes.map((c) => c & ~4)));
  });

  it('wraps instead of saturating where the format cannot hold +1.0', () => {
    // Q1.15: cos 0 = +1.0 does not fit; the model clips to 32767, a wrapping core shows −32768.
    const q15 = parseModelConfig({ outFrac: 15 });
    expect(createCordicModel(q15).evaluate(0).cos).toBe(32_767);
    expect(createFaultyModel(q15, { kind: 'wrap' }).evaluate(0).cos).toBe(-32_768);
  });

  it('starts from the gain of another iteration count', () => {
    // K_2 = 1/√(1 · 1.25) = 1/√2.5: the gain product K_n = Π (1 + 2^−2i)^−1/2 (Volder; Walther, see
    // docs/references.md "CORDIC, rotation mode"), recomputed with decimal.js.
    const k2 = new Decimal(1).div(new Decimal(2.5).sqrt());
    const expected = k2.times(2 ** 16).toDecimalPlaces(0, Decimal.ROUND_HALF_UP).toNumber();
    expect(expected).toBe(41_449);
    expect(traceFaulty(DEFAULT_MODEL_CONFIG, parseFault('gain:2'), 1820).x0).toBe(expected);
    expect(traceFaulty(DEFAULT_MODEL_CONFIG, parseFault('gain:0'), 1820).x0).toBe(2 ** 16); // no compensation: 1.0
  });

  it("traces the worked example exactly as the model's trace does, and a slip from its step on", () => {
    const model = createCordicModel({});
    expect(traceFaulty(DEFAULT_MODEL_CONFIG, null, 1820)).toEqual(traceCordic(model, 1820));
    const healthy = traceCordic(model, 1820);
    const slipped = traceFaulty(DEFAULT_MODEL_CONFIG, { kind: 'sign-slip', iteration: 5 }, 1820);
    expect(slipped.steps.slice(0, 5)).toEqual(healthy.steps.slice(0, 5));
    // docs/model.md's table: z was 1493 before step 5, so d = +1; the slip turns it to −1.
    expect(healthy.steps[5].d).toBe(1);
    expect(slipped.steps[5].d).toBe(-1);
    expect(slipped.steps[5].z).toBe(1493 + 1303);
    const f: Fault = { kind: 'shift', iteration: 2, by: 1 };
    const shifted = traceFaulty(DEFAULT_MODEL_CONFIG, f, 1820);
    // Step 2 of the table shifts x = 59695 by 3 instead of 2: floor(59695 / 8) = 7461.
    expect(shifted.steps[2].sx).toBe(7461);
    expect(shifted.cos).toBe(createFaultyModel(DEFAULT_MODEL_CONFIG, f).evaluate(1820).cos);
  });

  it('updates y from the new x in a blocking update, and turns z = 0 the negative way when told', () => {
    // Code 0: z = 0 at the start. The definition turns +1 there; zero-direction turns −1.
    expect(traceFaulty(DEFAULT_MODEL_CONFIG, null, 0).steps[0].d).toBe(1);
    expect(traceFaulty(DEFAULT_MODEL_CONFIG, { kind: 'zero-direction' }, 0).steps[0].d).toBe(-1);
    const b = traceFaulty(DEFAULT_MODEL_CONFIG, { kind: 'blocking-update' }, 1820);
    // Step 0: x = 39797, y = 0, d = +1: x stays 39797 − 0, then y = 0 + 39797 (the same as the
    // definition, y was 0); step 1 (d = −1) gives x = 39797 + 19898 = 59695, then y reads the new x.
    expect(b.steps[1].x).toBe(59_695);
    expect(b.steps[1].sx).toBe(Math.floor(59_695 / 2));
  });

  it('refuses a defect the core cannot have', () => {
    expect(() => createFaultyModel(DEFAULT_MODEL_CONFIG, { kind: 'sign-slip', iteration: 20 })).toThrow(/only 16 iterations/);
  });
});
