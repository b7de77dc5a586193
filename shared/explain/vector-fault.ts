// The defects a vectoring core can have and their one-line spellings, used both to inject a defect
// into the simulated vectoring board (`--core-fault`) and to name what the explain search found
// (docs/explain.md "Vectoring cores"). The parameter names are part of the explain JSON.
import { ModelConfigError, parseVectorConfig, type VectorConfig } from '../vectoring';
import { FaultError } from './fault';

/** One defect of a vectoring core. */
export type VectorFault =
  /** Iteration `iteration` turns the wrong way (x, y and z alike). */
  | { kind: 'sign-slip'; iteration: number }
  /** The arctangent table entry `iteration` off by `delta` z units. */
  | { kind: 'atan-entry'; iteration: number; delta: number }
  /** The arctangent table entry `iteration` with bit `flipBit` flipped. */
  | { kind: 'atan-entry'; iteration: number; flipBit: number }
  /** An output bit stuck at 0 or 1, on the angle, the magnitude or both. */
  | { kind: 'stuck-bit'; channel: 'angle' | 'magnitude' | 'both'; bit: number; value: 0 | 1 }
  /** The gain-compensating constant of `iterations` iterations; 0: no compensation at all. */
  | { kind: 'gain'; iterations: number };

/** Configuration keys a vectoring RTL has differently, and/or one defect: what `--core-fault` injects. */
export interface VectorDeviation {
  config: Partial<VectorConfig>;
  fault: VectorFault | null;
}

/** Configuration keys a vectoring RTL can get wrong without changing its ports. */
export const VECTOR_DEVIATION_KEYS = ['iterations', 'guardBits', 'zGuardBits', 'shiftRounding', 'outputRounding', 'prerotation', 'gainCompensation', 'gainBits', 'gainRounding', 'zeroVector'] as const;
export type VectorDeviationKey = (typeof VECTOR_DEVIATION_KEYS)[number];

export const VECTOR_FAULT_SPELLINGS = ['sign-slip:K', 'atan-entry:K:±D', 'atan-entry:K:flipB', 'stuck-bit:angle|magnitude|both:B:0|1', 'gain', 'gain:M'] as const;

const UINT = /^\d+$/;
const SINT = /^[+-]?\d+$/;

/**
 * Reads a vectoring core's fault: a defect (VECTOR_FAULT_SPELLINGS; `sign:K` and `stuck:B` as on
 * the rotating board; `gain` alone is a core that skips its compensating multiply) or one
 * deviation `key=value` (`iterations=15`, `gainCompensation=none`, …). The value is checked when
 * the deviation meets a core (createVectorFaultyModel, parseVectorConfig).
 * @throws FaultError naming the spelling and what is wrong
 */
