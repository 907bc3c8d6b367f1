export { awgDiameterMeters } from './awgDiameterMeters.js';
export {
  ANNEALED_COPPER,
  wireOhms,
  type ConductorMaterial,
  type WireMaterial,
  type WireOhmsOptions,
} from './wireOhms.js';
export {
  leadDesensitization,
  type FullBridgeLeadOptions,
  type FullBridgeWiring,
  type LeadDesensitizationOptions,
  type QuarterBridgeGaugeOptions,
  type QuarterBridgeLeadOptions,
  type QuarterBridgeWiring,
} from './leadDesensitization.js';
export { leadZeroOffset, type LeadZeroOffset, type LeadZeroOffsetOptions } from './leadZeroOffset.js';
export {
  leadTemperatureEffect,
  type LeadTemperatureEffect,
  type LeadTemperatureEffectOptions,
} from './leadTemperatureEffect.js';
export { leadSpanDrift, type LeadSpanDriftOptions } from './leadSpanDrift.js';
export { rescaleGaugeFactor, type RescaleGaugeFactorOptions } from './rescaleGaugeFactor.js';
export { gaugeFactorAt, type GaugeFactorAtOptions } from './gaugeFactorAt.js';
export { createThermalOutput, type ThermalOutput, type ThermalOutputOptions } from './createThermalOutput.js';
export {
  correctTemperatureEffects,
  indicatedStrainWithTemperatureEffects,
  type CorrectTemperatureEffectsOptions,
  type GaugeTemperatureOptions,
  type IndicatedStrainWithTemperatureEffectsOptions,
} from './correctTemperatureEffects.js';
export { CALIBRATION_POISSON_RATIO, type TransverseSensitivityOptions } from './calibrationPoissonRatio.js';
export {
  indicatedTransverseStrain,
  type IndicatedTransverseStrainOptions,
} from './indicatedTransverseStrain.js';
export { correctTransverseGauge, type CorrectTransverseGaugeOptions } from './correctTransverseGauge.js';
export { correctTransversePair, type CorrectTransversePairOptions } from './correctTransversePair.js';
export {
  correctRosetteTransverse,
  type CorrectRosetteTransverseOptions,
} from './correctRosetteTransverse.js';
export {
  IEC_60751_COEFFICIENTS,
  createRtd,
  type CallendarVanDusenCoefficients,
  type Rtd,
  type RtdInverseStart,
  type RtdOptions,
  type RtdTolerance,
} from './createRtd.js';
export {
  RTD_TOLERANCE_CLASSES,
  rtdToleranceCelsius,
  type RtdElement,
  type RtdToleranceClass,
  type RtdToleranceClassSpec,
  type RtdToleranceOptions,
} from './rtdTolerance.js';
export {
  rtdLeadError,
  type RtdLeadError,
  type RtdLeadErrorOptions,
  type RtdReadout,
  type RtdWiring,
} from './rtdLeadError.js';
export type { Thermistor } from './thermistor.js';
export { createBetaThermistor, type BetaThermistorOptions } from './createBetaThermistor.js';
export {
  createSteinhartHartThermistor,
  type SteinhartHartCoefficients,
  type SteinhartHartOptions,
} from './createSteinhartHartThermistor.js';
export { fitSteinhartHart, type FitSteinhartHartOptions, type ThermistorPoint } from './fitSteinhartHart.js';
export { fitBeta, type FitBetaOptions } from './fitBeta.js';
export {
  fitThermistor,
  type FitThermistorOptions,
  type ThermistorFit,
  type ThermistorModel,
} from './fitThermistor.js';
