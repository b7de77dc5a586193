// A vectoring core's hypotheses in words, for people: "iteration 5 turns the wrong way",
// "no gain compensation instead of a multiply". The rotation words are in labels.ts.
import type { VectorConfig } from '../vectoring';
import type { VectorFault } from './vector-fault';

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

const PREROTATION = { none: 'no pre-rotation', 'half-turn': 'a half-turn pre-rotation', quadrant: 'a quarter-turn pre-rotation' } as const;

function keyWords(key: keyof VectorConfig, c: VectorConfig, d: VectorConfig): string {
  switch (key) {
    case 'iterations':
      return `${plural(c.iterations, 'iteration')} instead of ${d.iterations}`;
    case 'guardBits':
      return `${plural(c.guardBits, 'guard bit')} instead of ${d.guardBits}`;
    case 'zGuardBits':
      return `${plural(c.zGuardBits, 'angle guard bit')} instead of ${d.zGuardBits}`;
    case 'shiftRounding':
      return c.shiftRounding === 'nearest' ? 'shifted terms rounded to nearest instead of floored' : 'shifted terms floored instead of rounded to nearest';
    case 'outputRounding':
      return c.outputRounding === 'nearest' ? 'angle and magnitude rounded to nearest instead of truncated' : 'angle and magnitude truncated instead of rounded to nearest';
    case 'prerotation':
      return `${PREROTATION[c.prerotation]} instead of ${PREROTATION[d.prerotation]}`;
    case 'gainCompensation':
      return c.gainCompensation === 'none' ? 'no gain compensation: the magnitude keeps the CORDIC gain' : 'a gain-compensating multiply the declared core does not have';
    case 'gainBits':
      return `a ${c.gainBits}-bit gain constant instead of ${d.gainBits} bits`;
    case 'gainRounding':
      return c.gainRounding === 'nearest' ? 'gain constant rounded to nearest instead of truncated' : 'gain constant truncated instead of rounded to nearest';
    case 'zeroVector':
      return c.zeroVector === 'iterate' ? 'the zero vector goes through the iterations instead of answering 0' : 'the zero vector answers 0 at once instead of going through the iterations';
    default:
      return `${key} ${String(c[key])} instead of ${String(d[key])}`;
  }
}

/** One vectoring defect in words. */
export function vectorFaultWords(f: VectorFault, config: VectorConfig): string {
  switch (f.kind) {
    case 'sign-slip':
      return `iteration ${f.iteration} turns the wrong way`;
    case 'atan-entry':
      if ('flipBit' in f) return `arctangent entry ${f.iteration} has bit ${f.flipBit} flipped`;
      return `arctangent entry ${f.iteration} is ${Math.abs(f.delta)} LSB ${f.delta > 0 ? 'high' : 'low'}`;
    case 'stuck-bit':
      return f.channel === 'both' ? `output bit ${f.bit} of angle and magnitude stuck at ${f.value}` : `${f.channel} output bit ${f.bit} stuck at ${f.value}`;
    case 'gain':
      return f.iterations === 0 ? 'the gain-compensating multiply left out' : `gain constant computed for ${plural(f.iterations, 'iteration')} instead of ${config.iterations}`;
  }
}

/**
 * A vectoring hypothesis in words: how its configuration differs from the declared one, and its
 * defect; "the declared model" when it is neither.
 */
export function vectorFaultLabel(config: VectorConfig, declared: VectorConfig, fault: VectorFault | null): string {
  const keys = (Object.keys(declared) as (keyof VectorConfig)[]).filter((k) => config[k] !== declared[k]);
  const parts = keys.map((k) => keyWords(k, config, declared));
  if (fault) parts.push(vectorFaultWords(fault, config));
  if (parts.length === 0) return 'the declared model';
  return parts.length === 1 ? parts[0] : `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}`;
}
