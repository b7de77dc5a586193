// A core's configuration for the work at hand: the rotation model's for rotation work, the
// vectoring model's for vectoring work. Asking a core of the other mode is the caller's error,
// answered with a clear 400 rather than a model reading a configuration it does not understand.
import type { CoreMode } from '../../shared/link-engine/limits';
import { parseModelConfig, type ModelConfig } from '../../shared/numeric';
import { parseVectorConfig, type VectorConfig } from '../../shared/vectoring';
import type { Core } from '../db/models';
import { HttpError } from '../http-error';

type ModeOf = Pick<Core, 'mode' | 'slug' | 'modelConfig' | 'vectorConfig'>;

/** The mode of a core (rows written before vectoring cores have none: rotation). */
export const modeOf = (core: Pick<Core, 'mode'>): CoreMode => core.mode ?? 'rotation';

/** A rotation core's model configuration. @throws HttpError 400 `vectoring_core` for a vectoring core, naming what `what` needed. */
export function rotationConfigOf(core: ModeOf, what = 'this'): ModelConfig {
  if (modeOf(core) !== 'rotation' || !core.modelConfig) {
    throw new HttpError(400, 'vectoring_core', `core ${core.slug} is a vectoring core: ${what} needs a rotation core`);
  }
  return parseModelConfig(core.modelConfig);
}

/** A vectoring core's configuration. @throws HttpError 400 `rotation_core` for a rotation core. */
export function vectorConfigOf(core: ModeOf, what = 'this'): VectorConfig {
  if (modeOf(core) !== 'vectoring' || !core.vectorConfig) {
    throw new HttpError(400, 'rotation_core', `core ${core.slug} is a rotation core: ${what} needs a vectoring core`);
  }
  return parseVectorConfig(core.vectorConfig);
}
