import {
  OHMS_LIMITS,
  ZERO_CELSIUS_KELVIN,
  checkFinite,
  checkOhms,
  checkOptions,
  checkPositive,
  checkRange,
} from '@bridgework/core';
import type { Thermistor } from './thermistor.js';
import {
  beyondOhms,
  checkComputedTemperature,
  checkOptionalRange,
  checkTemperature,
  unreachableOhms,
} from './internal/thermistor.js';

/** The largest beta constant accepted, K (data sheets give 2000 to 6000 K). */
const MAX_BETA_KELVIN = 1e6;
/** The highest reference temperature accepted, °C (data sheets use 25 °C). */
const MAX_REFERENCE_CELSIUS = 1000;

/** Options of {@link createBetaThermistor}. */
export interface BetaThermistorOptions {
  /** Resistance R0 at the reference temperature, Ω, in [1e-9, 1e15]: the "R25" of a data sheet. */
  readonly referenceOhms: number;
  /** The reference temperature t0, °C, in (−273.15, 1000]. Default 25. */
  readonly referenceCelsius?: number;
  /** The beta (B) constant in K, in (0, 1e6], e.g. the B25/85 of a data sheet. */
  readonly betaKelvin: number;
  /** The temperature range [min, max] in °C over which B holds; outside it the model is rejected. */
  readonly rangeCelsius?: readonly [number, number];
}

/**
 * Creates an NTC thermistor model from its beta constant.
 *
 * @remarks
 * The beta model R(T) = R0·exp(B·(1/T − 1/T0)), T in kelvin (the Arrhenius form on every NTC
 * data sheet). It is evaluated as R0·exp(B·(T0 − T)/(T·T0)), which keeps full precision near T0;
 * the inverse t = t0 − T0²·L/(B + T0·L), L = ln(R/R0), is the exact closed form of
 * 1/T = 1/T0 + L/B rearranged so that no subtraction cancels. Both directions are within a few
 * ulps. The beta model is a two-parameter approximation of a real thermistor (errors of a few
 * tenths of a kelvin over wide ranges are typical); use Steinhart–Hart
 * ({@link createSteinhartHartThermistor}) for better accuracy, and state `rangeCelsius` (the range
 * B was specified over) so that the model is not extrapolated.
 *
 * @param options - R0, t0, B and the optional range.
 * @returns The thermistor evaluator.
 * Domain: the evaluator accepts the temperatures (inside `rangeCelsius`, when given) at which
 * R lies within `OHMS_LIMITS` of the core package (1 nΩ … 1 PΩ), so every result is finite; the
 * resistance tends to 1 PΩ as the temperature falls toward absolute zero, which is refused there
 * rather than returned as +∞.
 *
 * @throws {@link @bridgework/core!BridgeworkError} `not-positive`, `not-finite`, `wrong-type`,
 *   `out-of-range` (t0 or a range below absolute zero, t0 above 1000 °C, B above 1e6 K, R0
 *   outside `OHMS_LIMITS`), `invalid-shape` (range); `unknown-option` for a key it does not know
 *   (naming the closest), `missing-option` without `referenceOhms` or `betaKelvin`.
 * @example
 * ```ts
 * const ntc = createBetaThermistor({ referenceOhms: 10e3, betaKelvin: 3977 });
 * ntc.ohmsAt(0); // ≈ 33900.4 Ω
 * ntc.temperatureAt(10e3); // 25
 * ```
 */
export function createBetaThermistor(options: BetaThermistorOptions): Thermistor {
  const o = checkOptions('options', options, {
    known: ['referenceOhms', 'referenceCelsius', 'betaKelvin', 'rangeCelsius'],
    required: ['referenceOhms', 'betaKelvin'],
  });
  const referenceOhms = checkOhms('referenceOhms', o['referenceOhms']);
  const t0 =
    o['referenceCelsius'] === undefined
      ? 25
      : checkRange(
          'referenceCelsius',
          checkTemperature(o['referenceCelsius'], undefined, 'referenceCelsius'),
          { max: MAX_REFERENCE_CELSIUS },
        );
  const beta = checkRange('betaKelvin', checkPositive('betaKelvin', o['betaKelvin']), {
    max: MAX_BETA_KELVIN,
  });
  const rangeCelsius = checkOptionalRange(o['rangeCelsius']);
  const kelvin0 = t0 + ZERO_CELSIUS_KELVIN;

  // 1/T = 1/T0 + ln(R/R0)/B: the temperatures at which R reaches the resistance limits.
  const yHigh = 1 / kelvin0 + Math.log(OHMS_LIMITS.max / referenceOhms) / beta;
  const yLow = 1 / kelvin0 + Math.log(OHMS_LIMITS.min / referenceOhms) / beta;
  const coldest = 1 / yHigh - ZERO_CELSIUS_KELVIN;
  const hottest = yLow > 0 ? 1 / yLow - ZERO_CELSIUS_KELVIN : Infinity;
  const domain = ` (${coldest.toPrecision(6)} °C and above${hottest === Infinity ? '' : `, up to ${hottest.toPrecision(6)} °C`})`;

  function ohmsAt(temperatureCelsius: number): number {
    const t = checkTemperature(temperatureCelsius, rangeCelsius);
    const kelvin = t + ZERO_CELSIUS_KELVIN;
    // B·(t0 − t)/(T·T0), in an order that cannot overflow for any accepted t.
    const ohms = referenceOhms * Math.exp((beta / kelvin0) * ((t0 - t) / kelvin));
    if (!(ohms >= OHMS_LIMITS.min && ohms <= OHMS_LIMITS.max)) throw beyondOhms(t, ohms, domain);
    return ohms;
  }

  return {
    rangeCelsius,
    ohmsAt,
    temperatureAt(ohms: number): number {
      const r = checkOhms('ohms', ohms);
      const l = Math.log(r / referenceOhms);
      const denominator = beta + kelvin0 * l;
      if (!(denominator > 0)) throw unreachableOhms(r, 'it would need T ≤ 0 K');
      return checkComputedTemperature(r, t0 - (kelvin0 * kelvin0 * l) / denominator, rangeCelsius);
    },
    slopeAt(temperatureCelsius: number): number {
      const r = ohmsAt(temperatureCelsius);
      const kelvin = checkFinite('temperatureCelsius', temperatureCelsius) + ZERO_CELSIUS_KELVIN;
      return ((-beta / kelvin) * r) / kelvin;
    },
  };
}
