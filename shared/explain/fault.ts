// The defect catalogue: each entry a named, parameterised deviation of the RTL from the model's
// definition (docs/model.md), and its one-line spelling, used both to inject a defect into the
// simulated board (`--core-fault`) and to name what the explain search found (docs/explain.md).
import { parseModelConfig, ModelConfigError, type ModelConfig } from '../numeric';

/** One defect. Parameter names are part of the product's interface (the explain JSON). */
export type Fault =
  /** Iteration `iteration` turns the wrong way. */
  | { kind: 'sign-slip'; iteration: number }
  /** The arctangent table entry `iteration` off by `delta` z units. */
  | { kind: 'atan-entry'; iteration: number; delta: number }
  /** The arctangent table entry `iteration` with bit `flipBit` flipped. */
  | { kind: 'atan-entry'; iteration: number; flipBit: number }
  /** Iteration `iteration` shifts x and y by iteration + by. */
  | { kind: 'shift'; iteration: number; by: 1 | -1 }
  /** The x or y shifter fills with zeros instead of the sign. */
  | { kind: 'logical-shift'; register: 'x' | 'y' }
  /** An output bit stuck at 0 or 1, on one channel or both. */
  | { kind: 'stuck-bit'; channel: 'cos' | 'sin' | 'both'; bit: number; value: 0 | 1 }
  /** cos and sin swapped at the output. */
  | { kind: 'swap' }
  /** One output negated. */
  | { kind: 'negate'; channel: 'cos' | 'sin' }
  /** Outputs wrap around instead of saturating at the format's extremes. */
  | { kind: 'wrap' }
  /** The angle register off by a constant number of codes (wrapping in its own width). */
  | { kind: 'angle-offset'; codes: number }
  /** An angle register bit stuck at 0 or 1 (an input left unconnected, say). */
  | { kind: 'angle-bit'; bit: number; value: 0 | 1 }
  /** The start value K computed for another iteration count (0: no gain compensation at all). */
  | { kind: 'gain'; iterations: number }
  /** y is computed from the already-updated x (a blocking assignment where a non-blocking one belongs). */
  | { kind: 'blocking-update' }
  /** z = 0 turns the negative way (a test of z > 0 where the sign bit belongs). */
  | { kind: 'zero-direction' }
  /** Angles moved by the quadrant fold are not negated back at the end. */
  | { kind: 'fold-sign' };

export type FaultKind = Fault['kind'];

/** A configuration deviation and/or a defect: what `--core-fault` injects into a declared core. */
export interface CoreDeviation {
  /** Model keys the RTL has differently from the declared configuration (empty for none). */
  config: Partial<ModelConfig>;
  fault: Fault | null;
}

/** Text that does not spell a catalogue entry, or an entry the core cannot have. */
export class FaultError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'FaultError';
  }
}

/** Model keys an RTL implementation can get wrong without changing its ports. */
export const DEVIATION_KEYS = ['iterations', 'guardBits', 'zGuardBits', 'shiftRounding', 'outputRounding', 'fold'] as const;
export type DeviationKey = (typeof DEVIATION_KEYS)[number];

const SPELLINGS = [
  'sign-slip:K',
  'atan-entry:K:±D',
  'atan-entry:K:flipB',
  'shift:K:±1',
  'logical-shift:x|y',
  'stuck-bit:cos|sin|both:B:0|1',
  'swap',
  'negate:cos|sin',
  'wrap',
  'angle-offset:±N',
  'angle-bit:B:0|1',
  'gain:M',
  'blocking-update',
  'zero-direction',
  'fold-sign',
];

/** Every spelling, for usage lines and error messages. */
export const FAULT_SPELLINGS: readonly string[] = SPELLINGS;

const UINT = /^\d+$/;
const SINT = /^[+-]?\d+$/;

function uint(text: string | undefined, what: string, whole: string): number {
  if (text === undefined || !UINT.test(text)) throw new FaultError(`"${whole}": ${what} must be a whole number ≥ 0`);
  return Number(text);
}

function nonZero(text: string | undefined, what: string, whole: string): number {
  if (text === undefined || !SINT.test(text) || Number(text) === 0) throw new FaultError(`"${whole}": ${what} must be a non-zero integer such as +1 or -2`);
  return Number(text);
}

