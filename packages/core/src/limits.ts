import { BridgeworkError } from './BridgeworkError.js';
import {
  checkFinite,
  checkNonNegative,
  checkOptions,
  checkPositive,
  checkWithin,
  formatValue,
  type CheckPositiveOptions,
  type RangeLimits,
} from './checks.js';
import type { Interval } from './Interval.js';

/**
 * The physical domains bridgework accepts (resistances, voltages, gauge factors, temperatures,
 * strains) and their checks: inside them every result of the exact formulas is finite.
 */

function fail(
  code: ConstructorParameters<typeof BridgeworkError>[0],
  param: string,
  requirement: string,
  value: unknown,
  limit?: number | readonly number[],
): never {
  throw new BridgeworkError(code, `\`${param}\` must be ${requirement}; got ${formatValue(value)}`, {
    param,
    value,
    ...(limit === undefined ? {} : { limit }),
  });
}

/**
 * Checks that `value` is a strain in m/m strictly inside (−1, 1) and returns it.
 *
 * @remarks
 * The one domain of a strain given to bridgework outside a bridge (whose own range follows from
 * its gauges): no bonded gauge survives ±100 % strain, and a value of 1 or more is almost always
 * a microstrain given where a strain was expected.
 *
 * @param param - The option name used in the message.
 * @param value - The value to check.
 * @returns `value`, typed as a number.
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`, or `out-of-range` (with `limit` = [−1, 1]).
 * @example
 * ```ts
 * checkStrain('strain', 1e-3); // 0.001
 * // checkStrain('strain', 1000) throws out-of-range: "use strainFromMicrostrain for µε"
 * ```
 */
export function checkStrain(param: string, value: unknown): number {
  const strain = checkFinite(param, value);
  if (!(Math.abs(strain) < 1)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`${param}\` must be a strain in m/m in (-1, 1) (use strainFromMicrostrain for µε); got ${formatValue(strain)}`,
      { param, value: strain, limit: [-1, 1] },
    );
  }
  return strain;
}

/**
 * The resistances bridgework accepts, in Ω: 1 nΩ to 1 PΩ (every gauge, RTD, thermistor, lead,
 * completion, shunt, source and meter resistance of a real instrument lies far inside).
 *
 * @remarks
 * Bounding resistances keeps every product the exact network formulas form (up to the cube of a
 * resistance) and every current and power inside binary64, so an accepted resistance never gives
 * a non-finite result. Zero (a lead or source of no resistance) and +∞ (an ideal meter) are
 * accepted where an option says so.
 */
export const OHMS_LIMITS: Readonly<Interval> = Object.freeze({ min: 1e-9, max: 1e15 });

const ALLOW_INFINITY: CheckPositiveOptions = Object.freeze({ allowInfinity: true });

/** Options of {@link checkOhms}. */
export interface CheckOhmsOptions {
  /** Accept 0 (a lead or source without resistance). Default false. */
  readonly allowZero?: boolean;
  /** Accept +∞ (an open circuit, such as an ideal meter). Default false. */
  readonly allowInfinity?: boolean;
}

/**
 * Checks that `value` is a resistance in Ω inside {@link OHMS_LIMITS} (with `allowZero`, anywhere
 * in [0, 1e15]; with `allowInfinity`, also +∞) and returns it.
 *
 * @param param - The option name used in the message.
 * @param value - The value to check.
 * @param options - `allowZero`, `allowInfinity`.
 * @returns `value`, typed as a number.
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`; `not-positive` (or `negative` with
 *   `allowZero`); `out-of-range` outside [1e-9, 1e15] Ω ([0, 1e15] Ω with `allowZero`).
 * @example
 * ```ts
 * checkOhms('gaugeOhms', 350); // 350
 * checkOhms('ohmsPerLead', 0, { allowZero: true }); // 0
 * ```
 */
export function checkOhms(param: string, value: unknown, options?: CheckOhmsOptions): number {
  let allowZero = false;
  let allowInfinity = false;
  if (options !== undefined) {
    const o = checkOptions('options', options, { known: ['allowZero', 'allowInfinity'] });
    for (const flag of ['allowZero', 'allowInfinity']) {
      if (o[flag] !== undefined && typeof o[flag] !== 'boolean') {
        fail('wrong-type', `options.${flag}`, 'a boolean', o[flag]);
      }
    }
    allowZero = o['allowZero'] === true;
    allowInfinity = o['allowInfinity'] === true;
  }
  const x = allowZero
    ? value === Infinity && allowInfinity
      ? Infinity
      : checkNonNegative(param, value)
    : allowInfinity
      ? checkPositive(param, value, ALLOW_INFINITY)
      : checkPositive(param, value);
  if (x === Infinity) return x;
  // A resistance that may be 0 only adds to others, so any small value is harmless.
  const min = allowZero ? 0 : OHMS_LIMITS.min;
  if (!(x >= min && x <= OHMS_LIMITS.max)) {
    const open = allowInfinity ? ' or Infinity' : '';
    fail('out-of-range', param, `a resistance in [${min}, ${OHMS_LIMITS.max}] Ω${open}`, value, [
      min,
      OHMS_LIMITS.max,
    ]);
  }
  return x;
}

