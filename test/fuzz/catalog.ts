/**
 * The table of base calls: one or more valid calls of every exported function of every library
 * package (and of every method of the evaluators they create), and the exports that are not
 * called, each with the reason.
 */
import type { BaseCall } from './harness.js';
import { bridgeCalls, bridgeNotCalled } from './calls/bridge.js';
import { calibrationCalls, calibrationNotCalled } from './calls/calibration.js';
import { chainCalls, chainNotCalled } from './calls/chain.js';
import { channelCalls, channelNotCalled } from './calls/channel.js';
import { channelRtdPolynomialCalls, channelRtdPolynomialNotCalled } from './calls/channelRtdPolynomial.js';
import { compensationCalls, compensationNotCalled } from './calls/compensation.js';
import { firmwareCalls, firmwareNotCalled } from './calls/firmware.js';
import { coreCalls, coreNotCalled } from './calls/core.js';
import { mechanicsCalls, mechanicsNotCalled } from './calls/mechanics.js';
import { uncertaintyCalls, uncertaintyNotCalled } from './calls/uncertainty.js';

/** Every library package, in dependency order. */
export const libraryPackages = [
  'core',
  'bridge',
  'compensation',
  'chain',
  'uncertainty',
  'mechanics',
  'calibration',
  'firmware',
  'channel',
  // A subpath export: the opt-in RTD polynomial converter, outside the default bundle.
  'channel/rtd-polynomial',
] as const;

export type LibraryPackage = (typeof libraryPackages)[number];

/** The base calls of each package. */
export const baseCalls: Partial<Record<LibraryPackage, readonly BaseCall[]>> = {
  core: coreCalls,
  bridge: bridgeCalls,
  compensation: compensationCalls,
  chain: chainCalls,
  uncertainty: uncertaintyCalls,
  mechanics: mechanicsCalls,
  calibration: calibrationCalls,
  firmware: firmwareCalls,
  channel: channelCalls,
  'channel/rtd-polynomial': channelRtdPolynomialCalls,
};

/** Function exports that are deliberately not called, by package, each with the reason. */
export const notCalled: Partial<Record<LibraryPackage, Readonly<Record<string, string>>>> = {
  core: coreNotCalled,
  bridge: bridgeNotCalled,
  compensation: compensationNotCalled,
  chain: chainNotCalled,
  uncertainty: uncertaintyNotCalled,
  mechanics: mechanicsNotCalled,
  calibration: calibrationNotCalled,
  firmware: firmwareNotCalled,
  channel: channelNotCalled,
  'channel/rtd-polynomial': channelRtdPolynomialNotCalled,
};

/** The exports of each covered package that are not functions (constants and tables). */
export const constants: Partial<Record<LibraryPackage, readonly string[]>> = {
  core: [
    'BOLTZMANN_JOULES_PER_KELVIN',
    'BRIDGEWORK_ERROR_BRAND',
    'GAUGE_FACTOR_LIMITS',
    'OHMS_LIMITS',
    'STANDARD_GRAVITY_METERS_PER_SECOND_SQUARED',
    'VOLTS_LIMITS',
    'ZERO_CELSIUS_KELVIN',
    'errorCodeDescriptions',
    'errorCodes',
    'leadWirings',
  ],
  bridge: ['arrangementTable', 'strainArrangements'],
  compensation: [
    'ANNEALED_COPPER',
    'CALIBRATION_POISSON_RATIO',
    'IEC_60751_COEFFICIENTS',
    'RTD_TOLERANCE_CLASSES',
  ],
  chain: ['PEAK_TO_PEAK_PER_RMS', 'heatSinkPowerDensity', 'noiseFilterKinds'],
  uncertainty: ['MONTE_CARLO_BYTES_PER_TRIAL', 'MONTE_CARLO_MAX_TRIALS', 'distributions'],
  mechanics: ['maxRosetteConditionNumber', 'memberResultants'],
  calibration: [
    'instrumentAccuracyClasses',
    'interactionTermChoices',
    'loadCellAccuracyClasses',
    'preferredSeries',
  ],
  firmware: [
    'C_NAME_MAX_LENGTH',
    'EXHAUSTIVE_CODE_LIMIT',
    'FIRMWARE_CAUTION',
    'FIRMWARE_GENERATOR_VERSION',
    'MAX_PIECEWISE_DEGREE',
    'MAX_MATRIX_SIZE',
    'MAX_POLYNOMIAL_COEFFICIENTS',
    'evaluatorTypes',
    'fixedPointRoundings',
    'floatPrecisions',
    'sqlDialects',
    'verificationModes',
  ],
  channel: [
    'BUDGET_CAUTION',
    'CHANNEL_MAP_RELATIVE_ACCURACY',
    'MAX_BUDGET_TRIALS',
    'dimensionTable',
    'dimensions',
    'outputQuantities',
    'outputQuantityTable',
  ],
};

/**
 * Packages whose base calls are not in the table yet (while an owner reworks a public surface;
 * each joins the table when that work lands). None now.
 */
export const pending: readonly LibraryPackage[] = [];

export function allCalls(): BaseCall[] {
  return libraryPackages.flatMap((p) => [...(baseCalls[p] ?? [])]);
}
