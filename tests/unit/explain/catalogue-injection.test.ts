// Every catalogue entry, injected into the simulated board's core the way `--core-fault` does, is
// found again by the explain search: on an exhaustive run and on a 2,000-code seeded random one.
import { describe, expect, it } from 'vitest';
import { createSimCore, parseCoreFault } from '../../../mock-device/faulty-core';
import { createFaultyModel, explain, type Explanation } from '../../../shared/explain';
import { seededRandom } from '../../../shared/explain/screen';
import { parseModelConfig, type ModelConfig, type ModelConfigInput } from '../../../shared/numeric';

const ENTRIES: [string, ModelConfigInput?][] = [
  ['sign-slip:0'],
  ['sign-slip:5'],
  ['sign-slip:14'],
  ['atan-entry:2:+1'],
  ['atan-entry:6:-2'],
  ['atan-entry:4:flip3'],
  ['shift:3:+1'],
  ['shift:9:-1'],
  ['logical-shift:x'],
  ['logical-shift:y'],
  ['stuck-bit:cos:0:1'],
  ['stuck-bit:sin:14:0'],
  ['stuck-bit:both:3:1'],
  ['stuck:0'], // the demo data's seeded regression, in the board's old spelling
  ['swap'],
  ['negate:cos'],
  ['negate:sin'],
  ['wrap', { outFrac: 15 }], // only a core whose format cannot hold +1.0 ever saturates
  ['angle-offset:+1'],
  ['angle-offset:-37'],
  ['angle-offset:+4096'],
  ['angle-bit:0:1'],
  ['angle-bit:13:0'],
  ['angle-bit:2:1', { angleFormat: 'rad', angleBits: 16, angleFrac: 12 }],
  ['gain:2'],
  ['gain:0'],
  ['gain:12'],
  ['blocking-update'],
  ['zero-direction'],
  ['fold-sign'],
  ['iterations=14'],
  ['iterations=17'],
  ['guardBits=0'],
  ['zGuardBits=0'],
  ['shiftRounding=nearest'],
  ['outputRounding=truncate'],
  ['fold=false'],
];

function board(spec: string, core: ModelConfigInput, codes: Float64Array) {
  const sim = createSimCore(core, parseCoreFault(spec));
  const cos = new Int32Array(codes.length);
  const sin = new Int32Array(codes.length);
  codes.forEach((c, k) => ({ cos: cos[k], sin: sin[k] } = sim.evaluate(c)));
  return { angle: codes, cos, sin };
}

/** The injected deviation or defect is the explanation, or one of its equivalents, or gives the same answers on every code. */
function expectExplainedBy(e: Explanation, spec: string, declared: ModelConfig) {
  const injected = parseCoreFault(spec);
  const config = parseModelConfig({ ...declared, ...injected.config });
  const best = e.hypotheses[0];
  expect(best.exact, `${spec}: ${e.summary}`).toBe(e.answered);
  expect(['explained', 'matches-model']).toContain(e.outcome);
  const named = [best, ...best.equivalent].some((h) => JSON.stringify(h.config) === JSON.stringify(config) && JSON.stringify(h.fault) === JSON.stringify(injected.fault));
  if (named) return;
  // Otherwise the test shows the two give identical answers on every code of the format.
  const all = Float64Array.from({ length: 2 ** declared.angleBits }, (_, i) => i + lowest(declared));
  const a = board(spec, declared, all);
  const m = createFaultyModel(best.config, best.fault);
  const cos = new Int32Array(all.length);
  const sin = new Int32Array(all.length);
  m.evaluateInto(all, cos, sin);
  expect(cos, `${spec} named as ${best.label}`).toEqual(a.cos);
  expect(sin, `${spec} named as ${best.label}`).toEqual(a.sin);
}

/** The lowest angle code: 0 for `turn`, −2^(bits−1) for the signed `rad`. */
const lowest = (c: ModelConfig) => (c.angleFormat === 'turn' ? 0 : -(2 ** (c.angleBits - 1)));
const exhaustive = (c: ModelConfig) => Float64Array.from({ length: 65_536 }, (_, i) => i + lowest(c));
const random = (c: ModelConfig) => {
  const r = seededRandom(2026);
  return Float64Array.from({ length: 2000 }, () => Math.floor(r() * 65_536) + lowest(c));
};

describe('every catalogue entry injected into the simulated board is explained', { timeout: 600_000 }, () => {
  for (const [spec, core = {}] of ENTRIES) {
    it(`${spec}${Object.keys(core).length ? ` on ${JSON.stringify(core)}` : ''}`, () => {
      const declared = parseModelConfig(core);
      for (const codes of [exhaustive(declared), random(declared)]) expectExplainedBy(explain(declared, board(spec, core, codes)), spec, declared);
    });
  }
});
