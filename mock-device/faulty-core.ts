// The simulated board's core: the shared reference model when healthy; with a fault, the same
// iteration with one deliberate defect, so the scorer can show each fault's signature.
import { buildCordicTables, createCordicModel, outputCodeRange, parseModelConfig, type ModelConfig, type ModelConfigInput } from '../shared/numeric';
import { readAngle } from '../shared/numeric/cordic-model';

/**
 * `gain`: the start value for the wrong iteration count (K of 2 iterations, about 4% high); `fold`: no quadrant folding;
 * `sign:K`: iteration K turns the wrong way; `stuck:B`: output bit B stuck at 1.
 */
export type CoreFault = { kind: 'gain' } | { kind: 'fold' } | { kind: 'sign'; iteration: number } | { kind: 'stuck'; bit: number };

export function parseCoreFault(text: string): CoreFault {
  const [name, arg] = text.split(':');
  if (name === 'gain' && arg === undefined) return { kind: 'gain' };
  if (name === 'fold' && arg === undefined) return { kind: 'fold' };
  const n = Number(arg);
  if (name === 'sign' && Number.isInteger(n) && n >= 0) return { kind: 'sign', iteration: n };
  if (name === 'stuck' && Number.isInteger(n) && n >= 0) return { kind: 'stuck', bit: n };
  throw new Error(`--core-fault must be gain, fold, sign:K or stuck:B, got "${text}"`);
}

export interface SimCore {
  config: ModelConfig;
  evaluate(code: number): { cos: number; sin: number };
}

export function createSimCore(input: ModelConfigInput, fault?: CoreFault): SimCore {
  const config = parseModelConfig(input);
  if (!fault) return { config, evaluate: createCordicModel(config).evaluate };
  if (fault.kind === 'fold') {
    const model = createCordicModel({ ...config, fold: false });
    return { config, evaluate: model.evaluate };
  }
  const { min, max } = outputCodeRange(config);
  if (fault.kind === 'stuck') {
    if (fault.bit >= config.outBits) throw new Error(`--core-fault stuck:${fault.bit}: the output has only ${config.outBits} bits`);
    const model = createCordicModel(config);
    const mask = 2 ** fault.bit;
    const width = 2 ** config.outBits;
    const stick = (v: number) => {
      const u = v < 0 ? v + width : v;
      const s = Math.floor(u / mask) % 2 === 1 ? u : u + mask;
      return s > max ? s - width : s;
    };
    return { config, evaluate: (c) => ({ cos: stick(model.evaluate(c).cos), sin: stick(model.evaluate(c).sin) }) };
  }
  // gain or sign: rerun the iteration with the defect.
  if (fault.kind === 'sign' && fault.iteration >= config.iterations) {
    throw new Error(`--core-fault sign:${fault.iteration}: the core has only ${config.iterations} iterations`);
  }
  const tables = buildCordicTables(config);
  const x0 = fault.kind === 'gain' ? buildCordicTables({ ...config, iterations: Math.min(2, config.iterations) }).x0 : tables.x0;
  const badIteration = fault.kind === 'sign' ? fault.iteration : -1;
  const g = 2 ** config.guardBits;
  const bias = config.outputRounding === 'nearest' && config.guardBits > 0 ? g / 2 : 0;
  const out = (v: number) => Math.min(max, Math.max(min, Math.floor((v + bias) / g)));
  return {
    config,
    evaluate(code) {
      let z = readAngle(config, tables, code);
      let negate = false;
      if (config.fold && z > tables.zQuarter) [z, negate] = [z - tables.zHalf, true];
      else if (config.fold && z < -tables.zQuarter) [z, negate] = [z + tables.zHalf, true];
      let x = x0;
      let y = 0;
      for (let i = 0; i < config.iterations; i++) {
        const p = tables.pow2[i];
        const h = config.shiftRounding === 'nearest' && i > 0 ? tables.pow2[i - 1] : 0;
        const sx = Math.floor((x + h) / p);
        const sy = Math.floor((y + h) / p);
        let d = z >= 0 ? 1 : -1;
        if (i === badIteration) d = -d;
        [x, y, z] = [x - d * sy, y + d * sx, z - d * tables.atan[i]];
      }
      if (negate) [x, y] = [0 - x, 0 - y];
      return { cos: out(x), sin: out(y) };
    },
  };
}
