// Explaining a failing core: the defect catalogue, the faulty core it defines, and the search
// that finds which hypothesis reproduces a board's answers (docs/explain.md). Pure, like the model.
export {
  checkFault,
  DEVIATION_KEYS,
  FAULT_SPELLINGS,
  FaultError,
  formatCoreFault,
  formatFault,
  parseCoreFault,
  parseFault,
  type CoreDeviation,
  type DeviationKey,
  type Fault,
  type FaultKind,
} from './fault';
export { createFaultyModel, traceFaulty, type FaultyModel } from './faulty-model';
export { faultLabel, faultWords } from './labels';
export { classifyRest, type Rest } from './rest';
export {
  explain,
  ExplainInputError,
  ExplainStopped,
  MAX_HYPOTHESES,
  PARTLY_SHARE,
  type ExplainOptions,
  type ExplainSamples,
  type Explanation,
  type Hypothesis,
  type HypothesisRef,
} from './search';
export {
  applyVectorDeviation,
  checkVectorFault,
  formatVectorFault,
  parseVectorCoreFault,
  VECTOR_DEVIATION_KEYS,
  VECTOR_FAULT_SPELLINGS,
  type VectorDeviation,
  type VectorDeviationKey,
  type VectorFault,
} from './vector-fault';
export { createVectorFaultyModel, type VectorFaultyModel } from './vector-faulty-model';
export { vectorFaultLabel, vectorFaultWords } from './vector-labels';
export { explainVectors, type AnyExplanation, type VectorExplainSamples, type VectorExplanation, type VectorHypothesis, type VectorHypothesisRef } from './vector-search';
