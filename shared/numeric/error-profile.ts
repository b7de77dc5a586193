// A coarse picture of error against angle: the code range cut into equal bins, each holding the
// largest |error| (cos or sin, in LSB) of the answers that fell in it. Small enough to keep with
// every stored session and to draw as a sparkline in a list. The scorer computes it on the way
// (ScoreOptions.profileBins), so scoring and profile share one pass over the exact reference.
import type { ModelConfig, ModelConfigInput } from './model-config';
import { PROFILE_EMPTY, ScoreAccumulator } from './score';

/** Bins of a stored session's profile. */
export const PROFILE_BINS = 64;

export { PROFILE_EMPTY };

/** The profile of a set of answers on its own (the server takes it from its scorer instead). */
export function errorProfile(
  config: ModelConfigInput | ModelConfig,
  codes: ArrayLike<number>,
  cos: ArrayLike<number>,
  sin: ArrayLike<number>,
  bins = PROFILE_BINS,
): number[] {
  return new ScoreAccumulator(config, { profileBins: bins }).add(codes, cos, sin).profile()!;
}
