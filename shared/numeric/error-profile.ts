// A coarse picture of error against angle: the code range cut into equal bins, each holding the
// largest |error| (cos or sin, in LSB) of the answers that fell in it. Small enough to keep with
// every stored session and to draw as a sparkline in a list.
import { exactSinCos } from './exact-reference';
import { angleCodeRange } from './formats';
import { parseModelConfig, type ModelConfig, type ModelConfigInput } from './model-config';

/** Bins of a session's profile. */
export const PROFILE_BINS = 64;

/** Marks a bin no answer fell in. */
export const PROFILE_EMPTY = -1;

/** Largest |error| in LSB per bin of the angle-code range; PROFILE_EMPTY where no answer fell. */
export function errorProfile(
  configInput: ModelConfigInput | ModelConfig,
  codes: ArrayLike<number>,
  cos: ArrayLike<number>,
  sin: ArrayLike<number>,
  bins = PROFILE_BINS,
): number[] {
  const config = parseModelConfig(configInput);
  const { min, max } = angleCodeRange(config);
  const span = max - min + 1;
  const scale = 2 ** config.outFrac;
  const out = new Array<number>(bins).fill(PROFILE_EMPTY);
  for (let i = 0; i < codes.length; i++) {
    const exact = exactSinCos(config, codes[i]);
    const bin = Math.min(bins - 1, Math.floor(((codes[i] - min) / span) * bins));
    const err = Math.max(Math.abs(cos[i] - exact.cos * scale), Math.abs(sin[i] - exact.sin * scale));
    if (err > out[bin]) out[bin] = err;
  }
  return out;
}