/**
 * The gauge factors bridgework accepts: 0.01 to 1000 (metal-foil and wire gauges are near 2,
 * semiconductor gauges up to about 200).
 */
export const GAUGE_FACTOR_LIMITS: Readonly<Interval> = Object.freeze({
  min: 0.01,
  max: 1000,
});

/**
 * Checks that `value` is a gauge factor in {@link GAUGE_FACTOR_LIMITS} and returns it.
 *
 * @param param - The option name used in the message.
 * @param value - The value to check.
 * @returns `value`, typed as a number.
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`, `not-positive`; `out-of-range`
 *   outside [0.01, 1000].
 * @example
 * ```ts
 * checkGaugeFactor('gaugeFactor', 2.1); // 2.1
 * ```
 */
export function checkGaugeFactor(param: string, value: unknown): number {
  return checkWithin(param, checkPositive(param, value), GAUGE_FACTOR_LIMITS);
}

/** Above absolute zero, in °C (for {@link checkCelsius}). */
const ABOVE_ABSOLUTE_ZERO: RangeLimits = Object.freeze({ min: -273.15, minExclusive: true });

/**
 * Checks that `value` is a temperature in °C above absolute zero (> −273.15) and returns it.
 *
 * @param param - The option name used in the message.
 * @param value - The value to check.
 * @returns `value`, typed as a number.
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`; `out-of-range` at or below −273.15 °C.
 * @example
 * ```ts
 * checkCelsius('temperatureCelsius', 25); // 25
 * ```
 */
export function checkCelsius(param: string, value: unknown): number {
  return checkWithin(param, value, ABOVE_ABSOLUTE_ZERO);
}

/**
 * The voltages bridgework accepts, in V: magnitudes up to 1 MV, and at least 1 nV where a voltage
 * must be positive (an excitation, a reference).
 *
 * @remarks
 * With {@link OHMS_LIMITS} this keeps every current, power and count a bridge channel forms inside
 * binary64.
 */
export const VOLTS_LIMITS: Readonly<Interval> = Object.freeze({ min: 1e-9, max: 1e6 });

/** Either sign, |v| ≤ VOLTS_LIMITS.max (for {@link checkVolts} with `signed`). */
const SIGNED_VOLTS: RangeLimits = Object.freeze({ min: -VOLTS_LIMITS.max, max: VOLTS_LIMITS.max });

/** Options of {@link checkVolts}. */
export interface CheckVoltsOptions {
  /** Accept either sign (a node voltage, a reading): |v| ≤ 1e6 V. Default false: v in [1e-9, 1e6] V. */
  readonly signed?: boolean;
}

/**
 * Checks that `value` is a voltage inside {@link VOLTS_LIMITS} and returns it: positive in
 * [1e-9, 1e6] V, or with `signed` any value of magnitude up to 1e6 V.
 *
 * @param param - The option name used in the message.
 * @param value - The value to check.
 * @param options - `signed`.
 * @returns `value`, typed as a number.
 * @throws {@link BridgeworkError} `wrong-type`, `not-finite`; `not-positive` (unsigned);
 *   `out-of-range` beyond the limits.
 * @example
 * ```ts
 * checkVolts('excitationVolts', 5); // 5
 * checkVolts('commonModeVolts', -2.5, { signed: true }); // -2.5
 * ```
 */
export function checkVolts(param: string, value: unknown, options?: CheckVoltsOptions): number {
  let signed = false;
  if (options !== undefined) {
    const s = checkOptions('options', options, { known: ['signed'] })['signed'];
    if (s !== undefined && typeof s !== 'boolean') fail('wrong-type', 'options.signed', 'a boolean', s);
    signed = s === true;
  }
  if (signed) return checkWithin(param, value, SIGNED_VOLTS);
  return checkWithin(param, checkPositive(param, value), VOLTS_LIMITS);
}