function oneOf<T extends string>(text: string | undefined, options: readonly T[], what: string, whole: string): T {
  if (text === undefined || !(options as readonly string[]).includes(text)) throw new FaultError(`"${whole}": ${what} must be ${options.join(' or ')}`);
  return text as T;
}

/**
 * Reads one defect's spelling (`sign-slip:5`, `atan-entry:3:-1`, `stuck-bit:cos:0:1`, …; see
 * FAULT_SPELLINGS). The simulated board's old spellings stay: `sign:K` (sign-slip), `stuck:B`
 * (bit B of both outputs stuck at 1) and `gain` (start value for 2 iterations).
 * @throws FaultError naming what is wrong.
 */
export function parseFault(text: string): Fault {
  const whole = text.trim();
  const [name, ...args] = whole.split(':');
  const arity = (n: number) => {
    if (args.length !== n) throw new FaultError(`"${whole}": ${name} takes ${n === 0 ? 'no parameters' : `${n} parameter${n > 1 ? 's' : ''}`}`);
  };
  switch (name) {
    case 'sign':
    case 'sign-slip':
      arity(1);
      return { kind: 'sign-slip', iteration: uint(args[0], 'the iteration', whole) };
    case 'atan-entry': {
      arity(2);
      const iteration = uint(args[0], 'the iteration', whole);
      if (args[1].startsWith('flip')) return { kind: 'atan-entry', iteration, flipBit: uint(args[1].slice(4), 'the flipped bit', whole) };
      return { kind: 'atan-entry', iteration, delta: nonZero(args[1], 'the delta', whole) };
    }
    case 'shift': {
      arity(2);
      const iteration = uint(args[0], 'the iteration', whole);
      const by = Number(oneOf(args[1], ['+1', '-1', '1'], 'by', whole)) as 1 | -1;
      return { kind: 'shift', iteration, by };
    }
    case 'logical-shift':
      arity(1);
      return { kind: 'logical-shift', register: oneOf(args[0], ['x', 'y'], 'the register', whole) };
    case 'stuck':
      arity(1);
      return { kind: 'stuck-bit', channel: 'both', bit: uint(args[0], 'the bit', whole), value: 1 };
    case 'stuck-bit':
      arity(3);
      return {
        kind: 'stuck-bit',
        channel: oneOf(args[0], ['cos', 'sin', 'both'], 'the channel', whole),
        bit: uint(args[1], 'the bit', whole),
        value: Number(oneOf(args[2], ['0', '1'], 'the value', whole)) as 0 | 1,
      };
    case 'negate':
      arity(1);
      return { kind: 'negate', channel: oneOf(args[0], ['cos', 'sin'], 'the channel', whole) };
    case 'angle-offset':
      arity(1);
      return { kind: 'angle-offset', codes: nonZero(args[0], 'the offset in codes', whole) };
    case 'angle-bit':
      arity(2);
      return { kind: 'angle-bit', bit: uint(args[0], 'the bit', whole), value: Number(oneOf(args[1], ['0', '1'], 'the value', whole)) as 0 | 1 };
    case 'gain':
      if (args.length === 0) return { kind: 'gain', iterations: 2 };
      arity(1);
      return { kind: 'gain', iterations: uint(args[0], 'the iteration count', whole) };
    case 'swap':
    case 'wrap':
    case 'blocking-update':
    case 'zero-direction':
    case 'fold-sign':
      arity(0);
      return { kind: name };
    default:
      throw new FaultError(`"${whole}" is not a core fault; known: ${SPELLINGS.join(', ')}, or a configuration key=value (${DEVIATION_KEYS.join(', ')})`);
  }
}

/** The spelling parseFault reads back to the same fault. */
export function formatFault(f: Fault): string {
  const signed = (n: number) => (n > 0 ? `+${n}` : String(n));
  switch (f.kind) {
    case 'sign-slip':
      return `sign-slip:${f.iteration}`;
    case 'atan-entry':
      return 'flipBit' in f ? `atan-entry:${f.iteration}:flip${f.flipBit}` : `atan-entry:${f.iteration}:${signed(f.delta)}`;
    case 'shift':
      return `shift:${f.iteration}:${signed(f.by)}`;
    case 'logical-shift':
      return `logical-shift:${f.register}`;
    case 'stuck-bit':
      return `stuck-bit:${f.channel}:${f.bit}:${f.value}`;
    case 'negate':
      return `negate:${f.channel}`;
    case 'angle-offset':
      return `angle-offset:${signed(f.codes)}`;
    case 'angle-bit':
      return `angle-bit:${f.bit}:${f.value}`;
    case 'gain':
      return `gain:${f.iterations}`;
    default:
      return f.kind;
  }
}

