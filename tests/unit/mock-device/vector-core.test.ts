import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createVectorModel, parseVectorConfig, planVectors, type VectorConfigInput } from '../../../shared/vectoring';
import { createSimVectorCore, parseVectorCoreFault } from '../../../mock-device/vector-core';
import { faultyIteration } from '../../../shared/explain/vector-faulty-model';
import { parseBoardArgs } from '../../../mock-device/options';

const configArb: fc.Arbitrary<VectorConfigInput> = fc.record({
  inBits: fc.integer({ min: 4, max: 20 }),
  iterations: fc.integer({ min: 1, max: 24 }),
  guardBits: fc.integer({ min: 0, max: 4 }),
  zGuardBits: fc.integer({ min: 0, max: 4 }),
  shiftRounding: fc.constantFrom('floor', 'nearest'),
  outputRounding: fc.constantFrom('truncate', 'nearest'),
  prerotation: fc.constantFrom('none', 'half-turn', 'quadrant'),
  gainCompensation: fc.constantFrom('none', 'multiply'),
  angleFormat: fc.constantFrom('turn', 'rad'),
  angleBits: fc.integer({ min: 8, max: 24 }),
  zeroVector: fc.constantFrom('zero', 'iterate'),
}) as fc.Arbitrary<VectorConfigInput>;

/** The model's answers and a core's, over the same inputs: how many differ, and by what. */
function differences(config: VectorConfigInput, answer: (x: number, y: number) => { angle: number; magnitude: number }, count = 4000, seed = 3) {
  const c = parseVectorConfig(config);
  const model = createVectorModel(c);
  const { xs, ys } = planVectors({ kind: 'random', seed, count }, c);
  let angle = 0;
  let magnitude = 0;
  const diffs: Array<{ x: number; y: number; dAngle: number; dMag: number }> = [];
  for (let i = 0; i < xs.length; i++) {
    const m = model.answer(xs[i], ys[i]);
    const a = answer(xs[i], ys[i]);
    if (a.angle !== m.angle) angle++;
    if (a.magnitude !== m.magnitude) magnitude++;
    diffs.push({ x: xs[i], y: ys[i], dAngle: a.angle - m.angle, dMag: a.magnitude - m.magnitude });
  }
  return { angle, magnitude, diffs };
}

describe("the vectoring board's faulty iteration", () => {
  it('is bit-exact with createVectorModel when it carries no defect, on random configurations', () => {
    fc.assert(
      fc.property(configArb, fc.integer({ min: 0, max: 1000 }), (input, seed) => {
        const c = parseVectorConfig(input);
        const d = differences(c, faultyIteration(c, null), 300, seed);
        expect({ angle: d.angle, magnitude: d.magnitude }).toEqual({ angle: 0, magnitude: 0 });
      }),
      { numRuns: 60, seed: 20 },
    );
  });

  it('is bit-exact with the model on every input of a 6 + 6-bit core, the zero vector and the axes included', () => {
    for (const prerotation of ['none', 'half-turn', 'quadrant'] as const) {
      const c = parseVectorConfig({ inBits: 6, iterations: 8, prerotation, gainCompensation: 'multiply' });
      const model = createVectorModel(c);
      const core = faultyIteration(c, null);
      let differ = 0;
      for (let x = -32; x < 32; x++) for (let y = -32; y < 32; y++) if (JSON.stringify(core(x, y)) !== JSON.stringify(model.answer(x, y))) differ++;
      expect(differ).toBe(0);
    }
  });
});

