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