/**
 * Reads what `--core-fault` accepts: a defect (parseFault), or one configuration deviation
 * `key=value` (`iterations=15`, `fold=false`, `shiftRounding=nearest`). The old `fold` means
 * `fold=false`. @throws FaultError
 */
export function parseCoreFault(text: string): CoreDeviation {
  const whole = text.trim();
  if (whole === 'fold') return { config: { fold: false }, fault: null };
  const eq = whole.indexOf('=');
  if (eq < 0) return { config: {}, fault: parseFault(whole) };
  const key = whole.slice(0, eq).trim();
  const raw = whole.slice(eq + 1).trim();
  if (!(DEVIATION_KEYS as readonly string[]).includes(key)) throw new FaultError(`"${whole}": ${key} is not a key the RTL can deviate in (${DEVIATION_KEYS.join(', ')})`);
  let value: unknown = raw;
  if (raw === 'true' || raw === 'false') value = raw === 'true';
  else if (SINT.test(raw)) value = Number(raw);
  try {
    const parsed = parseModelConfig({ [key]: value });
    return { config: { [key]: parsed[key as DeviationKey] }, fault: null };
  } catch (e) {
    if (e instanceof ModelConfigError) throw new FaultError(`"${whole}": ${e.message}`);
    throw e;
  }
}

/** The spelling parseCoreFault reads back (config keys that equal the declared ones are left out). */
export function formatCoreFault(config: ModelConfig, declared: ModelConfig, fault: Fault | null): string {
  const parts = DEVIATION_KEYS.filter((k) => config[k] !== declared[k]).map((k) => `${k}=${String(config[k])}`);
  if (fault) parts.push(formatFault(fault));
  return parts.join(' ');
}

/**
 * Checks that a defect fits a core (an iteration it has, an output bit it has).
 * @throws FaultError naming the parameter.
 */
export function checkFault(config: ModelConfig, f: Fault | null): void {
  if (!f) return;
  const n = config.iterations;
  const say = (what: string) => {
    throw new FaultError(`${formatFault(f)}: ${what}`);
  };
  switch (f.kind) {
    case 'sign-slip':
    case 'atan-entry':
    case 'shift':
      if (f.iteration >= n) say(`the core has only ${n} iterations (0..${n - 1})`);
      if (f.kind === 'shift' && f.iteration + f.by < 0) say('a shift cannot be negative');
      if (f.kind === 'shift' && f.by !== 1 && f.by !== -1) say('by must be +1 or -1');
      if (f.kind === 'atan-entry' && 'flipBit' in f && f.flipBit >= 40) say('the flipped bit must be below 40');
      if (f.kind === 'atan-entry' && 'delta' in f && (!Number.isInteger(f.delta) || Math.abs(f.delta) > 2 ** 20)) say('the delta must be a small integer');
      break;
    case 'stuck-bit':
      if (!Number.isInteger(f.bit) || f.bit < 0 || f.bit >= config.outBits) say(`the output has only ${config.outBits} bits (0..${config.outBits - 1})`);
      if (f.value !== 0 && f.value !== 1) say('the value must be 0 or 1');
      break;
    case 'angle-offset':
      if (!Number.isInteger(f.codes) || Math.abs(f.codes) >= 2 ** config.angleBits) say(`the offset must be an integer below 2^${config.angleBits} in size`);
      break;
    case 'angle-bit':
      if (!Number.isInteger(f.bit) || f.bit < 0 || f.bit >= config.angleBits) say(`the angle code has only ${config.angleBits} bits (0..${config.angleBits - 1})`);
      if (f.value !== 0 && f.value !== 1) say('the value must be 0 or 1');
      break;
    case 'gain':
      if (!Number.isInteger(f.iterations) || f.iterations < 0 || f.iterations > 40) say('the iteration count must be 0..40');
      break;
    case 'fold-sign':
      if (!config.fold) say('the core does not fold quadrants');
      break;
    default:
      break;
  }
}
