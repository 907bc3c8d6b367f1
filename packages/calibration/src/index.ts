export {
  createFitter,
  type ClosedInterval,
  type Fitter,
  type InverseMethod,
  type PolynomialFit,
  type PolynomialFitOptions,
} from './createFitter.js';
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
export { shuntOhmsForStrain, shuntRatios, strainFromShunt } from './shuntStrain.js';
export {
  ratioChangeFromShunt,
  shuntEquivalentLoad,
  shuntOhmsForRatioChange,
  type RatioChangeFromShuntOptions,
  type ShuntEquivalentLoadOptions,
  type ShuntOhmsForRatioChangeOptions,
  type TransducerShuntOptions,
} from './transducerShunt.js';
