export type { CheckResult } from './checkResult.js';
export {
  createCertificateScale,
  type BuoyancyOptions,
  type CapacityUnit,
  type CertificateScale,
  type CertificateScaleOptions,
  type LoadUnit,
} from './createCertificateScale.js';
export {
  fitPolynomial,
  type InverseMethod,
  type PolynomialFit,
  type PolynomialFitOptions,
} from './fitPolynomial.js';
export {
  createLoadCellClass,
  loadCellAccuracyClasses,
  type CreepCheck,
  type CreepCheckOptions,
  type CreepLimits,
  type LoadCellAccuracyClass,
  type LoadCellClass,
  type LoadCellClassOptions,
  type LoadCellErrorCheck,
  type LoadCellErrorRow,
  type LoadCellErrorsOptions,
  type LoadCellSpecification,
} from './createLoadCellClass.js';
export {
  evaluateCertificate,
  type CertificateEvaluation,
  type CertificateOptions,
  type CertificatePoint,
  type CertificateRun,
  type StraightLine,
} from './evaluateCertificate.js';
export { fitTwoPoint, type TwoPointFit, type TwoPointFitOptions } from './fitTwoPoint.js';
export type {
  BridgeArm,
  ShuntBridgeOptions,
  ShuntDefinition,
  ShuntOhmsForStrainOptions,
  ShuntPlacement,
  ShuntRatios,
  StrainFromShuntOptions,
} from './shuntOptions.js';
export {
  checkEccentricity,
  instrumentAccuracyClasses,
  type EccentricityCheck,
  type EccentricityCheckOptions,
  type EccentricityRow,
  type InstrumentAccuracyClass,
} from './platform/checkEccentricity.js';
export {
  fitCornerFactors,
  type CornerFactors,
  type CornerFactorsOptions,
  type CornerIndication,
} from './platform/fitCornerFactors.js';
export {
  fitSummingTrims,
  summingNetworkRatio,
  type SummingNetworkOptions,
  type SummingNetworkRatioOptions,
  type SummingTrims,
  type SummingTrimsOptions,
  type TrimPlacement,
} from './platform/summingNetwork.js';
export {
  fitMultiComponent,
  type LoadingPoint,
  type MultiComponentCalibration,
  type MultiComponentFitOptions,
  type RejectedTerm,
} from './multicomponent/fitMultiComponent.js';
export {
  createMultiComponentModel,
  type LoadStateMonteCarloOptions,
  type LoadStateOptions,
  type LoadStateUncertainty,
  type MultiComponentInverse,
  type MultiComponentInverseOptions,
  type MultiComponentModel,
  type MultiComponentModelOptions,
} from './multicomponent/createMultiComponentModel.js';
export { interactionTermChoices, type InteractionTerms, type ModelTerm } from './multicomponent/terms.js';
export {
  nearestPreferredValue,
  preferredSeries,
  preferredValues,
  type NearestPreferredValueOptions,
  type PreferredRounding,
  type PreferredSeries,
  type PreferredValue,
} from './preferredValues.js';
export { shuntOhmsForStrain, shuntRatios, strainFromShunt } from './shuntStrain.js';
export {
  spanCorrectionFromShunt,
  type SpanCorrection,
  type SpanCorrectionOptions,
} from './spanCorrectionFromShunt.js';
export {
  ratioChangeFromShunt,
  shuntEquivalentLoad,
  shuntOhmsForRatioChange,
  type RatioChangeFromShuntOptions,
  type ShuntEquivalentLoadOptions,
  type ShuntOhmsForRatioChangeOptions,
  type TransducerShuntOptions,
} from './transducerShunt.js';
