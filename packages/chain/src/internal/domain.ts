import { BridgeworkError, checkNonNegative, checkPositive, checkRange, formatValue } from '@bridgework/core';

/**
 * The documented domains of the chain package. With the resistance and voltage limits of the core
 * package they keep every density, rms value, count and margin a budget forms inside binary64, so
 * an accepted input never yields a non-finite figure.
 */

/** Frequencies accepted, in Hz: 1 nHz to 1 THz (corners may also be 0). */
export const FREQUENCY_LIMITS_HERTZ = { min: 1e-9, max: 1e12 } as const;
/** The largest noise density accepted, per √Hz (V/√Hz or A/√Hz): far above any amplifier's. */
export const MAX_NOISE_DENSITY = 1;
/** Gains accepted (total, per stage, of a converter's PGA): 1e-9 to 1e9. */
export const GAIN_LIMITS = { min: 1e-9, max: 1e9 } as const;
/** rms noise voltages accepted, in V: 1 fV to 1 MV. */
export const NOISE_RMS_LIMITS_VOLTS = { min: 1e-15, max: 1e6 } as const;

function outOfRange(param: string, value: number, min: number, max: number, unit: string): never {
  throw new BridgeworkError(
    'out-of-range',
    `\`${param}\` must be in [${min}, ${max}]${unit}; got ${formatValue(value)}`,
    { param, value, limit: [min, max] },
  );
}

/** A frequency in Hz, in [1e-9, 1e12]. */
export function checkHertz(param: string, value: unknown): number {
  const x = checkPositive(param, value);
  if (!(x >= FREQUENCY_LIMITS_HERTZ.min && x <= FREQUENCY_LIMITS_HERTZ.max)) {
    outOfRange(param, x, FREQUENCY_LIMITS_HERTZ.min, FREQUENCY_LIMITS_HERTZ.max, ' Hz');
  }
  return x;
}

/** A corner frequency in Hz: 0 (no 1/f part) or up to 1e12. */
export function checkCornerHertz(param: string, value: unknown): number {
  return checkRange(param, checkNonNegative(param, value), { max: FREQUENCY_LIMITS_HERTZ.max });
}

/** A noise density per √Hz, in [0, 1]. */
export function checkDensity(param: string, value: unknown): number {
  return checkRange(param, checkNonNegative(param, value), { max: MAX_NOISE_DENSITY });
}

/** A gain, in [1e-9, 1e9]. */
export function checkGain(param: string, value: unknown): number {
  const x = checkPositive(param, value);
  if (!(x >= GAIN_LIMITS.min && x <= GAIN_LIMITS.max))
    outOfRange(param, x, GAIN_LIMITS.min, GAIN_LIMITS.max, '');
  return x;
}

/** An rms noise voltage in V, in [1e-15, 1e6]. */
export function checkNoiseRmsVolts(param: string, value: unknown): number {
  const x = checkPositive(param, value);
  if (!(x >= NOISE_RMS_LIMITS_VOLTS.min && x <= NOISE_RMS_LIMITS_VOLTS.max)) {
    outOfRange(param, x, NOISE_RMS_LIMITS_VOLTS.min, NOISE_RMS_LIMITS_VOLTS.max, ' V');
  }
  return x;
}
