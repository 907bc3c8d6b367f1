/**
 * The calibration check of the sensor kinds' budget sides (imported by them only, so the
 * conversion path does not carry it): what a budget holds of the sensor's own tolerances.
 */
import { formatSignificant } from '../units/quantity.js';
import type { SensorCalibrationCheck } from './SensorKind.js';

/**
 * A tolerance fraction as the check names it: `<what> ±x % (<path>)`.
 *
 * @param what - The tolerance in words ("the gauge factor's tolerance").
 * @param fraction - Its half-width as a fraction.
 * @param path - The field that holds it.
 * @returns The phrase.
 */
export function toleranceText(what: string, fraction: number, path: string): string {
  return `${what} ±${formatSignificant(fraction * 100)}\u00a0% (${path})`;
}

/**
 * The check of one tolerance fraction: held (a pass) when it is above 0, else the warning `lacks`.
 *
 * @param fraction - The tolerance's half-width as a fraction.
 * @param path - The field that holds it.
 * @param what - The tolerance in words, for the pass.
 * @param lacks - What the budget lacks and how to fill it in, for the warning.
 * @returns The check.
 */
export function toleranceFractionCheck(
  fraction: number,
  path: string,
  what: string,
  lacks: string,
): SensorCalibrationCheck {
  return {
    holds: fraction > 0,
    value: fraction,
    unit: '',
    path,
    message: fraction > 0 ? `the budget holds ${toleranceText(what, fraction, path)}` : lacks,
  };
}
