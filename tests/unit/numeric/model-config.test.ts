import { describe, expect, it } from 'vitest';
import { ModelConfigError } from '../../../shared/numeric/errors';
import { DEFAULT_MODEL_CONFIG, parseModelConfig } from '../../../shared/numeric/model-config';

describe('the model configuration', () => {
  it('fills the defaults the definition gives when keys are left out', () => {
    expect(parseModelConfig({})).toEqual({
      angleFormat: 'turn',
      angleBits: 16,
      angleFrac: 0,
      outBits: 16,
      outFrac: 14,
      iterations: 16,
      guardBits: 2,
      zGuardBits: 2,
      shiftRounding: 'floor',
      outputRounding: 'nearest',
      fold: true,
    });
    expect(DEFAULT_MODEL_CONFIG).toEqual(parseModelConfig({}));
  });

  it('gives rad angles angleBits − 4 fraction bits by default, so 16 bits cover [-8, 8) rad', () => {
    // docs/protocol.md "3. Numbers": 16 bits with 12 fraction bits covers [-8, 8) rad ⊇ [-2π, 2π].
    expect(parseModelConfig({ angleFormat: 'rad' }).angleFrac).toBe(12);
    expect(parseModelConfig({ angleFormat: 'rad', angleBits: 24, angleFrac: 20 }).angleFrac).toBe(20);
  });

  it('keeps the keys it is given', () => {
    const c = parseModelConfig({ angleBits: 32, outBits: 24, outFrac: 22, iterations: 30, shiftRounding: 'nearest', fold: false });
    expect([c.angleBits, c.outBits, c.outFrac, c.iterations, c.shiftRounding, c.fold]).toEqual([32, 24, 22, 30, 'nearest', false]);
  });

  it('names the key at fault in a one-line error', () => {
    const cases: [unknown, RegExp][] = [
      [{ angleBits: 33 }, /^angleBits: /],
      [{ outBits: 25 }, /^outBits: /],
      [{ outFrac: 16 }, /^outFrac: must be below outBits/],
      [{ iterations: 2.5 }, /^iterations: /],
      [{ shiftRounding: 'up' }, /^shiftRounding: /],
      [{ fold: 'yes' }, /^fold: /],
      [{ angleFormat: 'rad', angleBits: 8, angleFrac: 9 }, /^angleFrac: /],
      [{ gain: 1 }, /^gain: is not a model configuration key/],
      [null, /^config: /],
    ];
    for (const [input, message] of cases) {
      let caught: unknown;
      try {
        parseModelConfig(input);
      } catch (e) {
        caught = e;
      }
      expect(caught).toBeInstanceOf(ModelConfigError);
      expect((caught as Error).message).toMatch(message);
      expect((caught as Error).message).not.toContain('\n');
    }
  });
});
