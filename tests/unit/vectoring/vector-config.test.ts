import { describe, expect, it } from 'vitest';
import { ModelConfigError } from '../../../shared/numeric/errors';
import { buildVectorTables } from '../../../shared/vectoring/vector-tables';
import { DEFAULT_VECTOR_CONFIG, inputRange, parseVectorConfig, vectorConfigSchema } from '../../../shared/vectoring/vector-config';

describe('the vectoring configuration', () => {
  it('fills the defaults docs/model.md gives when keys are left out', () => {
    expect(parseVectorConfig({})).toEqual({
      inBits: 16,
      inFrac: 14,
      iterations: 16,
      guardBits: 2,
      zGuardBits: 2,
      shiftRounding: 'floor',
      outputRounding: 'nearest',
      prerotation: 'half-turn',
      gainCompensation: 'none',
      gainBits: 16,
      gainRounding: 'nearest',
      magBits: 18,
      magFrac: 14,
      angleFormat: 'turn',
      angleBits: 16,
      angleFrac: 0,
      zeroVector: 'zero',
    });
    expect(DEFAULT_VECTOR_CONFIG).toEqual(parseVectorConfig({}));
    expect(vectorConfigSchema.parse({})).toEqual(DEFAULT_VECTOR_CONFIG);
  });

  it('derives the defaults of dependent keys from the keys given', () => {
    expect(parseVectorConfig({ inBits: 10 })).toMatchObject({ inFrac: 8, magBits: 12, magFrac: 8 });
    expect(parseVectorConfig({ inBits: 12, inFrac: 3 })).toMatchObject({ magBits: 14, magFrac: 3 });
    expect(parseVectorConfig({ inBits: 24, inFrac: 23, magBits: 8 })).toMatchObject({ magFrac: 7 });
    // 16 bits with 13 fraction bits hold [−4, 4) rad ⊇ [−π, π].
    expect(parseVectorConfig({ angleFormat: 'rad' }).angleFrac).toBe(13);
    expect(parseVectorConfig({ angleFormat: 'turn', angleFrac: 9 }).angleFrac).toBe(0);
  });

  it('refuses bad keys and values, naming the key', () => {
    const cases: [unknown, RegExp][] = [
      [{ inFrac: 16 }, /^inFrac: must be below inBits \(16\)/],
      [{ magBits: 8, magFrac: 8 }, /^magFrac: must be below magBits \(8\)/],
      [{ angleFormat: 'rad', angleBits: 8, angleFrac: 9 }, /^angleFrac: must be at most angleBits \(8\)/],
      [{ gainCompensation: 'multiply', inBits: 24, guardBits: 16, gainBits: 12 }, /^gainBits: inBits \+ guardBits \+ gainBits must be at most 51/],
      [{ angleBits: 32 }, /^angleBits: /],
      [{ inBits: 25 }, /^inBits: /],
      [{ prerotation: 'octant' }, /^prerotation: /],
      [{ zeroVector: true }, /^zeroVector: /],
      [{ fold: true }, /^fold: is not a vectoring configuration key/],
      ['16 bits', /^config: /],
    ];
    for (const [input, message] of cases) {
      expect(() => parseVectorConfig(input)).toThrow(ModelConfigError);
      expect(() => parseVectorConfig(input)).toThrow(message);
    }
    // The same widths pass when nothing is multiplied.
    expect(parseVectorConfig({ inBits: 24, guardBits: 16, gainBits: 12 }).gainBits).toBe(12);
  });

  it('gives the two\'s complement input range', () => {
    expect(inputRange({ inBits: 16 })).toEqual({ min: -32768, max: 32767 });
    expect(inputRange({ inBits: 2 })).toEqual({ min: -2, max: 1 });
  });

  it('builds the compensating constant 1/A_n, rounded or floored to gainBits fraction bits', () => {
    // docs/references.md "CORDIC, rotation mode": K_16 = 0.60725293510313931731 (Volder 1959; Walther 1971),
    // · 2^16 = 39796.93 → 39797 rounded, 39796 floored; in Q15 the usual constant 19898 (0x4DBA, common practice).
    expect(buildVectorTables(parseVectorConfig({ gainCompensation: 'multiply', gainBits: 16 })).gainConst).toBe(39797);
    expect(buildVectorTables(parseVectorConfig({ gainCompensation: 'multiply', gainBits: 16, gainRounding: 'truncate' })).gainConst).toBe(39796);
    expect(buildVectorTables(parseVectorConfig({ gainCompensation: 'multiply', gainBits: 15 })).gainConst).toBe(0x4dba);
    expect(buildVectorTables(parseVectorConfig({})).gainConst).toBe(0);
    // The arctangents are the rotation model's: 16-bit binary angles 8192, 4836, 2555, … (docs/references.md).
    expect(Array.from(buildVectorTables(parseVectorConfig({ zGuardBits: 0, iterations: 4 })).atan)).toEqual([8192, 4836, 2555, 1297]);
  });
});
