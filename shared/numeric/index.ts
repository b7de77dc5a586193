// The numeric core's public API: formats, the reference model, exact references, scoring,
// spectral figures and plans. Everything outside shared/numeric imports from here.
export { AngleCodeError, ModelConfigError, OutputCodeError, PlanError, ScoringError } from './errors';
export { DEFAULT_MODEL_CONFIG, modelConfigSchema, parseModelConfig, type ModelConfig, type ModelConfigInput } from './model-config';
export {
  angleCodeRange,
  angleCodeToDegrees,
  angleCodeToRadians,
  angleCodeToTurns,
  assertAngleCode,
  assertOutputCode,
  degreesToAngleCode,
  fieldBytes,
  isAngleCode,
  outputCodeRange,
  outputCodeToValue,
  outputLsb,
  radiansToAngleCode,
  roundHalfAwayFromZero,
  saturateOutputCode,
  signExtend,
  toTwosComplement,
  turnsToAngleCode,
  valueToOutputCode,
  wrapOrSaturateAngleCode,
  type AngleFormat,
  type CodeRange,
  type OutputFormat,
} from './formats';
export { buildCordicTables, cordicGain, type CordicTables } from './cordic-tables';
export { createCordicModel, type CordicModel, type CosSin } from './cordic-model';
export { traceCordic, type CordicStep, type CordicTrace } from './cordic-trace';
export { exactSinCos, exactSinCosInto, exactSinCosOfTurns, idealOutputCode, idealOutputCodes } from './exact-reference';
export { DEFAULT_HISTOGRAM, type HistogramOptions } from './error-stats';
export { codesPerOctant, octantOfCode, type CoverageSummary } from './coverage';
export { ScoreAccumulator, type ChannelSummary, type Mismatch, type ScoreOptions, type ScoreSummary } from './score';
export { errorProfile, PROFILE_BINS, PROFILE_EMPTY } from './error-profile';
export { gcd, powerSpectrum, SpectralError, toneFigures, type ToneFigures, type ToneOptions } from './spectral';
export { bindPlan, MAX_PLAN_CODES, planCodes, planCodesInto, planSchema, type BoundPlan, type Plan } from './plans';
