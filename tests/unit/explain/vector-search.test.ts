import { describe, expect, it } from 'vitest';
import { createSimVectorCore, parseVectorCoreFault } from '../../../mock-device/vector-core';
import { createVectorFaultyModel, explainVectors, ExplainInputError, ExplainStopped, formatVectorFault, parseVectorCoreFault as parseSpelling, vectorFaultLabel } from '../../../shared/explain';
import { Remoteness } from '../../../shared/explain/catalogue';
import { vectorDefectCandidates, vectorDeviationCandidates } from '../../../shared/explain/vector-catalogue';
import { edgePairs, parseVectorConfig, planVectors, type VectorConfigInput } from '../../../shared/vectoring';

/** The simulated vectoring board's answers to a random spread plus the format's edges. */
function board(core: VectorConfigInput, spec: string | null, count = 3000, seed = 11) {
  const config = parseVectorConfig(core);
  const sim = createSimVectorCore(core, spec ? parseVectorCoreFault(spec) : undefined);
  const { xs, ys } = planVectors({ kind: 'random', seed, count }, config);
  const pairs: [number, number][] = [...edgePairs(config), [0, 0]];
  for (let i = 0; i < xs.length; i++) pairs.push([xs[i], ys[i]]);
  const x = Int32Array.from(pairs, (p) => p[0]);
  const y = Int32Array.from(pairs, (p) => p[1]);
  const angle = new Int32Array(pairs.length);
  const magnitude = new Int32Array(pairs.length);
  pairs.forEach(([px, py], k) => ({ angle: angle[k], magnitude: magnitude[k] } = sim.answer(px, py)));
  return { x, y, angle, magnitude };
}

const MULTIPLY: VectorConfigInput = { gainCompensation: 'multiply' };

