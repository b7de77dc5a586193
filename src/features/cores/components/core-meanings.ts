// Plain words for every key of a core: the form labels them, the read-only view explains them.
// Meanings follow docs/model.md (model keys) and server/services/session-scoring.ts (limits).
import { LIMIT_KEYS, LIMIT_MEANINGS, type LimitKey } from '../../../../shared/link-engine/limits';

export interface LimitMeaning {
  label: string;
  unit: string;
  /** "at most" limits fail above the value, "at least" ones below it. */
  bound: 'at most' | 'at least';
  explain: string;
}

export { LIMIT_KEYS };

export const LIMITS = Object.fromEntries(
  LIMIT_KEYS.map((k) => {
    const m = LIMIT_MEANINGS[k];
    return [k, { label: m.name, unit: m.unit, bound: m.atMost ? 'at most' : 'at least', explain: m.explain }];
  }),
) as Record<LimitKey, LimitMeaning>;

export type ModelKey = 'angleFormat' | 'angleBits' | 'angleFrac' | 'outBits' | 'outFrac' | 'iterations' | 'guardBits' | 'zGuardBits' | 'shiftRounding' | 'outputRounding' | 'fold';

export const MODEL: Record<ModelKey, { label: string; explain: string }> = {
  angleFormat: { label: 'Angle format', explain: 'turn: the code range is one full turn; rad: a signed fixed-point number of radians.' },
  angleBits: { label: 'Angle bits', explain: 'Total bits of an angle code (2 to 32).' },
  angleFrac: { label: 'Angle fraction bits', explain: 'Fraction bits of a radian angle code; blank means angle bits − 4.' },
  outBits: { label: 'Output bits', explain: 'Total bits of a cos or sin code, two’s complement (2 to 24).' },
  outFrac: { label: 'Output fraction bits', explain: 'Fraction bits of an output code; one LSB is 2^−fraction bits. Below output bits.' },
  iterations: { label: 'Iterations', explain: 'CORDIC rotation steps (1 to 40).' },
  guardBits: { label: 'Guard bits (x/y)', explain: 'Extra fraction bits the x/y datapath carries beyond the output (0 to 16).' },
  zGuardBits: { label: 'Guard bits (angle)', explain: 'Extra low bits of the angle accumulator beyond the angle code (0 to 8).' },
  shiftRounding: { label: 'Shift rounding', explain: 'How the shifted x and y terms are rounded in each step.' },
  outputRounding: { label: 'Output rounding', explain: 'How the guard bits are dropped at the output.' },
  fold: { label: 'Quadrant folding', explain: 'Fold the angle into ±90° before rotating, as most cores do to converge over the whole circle.' },
};

export const LINK = {
  baud: { label: 'Baud', explain: 'UART line rate in bit/s (9,600 to 12,000,000).' },
  crc: { label: 'Frame check', explain: 'The CRC-8 variant that checks each frame on the link; board and host must agree on it.' },
} as const;