export function parseVectorCoreFault(text: string): VectorDeviation {
  const whole = text.trim();
  const fail = (why: string): never => {
    throw new FaultError(`"${whole}": ${why}`);
  };
  const eq = whole.indexOf('=');
  if (eq > 0) {
    const key = whole.slice(0, eq);
    const raw = whole.slice(eq + 1);
    if (!(VECTOR_DEVIATION_KEYS as readonly string[]).includes(key)) fail(`${key} is not a key a vectoring core can deviate in (${VECTOR_DEVIATION_KEYS.join(', ')})`);
    const value: unknown = SINT.test(raw) ? Number(raw) : raw;
    return { config: { [key]: value } as Partial<VectorConfig>, fault: null };
  }
  const [name, ...args] = whole.split(':');
  const arity = (n: number) => args.length === n || fail(`${name} takes ${n} parameter${n === 1 ? '' : 's'}`);
  const uint = (t: string, what: string) => (UINT.test(t) ? Number(t) : fail(`${what} must be a whole number ≥ 0`));
  const fault = (f: VectorFault): VectorDeviation => ({ config: {}, fault: f });
  switch (name) {
    case 'sign':
    case 'sign-slip':
      arity(1);
      return fault({ kind: 'sign-slip', iteration: uint(args[0], 'the iteration') });
    case 'atan-entry': {
      arity(2);
      const iteration = uint(args[0], 'the iteration');
      if (args[1].startsWith('flip')) return fault({ kind: 'atan-entry', iteration, flipBit: uint(args[1].slice(4), 'the flipped bit') });
      if (!SINT.test(args[1]) || Number(args[1]) === 0) fail('the delta must be a non-zero integer such as +1 or -2');
      return fault({ kind: 'atan-entry', iteration, delta: Number(args[1]) });
    }
    case 'stuck':
      arity(1);
      return fault({ kind: 'stuck-bit', channel: 'both', bit: uint(args[0], 'the bit'), value: 1 });
    case 'stuck-bit': {
      arity(3);
      const channel = args[0];
      if (channel !== 'angle' && channel !== 'magnitude' && channel !== 'both') fail('the channel must be angle, magnitude or both');
      if (args[2] !== '0' && args[2] !== '1') fail('the value must be 0 or 1');
      return fault({ kind: 'stuck-bit', channel: channel as 'angle' | 'magnitude' | 'both', bit: uint(args[1], 'the bit'), value: Number(args[2]) as 0 | 1 });
    }
    case 'gain':
      if (args.length === 0) return fault({ kind: 'gain', iterations: 0 });
      arity(1);
      return fault({ kind: 'gain', iterations: uint(args[0], 'the iteration count') });
    default:
      return fail(`not a vectoring core fault; known: ${VECTOR_FAULT_SPELLINGS.join(', ')}, or key=value (${VECTOR_DEVIATION_KEYS.join(', ')})`);
  }
}

/** The spelling parseVectorCoreFault reads back to the same defect. */
export function formatVectorFault(f: VectorFault): string {
  switch (f.kind) {
    case 'sign-slip':
      return `sign-slip:${f.iteration}`;
    case 'atan-entry':
      return 'flipBit' in f ? `atan-entry:${f.iteration}:flip${f.flipBit}` : `atan-entry:${f.iteration}:${f.delta > 0 ? `+${f.delta}` : f.delta}`;
    case 'stuck-bit':
      return `stuck-bit:${f.channel}:${f.bit}:${f.value}`;
    case 'gain':
      return `gain:${f.iterations}`;
  }
}

/**
 * Whether the defect fits the core (an iteration or a bit it has, a constant it multiplies by).
 * @throws FaultError saying why not
 */
export function checkVectorFault(c: VectorConfig, f: VectorFault): void {
  const bad = (why: string): never => {
    throw new FaultError(why);
  };
  if ((f.kind === 'sign-slip' || f.kind === 'atan-entry') && f.iteration >= c.iterations) bad(`the core has iterations 0..${c.iterations - 1}, not ${f.iteration}`);
  if (f.kind === 'atan-entry' && 'flipBit' in f && f.flipBit > 40) bad(`the arctangent entries have no bit ${f.flipBit}`);
  if (f.kind === 'stuck-bit') {
    const width = f.channel === 'angle' ? c.angleBits : f.channel === 'magnitude' ? c.magBits : Math.min(c.angleBits, c.magBits);
    if (f.bit >= width) bad(`the ${f.channel === 'both' ? 'narrower output' : f.channel} has bits 0..${width - 1}, not ${f.bit}`);
  }
  if (f.kind === 'gain' && c.gainCompensation === 'none') bad('the declared core has no gain compensation to get wrong (declare gainCompensation "multiply", or deviate with gainCompensation=multiply)');
}

/**
 * The declared configuration with the deviation's keys applied.
 * @throws FaultError naming the key when the result is not a valid vectoring configuration
 */
export function applyVectorDeviation(declared: VectorConfig, config: Partial<VectorConfig>): VectorConfig {
  try {
    return parseVectorConfig({ ...declared, ...config });
  } catch (e) {
    if (e instanceof ModelConfigError) throw new FaultError(e.message);
    throw e;
  }
}
