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
