import { describe, expect, it } from 'vitest';
import { createSimCore, parseCoreFault } from '../../../mock-device/faulty-core';
import { explain, ExplainInputError, ExplainStopped, type ExplainSamples } from '../../../shared/explain';
import { seededRandom } from '../../../shared/explain/screen';
import { parseModelConfig, type ModelConfigInput } from '../../../shared/numeric';

function board(core: ModelConfigInput, spec: string | null, codes: Float64Array): ExplainSamples & { cos: Int32Array; sin: Int32Array } {
  const sim = createSimCore(core, spec ? parseCoreFault(spec) : undefined);
  const cos = new Int32Array(codes.length);
  const sin = new Int32Array(codes.length);
  codes.forEach((c, k) => ({ cos: cos[k], sin: sin[k] } = sim.evaluate(c)));
  return { angle: codes, cos, sin };
}

const every = (bits: number, lo = 0) => Float64Array.from({ length: 2 ** bits }, (_, i) => lo + i);
function randomCodes(count: number, bits: number, seed: number, lo = 0): Float64Array {
  const r = seededRandom(seed);
  return Float64Array.from({ length: count }, () => lo + Math.floor(r() * 2 ** bits));
}

describe('the explain search', { timeout: 300_000 }, () => {
  it('says a healthy core matches its declared model', () => {
    const e = explain(parseModelConfig({}), board({}, null, every(16)));
    expect(e.outcome).toBe('matches-model');
    expect(e.hypotheses[0]).toMatchObject({ label: 'the declared model', fault: null, exact: 65_536, maxDiffLsb: 0 });
    expect(e.hypotheses[0].config).toEqual(e.declared);
    expect(e.rest).toBeNull();
    expect(e.summary).toBe('The core matches its declared model: it reproduces all 65,536 answers exactly.');
  });

  const cores: [string, ModelConfigInput, string, Float64Array][] = [
    ['a 20-bit turn core', { angleBits: 20, iterations: 20, guardBits: 3 }, 'iterations=18', randomCodes(6000, 20, 20)],
    ['a rad Q4.12 core', { angleFormat: 'rad', angleBits: 16, angleFrac: 12 }, 'guardBits=1', every(16, -32_768)],
    ['a 24-bit output core', { outBits: 24, outFrac: 22, iterations: 24, guardBits: 3 }, 'shiftRounding=nearest', every(16)],
    ['a rad Q4.12 core (angle guard bits)', { angleFormat: 'rad', angleBits: 16, angleFrac: 12 }, 'zGuardBits=0', every(16, -32_768)],
  ];
  for (const [name, core, spec, codes] of cores) {
    it(`finds a configuration deviation on ${name}`, () => {
      const declared = parseModelConfig(core);
      const e = explain(declared, board(core, spec, codes));
      const [key, value] = spec.split('=');
      const best = e.hypotheses[0];
      expect(e.outcome).toBe('explained');
      expect(best.exact).toBe(codes.length);
      expect(best.fault).toBeNull();
      // The configuration differs from the declared one in that key alone.
      expect(best.config).toEqual({ ...declared, [key]: Number.isNaN(Number(value)) ? value : Number(value) });
      expect(e.summary).toContain(`reproduces ${codes.length.toLocaleString('en-US')} of ${codes.length.toLocaleString('en-US')} answers exactly`);
    });
  }

  it('finds a defect on top of a configuration deviation', () => {
    // 14 iterations instead of 16 and cos bit 0 stuck at 1: the deviation alone reproduces the
    // answers whose bit 0 was already 1, so it beats the declared model and its defects are tried.
    const sim = createSimCore({}, { config: { iterations: 14 }, fault: { kind: 'stuck-bit', channel: 'cos', bit: 0, value: 1 } });
    const codes = every(16);
    const cos = new Int32Array(codes.length);
    const sin = new Int32Array(codes.length);
    codes.forEach((c, k) => ({ cos: cos[k], sin: sin[k] } = sim.evaluate(c)));
    const e = explain(parseModelConfig({}), { angle: codes, cos, sin });
    expect(e.outcome).toBe('explained');
    expect(e.hypotheses[0]).toMatchObject({
      label: '14 iterations instead of 16 and cos output bit 0 stuck at 1',
      config: { ...e.declared, iterations: 14 },
      fault: { kind: 'stuck-bit', channel: 'cos', bit: 0, value: 1 },
      exact: 65_536,
    });
  });

  it('ranks a defect first when a few answers were damaged on the line, and calls the rest scattered', () => {
    const s = board({}, 'sign-slip:5', every(16));
    // Bit errors that passed the frame check: a few answers with one wrong bit each.
    const r = seededRandom(7);
    const hit = new Set<number>();
    while (hit.size < 6) hit.add(Math.floor(r() * 65_536));
    for (const k of hit) s.cos[k] ^= 1 << Math.floor(r() * 14);
    const e = explain(parseModelConfig({}), s);
    expect(e.hypotheses[0]).toMatchObject({ label: 'iteration 5 turns the wrong way', fault: { kind: 'sign-slip', iteration: 5 }, exact: 65_536 - 6 });
    expect(e.outcome).toBe('partly-explained');
    expect(e.rest).toBe('scattered');
    expect(e.summary).toMatch(/No single hypothesis reproduces every answer\. The best, iteration 5 turns the wrong way, reproduces 65,530 of 65,536 exactly .*the rest looks scattered/);
  });

  it('says no single hypothesis claims every answer when two defects are present, and calls a dominant one\'s rest structured', () => {
    // One defect on top of another: a wrong arctangent entry, then an output bit stuck.
    const s = board({}, 'atan-entry:9:+2', every(16));
    for (let k = 0; k < s.cos.length; k++) if (k % 4096 < 64) s.cos[k] |= 1 << 4; // a stuck bit, seen in a few runs of codes
    const e = explain(parseModelConfig({}), s);
    expect(e.hypotheses.every((h) => h.exact < e.answered)).toBe(true);
    // The arctangent entry still accounts for most answers; what it leaves comes in runs.
    expect(e.hypotheses[0].fault).toEqual({ kind: 'atan-entry', iteration: 9, delta: 2 });
    expect(e.outcome).toBe('partly-explained');
    expect(e.rest).toBe('structured');
    expect(e.summary).toMatch(/^No single hypothesis reproduces every answer\. .*the rest looks structured, as from a second defect\.$/);

    // Two defects that each touch every answer: nothing comes close.
    const both = board({}, 'sign-slip:5', every(16));
    for (let k = 0; k < both.cos.length; k++) both.cos[k] |= 1;
    const u = explain(parseModelConfig({}), both);
    expect(u.outcome).toBe('unexplained');
    expect(u.hypotheses[0].exact).toBeLessThan(u.answered);
    expect(u.rest).toBeNull();
    expect(u.summary).toMatch(/^Nothing in the catalogue explains the answers: the best, .+, reproduces only [\d,]+ of 65,536 exactly/);
  });

  it('lists hypotheses with identical answers on every answered code as one', () => {
    // Arctangent entry 1 is 19,344 z units (docs/model.md's table): even, so one LSB high and its
    // bit 0 flipped are the same table, and the two are one explanation.
    const e = explain(parseModelConfig({}), board({}, 'atan-entry:1:+1', randomCodes(2000, 16, 3)));
    const best = e.hypotheses[0];
    expect(best).toMatchObject({ label: 'arctangent entry 1 is 1 LSB high', exact: 2000 });
    expect(best.equivalent).toContainEqual({ label: 'arctangent entry 1 has bit 0 flipped', config: e.declared, fault: { kind: 'atan-entry', iteration: 1, flipBit: 0 } });
    expect(e.summary).toMatch(/other hypothes[ie]s? gives? the same answers on every code/);
    for (const h of e.hypotheses.slice(1)) expect(h.exact).toBeLessThan(2000);
    expect(e.hypotheses.length).toBeLessThanOrEqual(10);
  });

  it('reports progress and stops when asked', () => {
    const s = board({}, 'sign-slip:3', every(12));
    const seen: [number, number][] = [];
    explain(parseModelConfig({}), s, { onProgress: (d, t) => seen.push([d, t]) });
    expect(seen.length).toBeGreaterThan(2);
    expect(seen.every(([d, t]) => d >= 0 && d <= t)).toBe(true);
    expect(seen.at(-1)![0]).toBe(seen.at(-1)![1]);
    let asked = 0;
    expect(() => explain(parseModelConfig({}), s, { shouldStop: () => ++asked > 3 })).toThrow(ExplainStopped);
  });

  it('refuses samples it cannot take, naming the sample', () => {
    const c = parseModelConfig({});
    expect(() => explain(c, { angle: [], cos: [], sin: [] })).toThrow(ExplainInputError);
    expect(() => explain(c, { angle: [1, 2], cos: [1], sin: [1, 2] })).toThrow(/differ in length/);
    expect(() => explain(c, { angle: [0, 65_536], cos: [1, 1], sin: [1, 1] })).toThrow(/sample 1: angle code 65536 is not an integer 0\.\.65535/);
  });
});
