export { averagingGain, type AveragingGain, type AveragingOptions } from './averagingGain.js';
export {
  bandNoiseRms,
  noiseDensityAt,
  quantizationNoiseRms,
  type BandNoiseOptions,
  type NoiseDensityAtOptions,
  type NoiseSpectrum,
} from './bandNoise.js';
export { bridgeNoiseSource, type BridgeNoiseOptions, type BridgeNoiseSource } from './bridgeNoiseSource.js';
export {
  bridgeOperatingPoints,
  type BridgeOperatingPoint,
  type BridgeOperatingPoints,
  type BridgeSpan,
  type MeasurandRange,
  type OperatingPointsOptions,
  type RatioSpan,
  type StrainSpan,
} from './bridgeOperatingPoints.js';
export {
  checkHeadroom,
  type AmplifierLimits,
  type AmplifierNodes,
  type HeadroomIssue,
  type HeadroomLimit,
  type HeadroomMargin,
  type HeadroomOptions,
  type HeadroomValue,
  type OperatingPoint,
} from './checkHeadroom.js';
export { combineNoise, type NoiseCombination, type NoiseShare, type NoiseTerm } from './combineNoise.js';
export { createAdc, type Adc, type AdcCode, type AdcOptions, type RatiometricAdc } from './createAdc.js';
export type { DesignCheck } from './DesignCheck.js';
export {
  filterGain,
  mainsRejection,
  noiseBandwidth,
  noiseFilterKinds,
  rejectionDecibels,
  type BrickWallFilter,
  type ButterworthFilter,
  type MainsRejection,
  type MainsRejectionOptions,
  type NoiseFilter,
  type SincFilter,
  type SinglePoleFilter,
  type TwoRealPolesFilter,
} from './filters.js';
export {
  inputNoiseDensity,
  type AmplifierNoiseOptions,
  type InputNoiseDensity,
  type InputNoiseOptions,
  type InputNoiseTerm,
} from './inputNoiseDensity.js';
export { johnsonNoiseDensity, type JohnsonNoiseOptions } from './johnsonNoiseDensity.js';
export {
  PEAK_TO_PEAK_PER_RMS,
  effectiveBits,
  effectiveResolutionBits,
  enobFromSinad,
  idealSnrDecibels,
  noiseFreeBits,
  type NoiseResolutionOptions,
} from './resolution.js';
export {
  resolutionBudget,
  type BudgetAdcOptions,
  type BudgetAmplifierOptions,
  type BudgetIssue,
  type BudgetNoise,
  type BudgetNoiseTerm,
  type BudgetPoint,
  type BudgetResolution,
  type ResolutionBudget,
  type ResolutionBudgetOptions,
} from './resolutionBudget.js';
export {
  selectGain,
  type GainCandidate,
  type GainRange,
  type GainSelection,
  type GainSelectionOptions,
} from './selectGain.js';
export {
  checkSelfHeating,
  heatSinkPowerDensity,
  selfHeatingLimit,
  type HeatSink,
  type PowerDensityRange,
  type SelfHeatingCheckOptions,
  type SelfHeatingIssue,
  type SelfHeatingLimit,
  type SelfHeatingOptions,
  type SelfHeatingValue,
} from './selfHeating.js';
