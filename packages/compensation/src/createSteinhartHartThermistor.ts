import {
  BridgeworkError,
  OHMS_LIMITS,
  ZERO_CELSIUS_KELVIN,
  checkFinite,
  checkFiniteResult,
  checkOhms,
  checkOptions,
  checkPositive,
  formatValue,
} from '@bridgework/core';
import type { Thermistor } from './thermistor.js';
import {
  beyondOhms,
  checkComputedTemperature,
  checkOptionalRange,
  checkTemperature,
  unreachableOhms,
} from './internal/thermistor.js';

const LN_MIN_OHMS = Math.log(OHMS_LIMITS.min);
const LN_MAX_OHMS = Math.log(OHMS_LIMITS.max);

/** The three Steinhart–Hart coefficients: 1/T = a + b·ln R + c·(ln R)³, T in K, R in Ω. */
export interface SteinhartHartCoefficients {
  /** a in 1/K. */
  readonly a: number;
  /** b in 1/K (> 0 for an NTC). */
  readonly b: number;
  /** c in 1/K. */
  readonly c: number;
}

/** Options of {@link createSteinhartHartThermistor}. */
export interface SteinhartHartOptions extends SteinhartHartCoefficients {
  /** The temperature range [min, max] in °C the coefficients were fitted over; outside it the model is rejected. */
  readonly rangeCelsius?: readonly [number, number];
}

/** Newton polish steps after the closed-form cubic root (one is enough; the rest guard edge cases). */
const POLISH_STEPS = 3;

/**
 * Creates an NTC thermistor model from Steinhart–Hart coefficients.
 *
 * @remarks
 * Steinhart & Hart (Deep-Sea Research 15, 1968): 1/T = a + b·u + c·u³ with u = ln(R/1 Ω) and T in
 * kelvin. Temperature from resistance is that closed form. Resistance from temperature solves
 * the cubic c·u³ + b·u + (a − 1/T) = 0 in closed form: with p = b/c and q = (a − 1/T)/c, for
 * c > 0 (one real root) u = −2·√(p/3)·sinh(asinh((3q/2p)·√(3/p))/3), and for c < 0 the root
 * between the cubic's turning points, u = 2·√(−p/3)·cos(acos((3q/2p)·√(−3/p))/3 − 2π/3) (the
 * hyperbolic and trigonometric solutions of the depressed cubic, which avoid the cancellation of
 * Cardano's formula); c = 0 gives u = (1/T − a)/b. A Newton step on the cubic then polishes the
 * root to within an ulp or two. The model must be monotone: b > 0, and for c < 0 only
 * |u| < √(−b/(3c)) is used (a resistance outside that band is `no-solution`). Typical fits
 * reproduce real NTCs to a few millikelvin over 100 K; the model is no better than its fit, so
 * state `rangeCelsius`.
 *
 * @param options - a, b, c and the optional range.
 * @returns The thermistor evaluator.
 * Domain: the evaluator accepts the temperatures (inside `rangeCelsius`, when given) at which
 * R lies within `OHMS_LIMITS` of the core package (1 nΩ … 1 PΩ), and resistances within those
 * limits, so every result is finite.
 *
 * @throws {@link @bridgework/core!BridgeworkError} `not-positive` for b ≤ 0; `not-finite`,
 *   `wrong-type`, `out-of-range`, `invalid-shape` for bad numbers or range; `unknown-option` for
 *   a key it does not know (naming the closest), `missing-option` without `a`, `b` or `c`.
 * @example
 * ```ts
 * const ntc = createSteinhartHartThermistor({ a: 1.129241e-3, b: 2.341077e-4, c: 8.775468e-8 });
 * ntc.temperatureAt(10e3); // ≈ 24.99997 °C
 * ntc.ohmsAt(25); // ≈ 9999.986 Ω
 * ```
 */
export function createSteinhartHartThermistor(options: SteinhartHartOptions): Thermistor {
  const o = checkOptions('options', options, {
    known: ['a', 'b', 'c', 'rangeCelsius'],
    required: ['a', 'b', 'c'],
  });
  const a = checkFinite('a', o['a']);
  const b = checkPositive('b', o['b']);
  const c = checkFinite('c', o['c']);
  const rangeCelsius = checkOptionalRange(o['rangeCelsius']);
  // For c < 0 the model is monotone only for |u| < uMax.
  const uMax = c < 0 ? Math.sqrt(-b / (3 * c)) : Infinity;

  function lnOhmsAt(temperatureCelsius: number): number {
    const t = checkTemperature(temperatureCelsius, rangeCelsius);
    const y = 1 / (t + ZERO_CELSIUS_KELVIN);
    let u: number;
    if (c === 0) {
      u = (y - a) / b;
    } else {
      const p = b / c;
      const q = (a - y) / c;
      if (c > 0) {
        const m = Math.sqrt(p / 3);
        u = -2 * m * Math.sinh(Math.asinh((1.5 * q) / (p * m)) / 3);
      } else {
        const m = Math.sqrt(-p / 3);
        const z = (1.5 * q) / (p * m);
        if (!(Math.abs(z) <= 1)) throw noTemperature(temperatureCelsius);
        u = 2 * m * Math.cos(Math.acos(z) / 3 - (2 * Math.PI) / 3);
      }
    }
    for (let i = 0; i < POLISH_STEPS; i++) {
      const slope = b + 3 * c * u * u;
      if (!(slope > 0)) break;
      const step = (a + u * (b + c * u * u) - y) / slope;
      u -= step;
      if (Math.abs(step) <= 1e-16 * Math.abs(u)) break;
    }
    if (!(Math.abs(u) < uMax) || !Number.isFinite(u)) throw noTemperature(temperatureCelsius);
    if (!(u >= LN_MIN_OHMS && u <= LN_MAX_OHMS)) throw beyondOhms(t, Math.exp(u), '');
    return u;
  }

  return {
    rangeCelsius,
    ohmsAt(temperatureCelsius: number): number {
      return Math.exp(lnOhmsAt(temperatureCelsius));
    },
    temperatureAt(ohms: number): number {
      const r = checkOhms('ohms', ohms);
      const u = Math.log(r);
      if (!(Math.abs(u) < uMax)) throw unreachableOhms(r, 'outside the band where the model is monotone');
      const y = a + u * (b + c * u * u);
      if (!(y > 0)) throw unreachableOhms(r, 'it would need T ≤ 0 K');
      return checkComputedTemperature(r, 1 / y - ZERO_CELSIUS_KELVIN, rangeCelsius);
    },
    slopeAt(temperatureCelsius: number): number {
      const u = lnOhmsAt(temperatureCelsius);
      const kelvin = temperatureCelsius + ZERO_CELSIUS_KELVIN;
      return checkFiniteResult(-Math.exp(u) / kelvin / (kelvin * (b + 3 * c * u * u)), {
        what: 'the slope',
        param: 'temperatureCelsius',
        value: temperatureCelsius,
      });
    },
  };
}

function noTemperature(temperatureCelsius: number): BridgeworkError {
  return new BridgeworkError(
    'no-solution',
    `\`temperatureCelsius\` must be one the model reaches on its monotone branch; got ${formatValue(temperatureCelsius)}`,
    { param: 'temperatureCelsius', value: temperatureCelsius },
  );
}
