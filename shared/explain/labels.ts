// Hypotheses in words, for people: "iteration 5 turns the wrong way", "15 iterations instead of 16".
import type { ModelConfig } from '../numeric';
import type { Fault } from './fault';

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;
const signed = (n: number) => (n > 0 ? `+${n}` : String(n));

function keyWords(key: keyof ModelConfig, config: ModelConfig, declared: ModelConfig): string {
  switch (key) {
    case 'iterations':
      return `${plural(config.iterations, 'iteration')} instead of ${declared.iterations}`;
    case 'guardBits':
      return `${plural(config.guardBits, 'guard bit')} instead of ${declared.guardBits}`;
    case 'zGuardBits':
      return `${plural(config.zGuardBits, 'angle guard bit')} instead of ${declared.zGuardBits}`;
    case 'shiftRounding':
      return config.shiftRounding === 'nearest' ? 'shifted terms rounded to nearest instead of floored' : 'shifted terms floored instead of rounded to nearest';
    case 'outputRounding':
      return config.outputRounding === 'nearest' ? 'outputs rounded to nearest instead of truncated' : 'outputs truncated instead of rounded to nearest';
    case 'fold':
      return config.fold ? 'quadrant folding the declared core does not have' : 'no quadrant folding';
    default:
      return `${key} ${String(config[key])} instead of ${String(declared[key])}`;
  }
}

/** One defect in words. */
export function faultWords(f: Fault, config: ModelConfig): string {
  switch (f.kind) {
    case 'sign-slip':
      return `iteration ${f.iteration} turns the wrong way`;
    case 'atan-entry':
      if ('flipBit' in f) return `arctangent entry ${f.iteration} has bit ${f.flipBit} flipped`;
      return `arctangent entry ${f.iteration} is ${Math.abs(f.delta)} LSB ${f.delta > 0 ? 'high' : 'low'}`;
    case 'shift':
      return `iteration ${f.iteration} shifts by ${f.iteration + f.by} instead of ${f.iteration}`;
    case 'logical-shift':
      return `the ${f.register} shifter fills with zeros instead of the sign`;
    case 'stuck-bit':
      return f.channel === 'both' ? `output bit ${f.bit} of cos and sin stuck at ${f.value}` : `${f.channel} output bit ${f.bit} stuck at ${f.value}`;
    case 'swap':
      return 'cos and sin swapped';
    case 'negate':
      return `${f.channel} output negated`;
    case 'wrap':
      return 'outputs wrap around instead of saturating';
    case 'angle-offset':
      return `angle register off by ${signed(f.codes)} ${Math.abs(f.codes) === 1 ? 'code' : 'codes'}`;
    case 'angle-bit':
      return `angle code bit ${f.bit} stuck at ${f.value}`;
    case 'gain':
      return f.iterations === 0 ? 'no gain compensation (start value 1.0)' : `start value computed for ${plural(f.iterations, 'iteration')} instead of ${config.iterations}`;
    case 'blocking-update':
      return 'y is computed from the already updated x';
    case 'zero-direction':
      return 'z = 0 turns the negative way';
    case 'fold-sign':
      return 'folded angles are not negated back';
  }
}

/**
 * A hypothesis in words: how its configuration differs from the declared one, and its defect;
 * "the declared model" when it is neither.
 */
export function faultLabel(config: ModelConfig, declared: ModelConfig, fault: Fault | null): string {
  const keys = (Object.keys(declared) as (keyof ModelConfig)[]).filter((k) => config[k] !== declared[k]);
  const parts = keys.map((k) => keyWords(k, config, declared));
  if (fault) parts.push(faultWords(fault, config));
  if (parts.length === 0) return 'the declared model';
  return parts.length === 1 ? parts[0] : `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}`;
}
