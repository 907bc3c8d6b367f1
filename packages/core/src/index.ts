export {
  BRIDGEWORK_ERROR_BRAND,
  BridgeworkError,
  errorCodeDescriptions,
  errorCodes,
  isBridgeworkError,
  type BridgeworkErrorDetails,
  type ErrorCode,
  type SpecIssue,
} from './BridgeworkError.js';
export {
  blameOption,
  checkFinite,
  checkInteger,
  checkLength,
  checkNonNegative,
  checkObject,
  checkOneOf,
  checkOptions,
  checkFiniteResult,
  checkPositive,
  checkRange,
  describeRange,
  formatValue,
  requireOption,
  type CheckPositiveOptions,
  type FiniteResultBlame,
  type OptionBlame,
  type OptionKeys,
  type RangeLimits,
} from './checks.js';
export { closestName, editDistance } from './closestName.js';
export {
  GAUGE_FACTOR_LIMITS,
  OHMS_LIMITS,
  VOLTS_LIMITS,
  checkCelsius,
  checkGaugeFactor,
  checkOhms,
  checkStrain,
  checkVolts,
  type CheckOhmsOptions,
  type CheckVoltsOptions,
} from './limits.js';
export { checkInterval, type Interval } from './Interval.js';
export {
  BOLTZMANN_JOULES_PER_KELVIN,
  STANDARD_GRAVITY_METERS_PER_SECOND_SQUARED,
  ZERO_CELSIUS_KELVIN,
  celsiusFromKelvin,
  kelvinFromCelsius,
} from './constants.js';
export { differenceOfProducts, exactDecimalString, twoProduct } from './numeric.js';
export { leadWirings, type LeadWiring, type LeadsOptions } from './options.js';
export {
  microstrainFromStrain,
  millivoltsPerVoltFromRatio,
  ratioFromMillivoltsPerVolt,
  strainFromMicrostrain,
} from './units.js';
export { rosetteLegAngles, type RosetteAngles, type RosetteLayout } from './rosette.js';
