import {
  BridgeworkError,
  checkFinite,
  checkFiniteResult,
  checkGaugeFactor,
  checkOptions,
  checkRange,
  formatValue,
} from '@bridgework/core';
import { checkOptionalRange } from './internal/thermistor.js';

/** Options of {@link createThermalOutput}: a gauge lot's thermal-output polynomial. */
export interface ThermalOutputOptions {
  /**
   * Coefficients [a0, a1, …] of ε_app(T) = Σ aᵢ·Tⁱ with ε_app in µε and T in °C (so aᵢ is in
   * µε/°Cⁱ), as printed on the gauge package: one to five finite numbers (degree ≤ 4).
   */
  readonly coefficientsMicrostrain: readonly number[];
  /** The instrument gauge-factor setting at which the lot's thermal output was recorded (> 0), usually 2.00. */
  readonly gaugeFactor: number;
  /** The temperature range [min, max] in °C over which the polynomial was fitted (min < max). */
  readonly rangeCelsius: readonly [number, number];
}

/** A gauge lot's thermal output, evaluated and rescaled (see {@link createThermalOutput}). */
export interface ThermalOutput {
  /** The polynomial coefficients, µε/°Cⁱ. */
  readonly coefficientsMicrostrain: readonly number[];
  /** The gauge-factor setting the polynomial refers to. */
  readonly gaugeFactor: number;
  /** The fitted temperature range [min, max], °C. */
  readonly rangeCelsius: readonly [number, number];
  /**
   * The apparent strain at a temperature, m/m, as an instrument set to `gaugeFactorSetting`
   * (default: the polynomial's own `gaugeFactor`) would indicate it.
   *
   * @param temperatureCelsius - Gauge temperature in °C, inside `rangeCelsius`.
   * @param gaugeFactorSetting - The instrument's gauge-factor setting (> 0).
   * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` (a temperature outside
   *   `rangeCelsius`, a thermal output beyond ±1e6 µε there, a setting outside [0.01, 1000]),
   *   `not-positive`, `not-finite`, `wrong-type`.
   */
  apparentStrainAt(temperatureCelsius: number, gaugeFactorSetting?: number): number;
  /**
   * The rate of change of the apparent strain with temperature, (m/m)/K, at the polynomial's own
   * gauge factor or at `gaugeFactorSetting`.
   *
   * @param temperatureCelsius - Gauge temperature in °C, inside `rangeCelsius`.
   * @param gaugeFactorSetting - The instrument's gauge-factor setting (> 0).
   */
  slopeAt(temperatureCelsius: number, gaugeFactorSetting?: number): number;
}

/**
 * Creates the thermal-output model of a strain-gauge lot from its published polynomial.
 *
 * @remarks
 * The thermal output (apparent strain) is the strain a gauge bonded to its design material
 * indicates when only its temperature changes. Gauge packages print it as a polynomial
 * ε_app(T) = Σ aᵢ·Tⁱ (µε, T in °C, degree ≤ 4) recorded with the instrument at a stated gauge
 * factor GF_ref (common practice). The underlying resistance change GF_ref·ε_app is what the
 * gauge does, so an instrument set to GF_i indicates ε_app·GF_ref/GF_i ({@link rescaleGaugeFactor}).
 * The polynomial is evaluated by Horner's rule (backward stable: relative error about
 * 2·degree·u·Σ|aᵢTⁱ|/|ε_app|, u = 2⁻⁵³). Outside its fitted range a polynomial means nothing, so
 * temperatures outside `rangeCelsius` are rejected. The curve holds only for the material and
 * lot it was recorded on; use {@link correctTemperatureEffects} to apply it to a reading.
 *
 * @param options - Coefficients in µε/°Cⁱ, the reference gauge factor, the fitted range.
 * @returns An evaluator of the apparent strain and its slope.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` unless there are one to five
 *   coefficients or `rangeCelsius` holds two numbers; `out-of-range` when min ≥ max, for a range
 *   reaching −273.15 °C, or a gauge factor outside [0.01, 1000]; `not-positive`, `not-finite`,
 *   `wrong-type` for bad numbers; `unknown-option` for a key it does not know (naming the
 *   closest), `missing-option` for a required one.
 * @example
 * ```ts
 * const to = createThermalOutput({
 *   coefficientsMicrostrain: [-30.5, 2.61, -5.7e-2, 2.9e-4, -4.1e-7],
 *   gaugeFactor: 2,
 *   rangeCelsius: [-30, 200],
 * });
 * to.apparentStrainAt(100); // ≈ -9.05e-5 (−90.5 µε at GF 2.00)
 * to.apparentStrainAt(100, 2.1); // ≈ -8.619e-5 (−86.19 µε as read at GF 2.10)
 * ```
 */
