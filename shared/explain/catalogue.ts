// The hypotheses the search tries (docs/explain.md "The catalogue"): every single configuration
// deviation an RTL can have, the start value for another iteration count, and every catalogue
// defect with the parameter values worth trying on a given core.
import { buildCordicTables, parseModelConfig, type ModelConfig } from '../numeric';
import { DEVIATION_KEYS, type Fault } from './fault';

/** How far a hypothesis strays from the declared core: fewer changes rank first among equals. */
export const Remoteness = { Declared: 0, Deviation: 1, Defect: 2, DefectOnDeviation: 3 } as const;
export type Remoteness = (typeof Remoteness)[keyof typeof Remoteness];

/** One hypothesis to try: a configuration and a defect (or none), and how remote it is. */
export interface Candidate<C = ModelConfig, F = Fault> {
  config: C;
  fault: F | null;
  remoteness: Remoteness;
}

const ALTERNATIVES: Record<(typeof DEVIATION_KEYS)[number], (c: ModelConfig) => unknown[]> = {
  iterations: () => range(1, 40),
  guardBits: () => range(0, 16),
  zGuardBits: () => range(0, 8),
  shiftRounding: (c) => [c.shiftRounding === 'floor' ? 'nearest' : 'floor'],
  outputRounding: (c) => [c.outputRounding === 'nearest' ? 'truncate' : 'nearest'],
  fold: (c) => [!c.fold],
};

function range(lo: number, hi: number): number[] {
  return Array.from({ length: hi - lo + 1 }, (_, i) => lo + i);
}

/**
 * Every configuration differing from `declared` in one key the RTL can get wrong, and the start
 * value computed for every other iteration count (a defect, but of the same family).
 */
export function deviationCandidates(declared: ModelConfig): Candidate[] {
  const out: Candidate[] = [];
  for (const key of DEVIATION_KEYS) {
    for (const value of ALTERNATIVES[key](declared)) {
      if (value === declared[key]) continue;
      let config: ModelConfig;
      try {
        config = parseModelConfig({ ...declared, [key]: value });
      } catch {
        continue; // a value this core's other keys rule out
      }
      out.push({ config, fault: null, remoteness: Remoteness.Deviation });
    }
  }
  for (const m of range(0, 40)) {
    if (m !== declared.iterations) out.push({ config: declared, fault: { kind: 'gain', iterations: m }, remoteness: Remoteness.Deviation });
  }
  return out;
}

/** Angle offsets always tried: small ones, and every power of two (a wrong bit in an adder). */
function offsetsToTry(config: ModelConfig, estimate: number | null): number[] {
  const set = new Set<number>([1, 2, 3, 4]);
  for (let k = 3; k < config.angleBits - 1; k++) set.add(2 ** k);
  const out = [...set].flatMap((v) => [v, -v]);
  if (estimate !== null) for (const e of [estimate - 1, estimate, estimate + 1]) if (e !== 0 && !out.includes(e)) out.push(e);
  return out.filter((v) => Math.abs(v) < 2 ** config.angleBits);
}

/**
 * Every catalogue defect on `config`. `offsetEstimate` is an angle offset read from the answers
 * themselves (see estimateAngleOffset), tried beside the fixed ones.
 */
export function defectCandidates(config: ModelConfig, remoteness: Remoteness, offsetEstimate: number | null): Candidate[] {
  const n = config.iterations;
  const faults: Fault[] = [];
  for (let i = 0; i < n; i++) faults.push({ kind: 'sign-slip', iteration: i });
  const atan0 = buildCordicTables(config).atan[0];
  const atanBits = Math.max(1, Math.floor(Math.log2(Math.max(1, atan0))) + 1);
  for (let i = 0; i < n; i++) {
    for (const delta of [1, -1, 2, -2]) faults.push({ kind: 'atan-entry', iteration: i, delta });
    for (let b = 0; b < atanBits; b++) faults.push({ kind: 'atan-entry', iteration: i, flipBit: b });
  }
  for (let i = 0; i < n; i++) {
    faults.push({ kind: 'shift', iteration: i, by: 1 });
    if (i > 0) faults.push({ kind: 'shift', iteration: i, by: -1 });
  }
  faults.push({ kind: 'logical-shift', register: 'x' }, { kind: 'logical-shift', register: 'y' });
  for (const channel of ['both', 'cos', 'sin'] as const) {
    for (let bit = 0; bit < config.outBits; bit++) for (const value of [1, 0] as const) faults.push({ kind: 'stuck-bit', channel, bit, value });
  }
  faults.push({ kind: 'swap' }, { kind: 'negate', channel: 'cos' }, { kind: 'negate', channel: 'sin' }, { kind: 'wrap' });
  for (const codes of offsetsToTry(config, offsetEstimate)) faults.push({ kind: 'angle-offset', codes });
  for (let bit = 0; bit < config.angleBits; bit++) for (const value of [1, 0] as const) faults.push({ kind: 'angle-bit', bit, value });
  faults.push({ kind: 'blocking-update' }, { kind: 'zero-direction' });
  if (config.fold) faults.push({ kind: 'fold-sign' });
  return faults.map((fault) => ({ config, fault, remoteness }));
}

/**
 * The angle offset the answers suggest: the median, over the given samples, of the angle of the
 * answered (cos, sin) less the angle of the code, in codes. Null when it rounds to zero.
 */
export function estimateAngleOffset(config: ModelConfig, codes: ArrayLike<number>, cos: ArrayLike<number>, sin: ArrayLike<number>): number | null {
  const turn = config.angleFormat === 'turn';
  const perTurn = turn ? 2 ** config.angleBits : 2 * Math.PI * 2 ** config.angleFrac;
  const diffs: number[] = [];
  for (let k = 0; k < codes.length; k++) {
    if (cos[k] === 0 && sin[k] === 0) continue;
    const answered = (Math.atan2(sin[k], cos[k]) / (2 * Math.PI)) * perTurn;
    let d = answered - codes[k];
    d -= Math.round(d / perTurn) * perTurn;
    diffs.push(d);
  }
  if (diffs.length === 0) return null;
  diffs.sort((a, b) => a - b);
  const median = Math.round(diffs[diffs.length >> 1]);
  return median === 0 ? null : median;
}
