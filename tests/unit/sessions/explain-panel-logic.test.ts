import { describe, expect, it } from 'vitest';
import { configChanges, equivalentWords, outcomeHeading, reproducedWords } from '../../../src/components/explanation-words';
import { diffCurves, RAW_LIMIT } from '../../../src/features/sessions/explain/diff-curves';
import { alignTraces } from '../../../src/features/sessions/explain/trace-rows';
import { createCordicModel, parseModelConfig, traceCordic, type CordicTrace } from '../../../shared/numeric';

// The Explain panel's logic apart from React: where two traces of one code part, the difference
// curves and the codes offered for tracing, and the words the pages use.
const config = parseModelConfig({});
const model = createCordicModel(config);
const clone = (t: CordicTrace): CordicTrace => structuredClone(t);

describe('alignTraces', () => {
  const trace = traceCordic(model, 5_000);

  it('finds no parting for the same trace', () => {
    const { rows, parting } = alignTraces(trace, clone(trace));
    expect(parting).toBeNull();
    expect(rows.map((r) => r.key)).toEqual(['read', 'fold', 'start', ...trace.steps.map((s) => `step-${s.i}`), 'end', 'output']);
  });

  it('marks the iteration that turned the other way, and an output-only change at the output', () => {
    const slipped = clone(trace);
    slipped.steps[5] = { ...slipped.steps[5], d: slipped.steps[5].d === 1 ? -1 : 1 };
    const a = alignTraces(trace, slipped);
    expect(a.rows[a.parting!].stage).toBe('iteration 5');

    const stuck = clone(trace);
    stuck.cos = trace.cos + 1;
    const b = alignTraces(trace, stuck);
    expect(b.rows[b.parting!].key).toBe('output');
  });

  it('lines up a hypothesis with fewer iterations, parting at the first iteration it lacks', () => {
    // With 16 fraction bits of x the gain-compensated start value rounds to the same code for 12
    // and 16 iterations (the model's own tables), so the first 12 iterations agree.
    const fewer = traceCordic(createCordicModel({ iterations: 12 }), 5_000);
    expect(fewer.x0).toBe(trace.x0);
    const { rows, parting } = alignTraces(trace, fewer);
    expect(rows.filter((r) => r.key.startsWith('step-') && !r.b).map((r) => r.key)).toEqual(['step-12', 'step-13', 'step-14', 'step-15']);
    expect(rows[parting!].key).toBe('step-12');
  });
});

describe('diffCurves', () => {
  const codes = Array.from({ length: 64 }, (_, i) => i * 1024);
  const answers = () => {
    const cos = new Int32Array(codes.length);
    const sin = new Int32Array(codes.length);
    model.evaluateInto(codes, cos, sin);
    return { codes, cos, sin };
  };

  it('is zero against the model the board follows, and lists the codes it does not reproduce', () => {
    const s = answers();
    s.cos[3] += 2;
    s.sin[40] -= 1;
    const c = diffCurves(config, s, model, model);
    expect(c.hypothesis[0].length).toBe(codes.length);
    expect(Array.from(c.hypothesis[1] as Float64Array).filter((v) => v !== 0)).toEqual([2]);
    expect(Array.from(c.hypothesis[2] as Float64Array).filter((v) => v !== 0)).toEqual([-1]);
    expect(c.unexplainedCodes).toEqual([3 * 1024, 40 * 1024]);
    expect(c.partingCodes).toEqual([]);
  });

  it('tells board − hypothesis from board − declared, and offers the codes where the two models differ', () => {
    const s = answers();
    for (let i = 0; i < codes.length; i++) s.cos[i] |= 1;
    const stuck = { evaluate: (code: number) => ({ ...model.evaluate(code), cos: model.evaluate(code).cos | 1 }) };
    const c = diffCurves(config, s, stuck, model);
    expect(Array.from(c.hypothesis[1] as Float64Array).every((v) => v === 0)).toBe(true);
    const off = codes.filter((code) => (model.evaluate(code).cos & 1) === 0);
    expect(Array.from(c.declared[1] as Float64Array).filter((v) => v === 1)).toHaveLength(off.length);
    expect(c.partingCodes).toEqual(off.slice(0, 24));
    expect(c.unexplainedCodes).toEqual([]);
  });

  it('keeps each column’s lowest and highest difference past the raw limit', () => {
    const n = RAW_LIMIT + 1;
    const many = { codes: Array.from({ length: n }, (_, i) => i), cos: new Int32Array(n), sin: new Int32Array(n) };
    model.evaluateInto(many.codes, many.cos, many.sin);
    many.cos[10] += 5;
    many.cos[11] -= 3;
    const c = diffCurves(config, many, model, model, 8);
    expect(c.hypothesis[0].length).toBe(16);
    expect(Math.max(...(c.hypothesis[1] as Float64Array))).toBe(5);
    expect(Math.min(...(c.hypothesis[1] as Float64Array))).toBe(-3);
    expect((c.hypothesis[1] as Float64Array).slice(0, 2)).toEqual(Float64Array.from([-3, 5]));
  });
});

describe('explanation words', () => {
  it('words the outcomes, the counts and the configuration changes', () => {
    expect(outcomeHeading({ outcome: 'matches-model', rest: null })).toBe('The core matches its model');
    expect(outcomeHeading({ outcome: 'partly-explained', rest: 'scattered' })).toMatch(/scattered/);
    expect(outcomeHeading({ outcome: 'unexplained', rest: null })).toBe('Not explained by any single hypothesis');
    expect(reproducedWords({ exact: 65_536, maxDiffLsb: 0 }, 65_536)).toBe('reproduces 65,536 of 65,536 answers exactly');
    expect(reproducedWords({ exact: 65_000, maxDiffLsb: 2 }, 65_536)).toBe('reproduces 65,000 of 65,536 answers exactly; largest difference left 2 LSB');
    expect(equivalentWords([])).toBe('');
    const refs = ['a', 'b', 'c', 'd', 'e'].map((label) => ({ label, config, fault: null }));
    expect(equivalentWords(refs.slice(0, 2))).toBe('same answers as: a; b');
    expect(equivalentWords(refs)).toBe('same answers as: a; b; c and 2 more');
    expect(configChanges(config, parseModelConfig({ iterations: 12, fold: false }))).toEqual(['iterations 16 → 12', 'fold true → false']);
  });
});