export function createThermalOutput(options: ThermalOutputOptions): ThermalOutput {
  const o = checkOptions('options', options, {
    known: ['coefficientsMicrostrain', 'gaugeFactor', 'rangeCelsius'],
    required: ['coefficientsMicrostrain', 'gaugeFactor', 'rangeCelsius'],
  });
  const raw = o['coefficientsMicrostrain'];
  if (!Array.isArray(raw) || raw.length < 1 || raw.length > 5) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`coefficientsMicrostrain\` must be an array of one to five numbers (degree ≤ 4); got ${formatValue(raw)}`,
      { param: 'coefficientsMicrostrain', value: raw, limit: [1, 5] },
    );
  }
  const coefficients = Object.freeze(
    raw.map((a: unknown, i) => checkFinite(`coefficientsMicrostrain[${i}]`, a)),
  ) as readonly number[];
  const gaugeFactor = checkGaugeFactor('gaugeFactor', o['gaugeFactor']);
  // Required above, so never undefined here.
  const rangeCelsius = checkOptionalRange(o['rangeCelsius']) as readonly [number, number];
  const limits = { min: rangeCelsius[0], max: rangeCelsius[1] };
  // The same coefficients as unboxed doubles for evaluation (a frozen array's elements are boxed).
  const horner = Float64Array.from(coefficients);
  const degree = horner.length - 1;

  /** Strain in m/m (divided by the exact 10⁶), at the lot's gauge factor or rescaled to a setting. */
  function rescale(microstrain: number, gaugeFactorSetting: unknown): number {
    const strain = microstrain / 1e6;
    if (gaugeFactorSetting === undefined) return strain;
    return (strain * gaugeFactor) / checkGaugeFactor('gaugeFactorSetting', gaugeFactorSetting);
  }

  return {
    coefficientsMicrostrain: coefficients,
    gaugeFactor,
    rangeCelsius,
    apparentStrainAt(temperatureCelsius: number, gaugeFactorSetting?: number): number {
      // In range, one comparison each (this runs per Monte Carlo trial); otherwise the full check throws.
      const t =
        typeof temperatureCelsius === 'number' &&
        temperatureCelsius >= limits.min &&
        temperatureCelsius <= limits.max
          ? temperatureCelsius
          : checkRange('temperatureCelsius', temperatureCelsius, limits);
      let sum = 0;
      for (let i = degree; i >= 0; i--) sum = sum * t + (horner[i] as number);
      if (!(Math.abs(sum) < 1e6)) {
        throw new BridgeworkError(
          'out-of-range',
          `\`temperatureCelsius\` must be a temperature at which the lot's thermal output lies within ±1e6 µε (1 m/m); got ${formatValue(t)} (${formatValue(sum)} µε)`,
          { param: 'temperatureCelsius', value: t },
        );
      }
      return rescale(sum, gaugeFactorSetting);
    },
    slopeAt(temperatureCelsius: number, gaugeFactorSetting?: number): number {
      const t = checkRange('temperatureCelsius', temperatureCelsius, limits);
      let sum = 0;
      for (let i = coefficients.length - 1; i >= 1; i--) sum = sum * t + i * (coefficients[i] as number);
      return checkFiniteResult(rescale(sum, gaugeFactorSetting), {
        what: "the thermal output's slope",
        param: 'temperatureCelsius',
        value: t,
      });
    },
  };
}
