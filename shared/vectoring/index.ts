// The vectoring cores' public API: configuration, model, exact reference, scoring and plans.
// Everything outside shared/vectoring imports from here.
export { ModelConfigError, PlanError, ScoringError } from '../numeric/errors';
export { VectorInputError } from './errors';
export { DEFAULT_VECTOR_CONFIG, inputRange, parseVectorConfig, vectorConfigSchema, type VectorConfig, type VectorConfigInput } from './vector-config';
export { buildVectorTables, type VectorTables } from './vector-tables';
export { angleOutputRange, createVectorModel, magnitudeRange, type AngleMagnitude, type VectorModel } from './vector-model';
export { exactVector, exactVectorInto, idealVectorCodes, nominalGain } from './vector-exact';
export { DEFAULT_VECTOR_COVERAGE, VectorCoverage, type Occupancy, type VectorCoverageOptions, type VectorCoverageSummary } from './vector-coverage';
export {
  VectorScoreAccumulator,
  wrapAngleError,
  type VectorErrorSummary,
  type VectorMismatch,
  type VectorScoreOptions,
  type VectorScoreSummary,
} from './vector-score';
export {
  bindVectorPlan,
  edgePairs,
  MAX_EXHAUSTIVE_IN_BITS,
  MAX_VECTOR_PLAN_POINTS,
  planVectors,
  vectorPlanInto,
  vectorPlanSchema,
  type BoundVectorPlan,
  type VectorPlan,
} from './vector-plans';