describe('the explain search on vectoring cores', { timeout: 300_000 }, () => {
  it('says a healthy core matches its declared model', () => {
    const s = board({}, null);
    const e = explainVectors(parseVectorConfig({}), s);
    expect(e.mode).toBe('vectoring');
    expect(e.outcome).toBe('matches-model');
    expect(e.hypotheses[0]).toMatchObject({ label: 'the declared model', fault: null, exact: s.x.length, maxDiffLsb: 0 });
    expect(e.hypotheses[0].config).toEqual(e.declared);
    expect(e.rest).toBeNull();
    expect(e.summary).toBe(`The core matches its declared model: it reproduces all ${s.x.length.toLocaleString('en-US')} answers exactly.`);
  });

  // Each defect kind of the simulated board, injected through its own --core-fault spelling.
  const defects: [string, VectorConfigInput, string, string][] = [
    ['a sign slip', {}, 'sign-slip:3', 'iteration 3 turns the wrong way'],
    ['an arctangent entry off by one', {}, 'atan-entry:2:+1', 'arctangent entry 2 is 1 LSB high'],
    ['an arctangent entry with a bit flipped', { angleFormat: 'rad', angleBits: 18 }, 'atan-entry:4:flip5', 'arctangent entry 4 has bit 5 flipped'],
    ['a stuck angle bit', {}, 'stuck-bit:angle:3:1', 'angle output bit 3 stuck at 1'],
    ['a stuck magnitude bit', { inBits: 12 }, 'stuck-bit:magnitude:6:0', 'magnitude output bit 6 stuck at 0'],
    ['a bit stuck on both outputs', {}, 'stuck-bit:both:1:1', 'output bit 1 of angle and magnitude stuck at 1'],
    ['a gain constant for the wrong iteration count', MULTIPLY, 'gain:4', 'gain constant computed for 4 iterations instead of 16'],
  ];
  for (const [name, core, spec, label] of defects) {
    it(`finds ${name} (${spec}) with every answer exact`, () => {
      const s = board(core, spec);
      const e = explainVectors(parseVectorConfig(core), s);
      const fault = parseSpelling(spec).fault!;
      expect(e.outcome).toBe('explained');
      expect(e.hypotheses[0]).toMatchObject({ label, fault, exact: s.x.length, maxDiffLsb: 0 });
      expect(e.hypotheses[0].config).toEqual(e.declared);
      expect(formatVectorFault(e.hypotheses[0].fault!)).toBe(spec);
    });
  }

  const deviations: [string, VectorConfigInput, string, string][] = [
    ['one iteration fewer', {}, 'iterations=15', '15 iterations instead of 16'],
    ['no gain compensation', MULTIPLY, 'gainCompensation=none', 'no gain compensation: the magnitude keeps the CORDIC gain'],
    ['a quarter-turn pre-rotation', {}, 'prerotation=quadrant', 'a quarter-turn pre-rotation instead of a half-turn pre-rotation'],
    ['truncated outputs', { inBits: 12 }, 'outputRounding=truncate', 'angle and magnitude truncated instead of rounded to nearest'],
  ];
  for (const [name, core, spec, label] of deviations) {
    it(`finds ${name} (${spec}) as a configuration deviation`, () => {
      const s = board(core, spec);
      const declared = parseVectorConfig(core);
      const e = explainVectors(declared, s);
      const best = e.hypotheses[0];
      expect(e.outcome).toBe('explained');
      expect(best).toMatchObject({ label, fault: null, exact: s.x.length, maxDiffLsb: 0 });
      expect(best.config).toEqual(parseVectorConfig({ ...declared, ...parseSpelling(spec).config }));
    });
  }

  it('finds a defect on top of a configuration deviation', () => {
    const core = createSimVectorCore({}, { config: { iterations: 14 }, fault: { kind: 'stuck-bit', channel: 'angle', bit: 0, value: 1 } });
    const s = board({}, null);
    s.x.forEach((x, k) => ({ angle: s.angle[k], magnitude: s.magnitude[k] } = core.answer(x, s.y[k])));
    const e = explainVectors(parseVectorConfig({}), s);
    expect(e.outcome).toBe('explained');
    expect(e.hypotheses[0]).toMatchObject({ label: '14 iterations instead of 16 and angle output bit 0 stuck at 1', fault: { kind: 'stuck-bit', channel: 'angle', bit: 0, value: 1 }, exact: s.x.length });
    expect(e.hypotheses[0].config.iterations).toBe(14);
  });

  it('calls a few damaged answers on top of a defect scattered, and measures binary angles the short way round', () => {
    const s = board({}, 'sign-slip:6');
    // The zero vector answered 65535 where the core says 0: 1 LSB off, not 65,535.
    const k = s.x.findIndex((x, i) => x === 0 && s.y[i] === 0);
    expect(s.angle[k]).toBe(0);
    s.angle[k] = 65_535;
    s.magnitude[k + 500] += 1;
    const e = explainVectors(parseVectorConfig({}), s);
    expect(e.outcome).toBe('partly-explained');
    expect(e.rest).toBe('scattered');
    expect(e.hypotheses[0]).toMatchObject({ fault: { kind: 'sign-slip', iteration: 6 }, exact: s.x.length - 2, maxDiffLsb: 1 });
  });

  it('labels hypotheses in words and refuses samples it cannot take', () => {
    const d = parseVectorConfig({});
    expect(vectorFaultLabel({ ...d, zeroVector: 'iterate' }, d, null)).toBe('the zero vector goes through the iterations instead of answering 0');
    expect(() => explainVectors(d, { x: [], y: [], angle: [], magnitude: [] })).toThrow(ExplainInputError);
    expect(() => explainVectors(d, { x: [1, 2], y: [1], angle: [0, 0], magnitude: [0, 0] })).toThrow(/differ in length/);
    expect(() => explainVectors(d, { x: [40_000], y: [0], angle: [0], magnitude: [0] })).toThrow(/sample 0: input \(40000, 0\)/);
    expect(() => explainVectors(d, { x: [1], y: [0], angle: [70_000], magnitude: [0] })).toThrow(/angle code 70000/);
    expect(() => explainVectors(d, board({}, 'sign-slip:2', 200), { shouldStop: () => true })).toThrow(ExplainStopped);
  });

  it('reads and writes every vectoring spelling the same way', () => {
    for (const spec of ['sign-slip:0', 'atan-entry:3:-2', 'atan-entry:1:flip7', 'stuck-bit:magnitude:17:0', 'gain:0', 'gain:12']) {
      expect(formatVectorFault(parseSpelling(spec).fault!)).toBe(spec);
    }
    expect(() => parseSpelling('swap')).toThrow(/not a vectoring core fault/);
  });

  it('tries every defect the simulated board can be given, spelled as the board reads it', () => {
    // The board injects through the same faulty model: each hypothesis's spelling, given to the
    // board, answers as the hypothesis does (checked on a few inputs of each).
    const config = parseVectorConfig({ inBits: 10, iterations: 8, gainCompensation: 'multiply' });
    const probes: [number, number][] = [[300, -200], [-511, 17], [0, 0], [-3, -400], [511, 511]];
    const faults = [...vectorDefectCandidates(config, Remoteness.Defect), ...vectorDeviationCandidates(config)].flatMap((c) => (c.fault ? [c.fault] : []));
    expect(new Set(faults.map((f) => f.kind))).toEqual(new Set(['sign-slip', 'atan-entry', 'stuck-bit', 'gain']));
    for (const f of faults) {
      const board = createSimVectorCore(config, parseVectorCoreFault(formatVectorFault(f)));
      const model = createVectorFaultyModel(config, f);
      for (const [x, y] of probes) expect(board.answer(x, y), formatVectorFault(f)).toEqual(model.answer(x, y));
    }
  });
});