describe('vectoring core faults', () => {
  it('stuck-bit:magnitude:0:1 sets bit 0 of every magnitude, and leaves the angle alone', () => {
    const core = createSimVectorCore({}, parseVectorCoreFault('stuck-bit:magnitude:0:1'));
    const d = differences({}, core.answer);
    expect(d.angle).toBe(0);
    // Where bit 0 was 0 the answer is one LSB higher; elsewhere it is unchanged.
    expect(d.diffs.every((e) => e.dMag === 0 || e.dMag === 1)).toBe(true);
    expect(d.magnitude).toBeGreaterThan(1000);
  });

  it('stuck-bit:angle:15:0 clears the top bit of a 16-bit binary angle: the lower half-turn answers stand', () => {
    const core = createSimVectorCore({}, parseVectorCoreFault('stuck-bit:angle:15:0'));
    const d = differences({}, core.answer);
    expect(d.magnitude).toBe(0);
    expect(d.diffs.every((e) => e.dAngle === 0 || e.dAngle === -32768)).toBe(true);
    // y < 0 puts atan2 in the lower half-turn, code ≥ 32768 (docs/model.md: negative angles wrap).
    expect(d.diffs.filter((e) => e.y < 0 && e.dAngle === 0).length).toBeLessThan(5);
  });

  it('sign-slip:3 moves nearly every angle, never by more than 2·atan(2^-3)', () => {
    const core = createSimVectorCore({}, parseVectorCoreFault('sign-slip:3'));
    const d = differences({}, core.answer);
    // Turning the wrong way at iteration 3 leaves the vector 2·atan(1/8) = 0.2487 rad (2594 codes of
    // a 16-bit turn) further from the axis than it should be; the later iterations win some back,
    // all of it only where the residual angle before iteration 3 was near zero.
    const wrapped = d.diffs.map((e) => ((((e.dAngle + 32768) % 65536) + 65536) % 65536) - 32768);
    expect(Math.max(...wrapped.map(Math.abs))).toBeLessThanOrEqual(2595);
    expect(d.angle).toBeGreaterThan(3900);
  });

  it('atan-entry:2:+40 shifts the angle of every vector by 40 z units, ±40 as iteration 2 turns', () => {
    const core = createSimVectorCore({ zGuardBits: 0 }, parseVectorCoreFault('atan-entry:2:+40'));
    const d = differences({ zGuardBits: 0 }, core.answer);
    expect(d.magnitude).toBe(0);
    // With no z guard bits a z unit is an angle code, and iteration 2 adds or subtracts its entry.
    const moved = new Set(d.diffs.filter((e) => e.x !== 0 || e.y !== 0).map((e) => ((e.dAngle % 65536) + 65536) % 65536));
    expect([...moved].sort((a, b) => a - b)).toEqual([40, 65536 - 40]);
  });

  it('gain (no compensating multiply) leaves the magnitude K_n ≈ 1.6468 times too large', () => {
    const config = { gainCompensation: 'multiply' } as const;
    const core = createSimVectorCore(config, parseVectorCoreFault('gain'));
    const model = createVectorModel(config);
    const ratios: number[] = [];
    for (const [x, y] of [[12000, 5000], [-9000, 3000], [4000, -15000]]) ratios.push(core.answer(x, y).magnitude / model.answer(x, y).magnitude);
    // K_16 = ∏ sqrt(1 + 2^-2i), i = 0..15 ≈ 1.646760 (docs/references.md, the CORDIC gain).
    for (const r of ratios) expect(r).toBeCloseTo(1.64676, 3);
    // The same as declaring the core without compensation: one defect, two spellings.
    const none = createVectorModel({ gainCompensation: 'none' });
    expect(core.answer(12000, 5000)).toEqual(none.answer(12000, 5000));
  });

  it('reads configuration deviations and refuses faults the core cannot have', () => {
    expect(parseVectorCoreFault('iterations=12')).toEqual({ config: { iterations: 12 }, fault: null });
    expect(parseVectorCoreFault('gainCompensation=none')).toEqual({ config: { gainCompensation: 'none' }, fault: null });
    expect(parseVectorCoreFault('stuck:3')).toEqual({ config: {}, fault: { kind: 'stuck-bit', channel: 'both', bit: 3, value: 1 } });
    expect(() => parseVectorCoreFault('fold')).toThrow(/not a vectoring core fault; known: sign-slip:K/);
    expect(() => parseVectorCoreFault('stuck-bit:cos:1:1')).toThrow(/channel must be angle, magnitude or both/);
    expect(() => parseVectorCoreFault('inBits=12')).toThrow(/inBits is not a key a vectoring core can deviate in/);
    expect(() => createSimVectorCore({ iterations: 10 }, parseVectorCoreFault('sign-slip:10'))).toThrow(/iterations 0\.\.9, not 10/);
    expect(() => createSimVectorCore({}, parseVectorCoreFault('gain'))).toThrow(/no gain compensation to get wrong/);
    expect(() => createSimVectorCore({ angleBits: 12 }, parseVectorCoreFault('stuck-bit:angle:12:1'))).toThrow(/bits 0\.\.11, not 12/);
    expect(() => createSimVectorCore({}, parseVectorCoreFault('iterations=99'))).toThrow(/--core-fault iterations/);
  });
});

describe('npm run mock -- --mode vectoring', () => {
  it('takes the vectoring keys in --core and the vectoring catalogue in --core-fault', () => {
    const { settings } = parseBoardArgs(['--mode', 'vectoring', '--core', '{"inBits":12,"iterations":12}', '--core-fault', 'sign-slip:2']);
    expect(settings.vector?.core).toMatchObject({ inBits: 12, iterations: 12 });
    expect(settings.vector?.fault).toEqual({ config: {}, fault: { kind: 'sign-slip', iteration: 2 } });
    expect(settings.coreFault).toBeUndefined();
  });

  it('takes an intermittent fault with its seed, wrapping the vectoring core', () => {
    const { settings } = parseBoardArgs(['--mode', 'vectoring', '--core-fault', 'flaky:0.01@5', '--seed', '9']);
    expect(settings.flaky).toEqual({ kind: 'flaky', rate: 0.01, onsetS: 5 });
    expect(settings.seed).toBe(9);
    expect(settings.vector).toEqual({ core: expect.objectContaining({ inBits: 16 }) });
  });

  it('leaves the rotating board as it was, and names what is wrong', () => {
    expect(parseBoardArgs([]).settings.vector).toBeUndefined();
    expect(() => parseBoardArgs(['--mode', 'spiral'])).toThrow('--mode must be rotation or vectoring, got "spiral"');
    expect(() => parseBoardArgs(['--mode', 'vectoring', '--core', '{"outBits":18}'])).toThrow(/outBits/);
    expect(() => parseBoardArgs(['--mode', 'vectoring', '--core-fault', 'flaky:2'])).toThrow(/above 0 and at most 1/);
    expect(() => parseBoardArgs(['--mode', 'vectoring', '--core-fault', 'sign-slip:40'])).toThrow(/not 40/);
  });
});
