// The simulated board's core: the shared reference model when healthy; with a `--core-fault`, a
// catalogue deviation or defect (shared/explain) run through the model's own iteration, so the
// code that injects a defect is the code the explain search names it by.
import { createFaultyModel, FaultError, parseCoreFault as parseCatalogueEntry, type CoreDeviation } from '../shared/explain';
import { createCordicModel, parseModelConfig, type ModelConfig, type ModelConfigInput } from '../shared/numeric';

/** What `--core-fault` injects: configuration keys the RTL has differently, and/or one defect. */
export type CoreFault = CoreDeviation;

/**
 * Reads `--core-fault`: any catalogue spelling (docs/explain.md), `key=value` for a configuration
 * deviation, or the old `gain`, `fold`, `sign:K`, `stuck:B`. @throws Error naming the option
 */
export function parseCoreFault(text: string): CoreFault {
  try {
    return parseCatalogueEntry(text);
  } catch (e) {
    if (e instanceof FaultError) throw new Error(`--core-fault ${e.message}`);
    throw e;
  }
}

export interface SimCore {
  /** The declared configuration, which INFO reports whatever the fault. */
  config: ModelConfig;
  evaluate(code: number): { cos: number; sin: number };
}

/** @throws Error when the fault does not fit the core (an iteration or output bit it lacks). */
export function createSimCore(input: ModelConfigInput, fault?: CoreFault): SimCore {
  const config = parseModelConfig(input);
  if (!fault) return { config, evaluate: createCordicModel(config).evaluate };
  try {
    const model = createFaultyModel(parseModelConfig({ ...config, ...fault.config }), fault.fault);
    return { config, evaluate: model.evaluate };
  } catch (e) {
    if (e instanceof FaultError) throw new Error(`--core-fault ${e.message}`);
    throw e;
  }
}
