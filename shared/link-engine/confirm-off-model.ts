// What the runner and the Bench page confirm on a damaged line (RunHandlers.confirm): answers
// that differ from the reference model. A working core's answers match the model, so nothing is
// asked twice; a wrong answer a damaged frame slipped past the 8-bit CHECK differs, and is
// asked for again; a core's real error repeats, and is taken on its second showing.
import { createCordicModel, type ModelConfig, type ModelConfigInput } from '../numeric';

export function confirmOffModel(config: ModelConfigInput | ModelConfig): (code: number, cos: number, sin: number) => boolean {
  const model = createCordicModel(config);
  return (code, cos, sin) => {
    const m = model.evaluate(code);
    return m.cos !== cos || m.sin !== sin;
  };
}
