// The simulated board's vectoring core: shared/vectoring's model when healthy; with a
// `--core-fault`, one of the defects of the catalogue that a vectoring core can have (a stuck
// output bit, an iteration turning the wrong way, a wrong arctangent table entry, a missing or
// wrong gain-compensating constant) or a configuration the RTL has differently (`key=value`).
// The faulty arithmetic and the spellings are the explain search's own (shared/explain), so the
// board's defects are exactly the hypotheses the search tries.
import { applyVectorDeviation, createVectorFaultyModel, FaultError, parseVectorCoreFault as parseSpelling, type VectorDeviation } from '../shared/explain';
import { parseVectorConfig, type VectorConfig, type VectorConfigInput } from '../shared/vectoring';

export { VECTOR_DEVIATION_KEYS, VECTOR_FAULT_SPELLINGS, type VectorDeviation, type VectorFault } from '../shared/explain';

/**
 * Reads `--core-fault` for a vectoring board (shared/explain's parseVectorCoreFault).
 * @throws Error naming the option and what is wrong
 */
export function parseVectorCoreFault(text: string): VectorDeviation {
  try {
    return parseSpelling(text);
  } catch (e) {
    if (e instanceof FaultError) throw new Error(`--core-fault ${e.message}`);
    throw e;
  }
}

/** The core a vectoring board answers with. */
export interface SimVectorCore {
  /** The declared configuration, which MODE_INFO reports whatever the fault. */
  config: VectorConfig;
  answer(x: number, y: number): { angle: number; magnitude: number };
}

/** @throws Error naming the option when the fault does not fit the core (an iteration or bit it lacks). */
export function createSimVectorCore(input: VectorConfigInput, deviation?: VectorDeviation): SimVectorCore {
  const config = parseVectorConfig(input);
  if (!deviation) return { config, answer: createVectorFaultyModel(config, null).answer };
  let actual: VectorConfig;
  try {
    actual = applyVectorDeviation(config, deviation.config);
  } catch (e) {
    if (e instanceof FaultError) throw new Error(`--core-fault ${e.message}`);
    throw e;
  }
  try {
    return { config, answer: createVectorFaultyModel(actual, deviation.fault).answer };
  } catch (e) {
    if (e instanceof FaultError) throw new Error(`--core-fault: ${e.message}`);
    throw e;
  }
}
