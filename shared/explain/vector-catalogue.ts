// The hypotheses the search tries on a vectoring core (docs/explain.md "Vectoring cores"): every
// single configuration deviation its RTL can have, the gain constant for every other iteration
// count, and every defect with the parameter values worth trying on a given core.
import { buildVectorTables, parseVectorConfig, type VectorConfig } from '../vectoring';
import { Remoteness, type Candidate } from './catalogue';
import { VECTOR_DEVIATION_KEYS, type VectorFault } from './vector-fault';

export type VectorCandidate = Candidate<VectorConfig, VectorFault>;

const range = (lo: number, hi: number) => Array.from({ length: hi - lo + 1 }, (_, i) => lo + i);
const others = <T>(all: readonly T[], v: T) => all.filter((a) => a !== v);

// The gain constant's keys are tried only on a core that multiplies by it: elsewhere they change no answer.
const ALTERNATIVES: Record<(typeof VECTOR_DEVIATION_KEYS)[number], (c: VectorConfig) => unknown[]> = {
  iterations: () => range(1, 40),
  guardBits: () => range(0, 16),
  zGuardBits: () => range(0, 8),
  shiftRounding: (c) => others(['floor', 'nearest'], c.shiftRounding),
  outputRounding: (c) => others(['truncate', 'nearest'], c.outputRounding),
  prerotation: (c) => others(['none', 'half-turn', 'quadrant'], c.prerotation),
  gainCompensation: (c) => others(['none', 'multiply'], c.gainCompensation),
  gainBits: (c) => (c.gainCompensation === 'multiply' ? range(2, 32) : []),
  gainRounding: (c) => (c.gainCompensation === 'multiply' ? others(['truncate', 'nearest'], c.gainRounding) : []),
  zeroVector: (c) => others(['zero', 'iterate'], c.zeroVector),
};

/**
 * Every configuration differing from `declared` in one key a vectoring RTL can get wrong, and,
 * on a core with the compensating multiply, the constant computed for every other iteration count.
 */
export function vectorDeviationCandidates(declared: VectorConfig): VectorCandidate[] {
  const out: VectorCandidate[] = [];
  for (const key of VECTOR_DEVIATION_KEYS) {
    for (const value of ALTERNATIVES[key](declared)) {
      if (value === declared[key]) continue;
      let config: VectorConfig;
      try {
        config = parseVectorConfig({ ...declared, [key]: value });
      } catch {
        continue; // a value this core's other keys rule out
      }
      out.push({ config, fault: null, remoteness: Remoteness.Deviation });
    }
  }
  if (declared.gainCompensation === 'multiply') {
    for (const m of range(0, 40)) if (m !== declared.iterations) out.push({ config: declared, fault: { kind: 'gain', iterations: m }, remoteness: Remoteness.Deviation });
  }
  return out;
}

/** Every vectoring defect on `config`: each iteration's direction and table entry, each output bit. */
export function vectorDefectCandidates(config: VectorConfig, remoteness: Remoteness): VectorCandidate[] {
  const n = config.iterations;
  const faults: VectorFault[] = [];
  for (let i = 0; i < n; i++) faults.push({ kind: 'sign-slip', iteration: i });
  const atan0 = buildVectorTables(config).atan[0];
  const atanBits = Math.max(1, Math.floor(Math.log2(Math.max(1, atan0))) + 1);
  for (let i = 0; i < n; i++) {
    for (const delta of [1, -1, 2, -2]) faults.push({ kind: 'atan-entry', iteration: i, delta });
    for (let b = 0; b < atanBits; b++) faults.push({ kind: 'atan-entry', iteration: i, flipBit: b });
  }
  const widths = { both: Math.min(config.angleBits, config.magBits), angle: config.angleBits, magnitude: config.magBits };
  for (const channel of ['both', 'angle', 'magnitude'] as const) {
    for (let bit = 0; bit < widths[channel]; bit++) for (const value of [1, 0] as const) faults.push({ kind: 'stuck-bit', channel, bit, value });
  }
  return faults.map((fault) => ({ config, fault, remoteness }));
}
