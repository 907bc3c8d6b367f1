import {
  BridgeworkError,
  GAUGE_FACTOR_LIMITS,
  checkCelsius,
  checkFinite,
  checkGaugeFactor,
  checkOptions,
  formatValue,
} from '@bridgework/core';

/** Options of {@link gaugeFactorAt}. */
export interface GaugeFactorAtOptions {
  /** Gauge factor GF0 at the reference temperature (> 0), as stated on the gauge package. */
  readonly gaugeFactor: number;
  /**
   * Temperature coefficient of the gauge factor β in 1/K (finite). Gauge data sheets state it in
   * %/100 K: +1.0 %/100 K is 1.0e-4 /K.
   */
  readonly temperatureCoefficientPerKelvin: number;
  /** The temperature T0 at which GF0 holds, °C (data sheets usually state room temperature). */
  readonly referenceCelsius: number;
  /** The gauge temperature T, °C. */
  readonly temperatureCelsius: number;
}

/**
 * The gauge factor of a strain gauge at a temperature, from its temperature coefficient.
 *
 * @remarks
 * GF(T) = GF0·(1 + β·(T − T0)), the linear model in which gauge manufacturers state the
 * variation (common practice). Exact evaluation of that model (two roundings). The result must be
 * positive.
 *
 * @param options - GF0, β, T0 and T.
 * @returns The gauge factor at T (dimensionless, > 0).
 * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` when the model gives a gauge
 *   factor outside [0.01, 1000] (`GAUGE_FACTOR_LIMITS`, GF(T) ≤ 0 included), a gauge factor outside
 *   them, or a temperature at or below −273.15 °C; `not-positive`, `not-finite`, `wrong-type` for
 *   bad numbers;
 *   `unknown-option` for a key it does not know (naming the closest), `missing-option` for a
 *   required one.
 * @example
 * ```ts
 * gaugeFactorAt({ gaugeFactor: 2.05, temperatureCoefficientPerKelvin: 1.1e-4, referenceCelsius: 24, temperatureCelsius: 124 });
 * // ≈ 2.07255 (+1.1 % over 100 K)
 * ```
 */
export function gaugeFactorAt(options: GaugeFactorAtOptions): number {
  const o = checkOptions('options', options, {
    known: ['gaugeFactor', 'temperatureCoefficientPerKelvin', 'referenceCelsius', 'temperatureCelsius'],
    required: ['gaugeFactor', 'temperatureCoefficientPerKelvin', 'referenceCelsius', 'temperatureCelsius'],
  });
  const gaugeFactor = checkGaugeFactor('gaugeFactor', o['gaugeFactor']);
  const beta = checkFinite('temperatureCoefficientPerKelvin', o['temperatureCoefficientPerKelvin']);
  const referenceCelsius = checkCelsius('referenceCelsius', o['referenceCelsius']);
  const temperatureCelsius = checkCelsius('temperatureCelsius', o['temperatureCelsius']);
  const result = gaugeFactor * (1 + beta * (temperatureCelsius - referenceCelsius));
  if (!(result >= GAUGE_FACTOR_LIMITS.min && result <= GAUGE_FACTOR_LIMITS.max)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`temperatureCelsius\` must keep the gauge factor GF·(1 + β·(T − T0)) in [${GAUGE_FACTOR_LIMITS.min}, ${GAUGE_FACTOR_LIMITS.max}]; got ${formatValue(temperatureCelsius)} (GF would be ${formatValue(result)})`,
      {
        param: 'temperatureCelsius',
        value: temperatureCelsius,
        limit: [GAUGE_FACTOR_LIMITS.min, GAUGE_FACTOR_LIMITS.max],
      },
    );
  }
  return result;
}
