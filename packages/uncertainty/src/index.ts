export { type Correlation } from './correlations.js';
export {
  coverageFactor,
  normalQuantile,
  studentTQuantile,
  welchSatterthwaite,
  type UncertaintyComponent,
  type WelchSatterthwaiteOptions,
} from './coverageFactor.js';
export {
  fitLine,
  type FitLineOptions,
  type LineFit,
  type LineParameterQuantities,
  type LinePrediction,
  type LineQuantities,
} from './fitLine.js';
export {
  MONTE_CARLO_BYTES_PER_TRIAL,
  MONTE_CARLO_MAX_TRIALS,
  monteCarlo,
  type AbortSignalLike,
  type AdaptiveInterval,
  type AdaptiveOptions,
  type AdaptiveReport,
  type AdaptiveSpread,
  type MonteCarloOptions,
  type MonteCarloProgress,
  type MonteCarloResult,
} from './monteCarlo.js';
export {
  propagate,
  type BudgetLine,
  type Propagation,
  type PropagateOptions,
  type VectorPropagateOptions,
  type VectorPropagation,
} from './propagate.js';
export {
  distributions,
  standardUncertaintyOf,
  type BoundedQuantity,
  type CertificateQuantity,
  type Distribution,
  type InputQuantities,
  type InputQuantity,
  type NormalQuantity,
  type StudentTQuantity,
} from './quantities.js';
export { sampleCoverageIntervals, type CoverageIntervals } from './sampleCoverageIntervals.js';
export { typeAEvaluation, type TypeAEvaluation } from './typeAEvaluation.js';
export type { MeasurementModel, PositionalModel, VectorMeasurementModel } from './types.js';
export {
  numericalTolerance,
  validateGum,
  type GumInterval,
  type GumValidation,
  type MonteCarloInterval,
  type ValidateGumOptions,
} from './validateGum.js';
