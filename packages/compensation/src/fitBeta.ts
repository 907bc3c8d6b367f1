import { BridgeworkError, ZERO_CELSIUS_KELVIN, checkOptions, formatValue } from '@bridgework/core';
import type { BetaThermistorOptions } from './createBetaThermistor.js';
import type { ThermistorPoint } from './fitSteinhartHart.js';
import { checkPoints } from './internal/thermistor.js';

/** Options of {@link fitBeta}. */
export interface FitBetaOptions {
  /** Exactly two points; the first becomes the reference (R0, t0). */
  readonly points: readonly ThermistorPoint[];
}

/**
 * The beta constant through two (resistance, temperature) points, e.g. B25/85 from R25 and R85.
 *
 * @remarks
 * B = ln(R1/R2)/(1/T1 − 1/T2) = ln(R1/R2)·T1·T2/(T2 − T1), T in kelvin (the data-sheet
 * definition of B_{t1/t2}), evaluated in the right-hand form (the difference of temperatures is
 * formed in °C, without cancellation). The result can be passed straight to
 * {@link createBetaThermistor}, which then reproduces both points to a few ulps.
 *
 * @param options - `points`: two calibration points at different temperatures.
 * @returns `{ referenceOhms, referenceCelsius, betaKelvin }` with the first point as reference.
 * @throws {@link @bridgework/core!BridgeworkError} `too-few-points`, `invalid-shape`; `singular` for
 *   equal temperatures; `no-solution` when B ≤ 0 (not an NTC); `out-of-range` when B exceeds
 *   1e6 K or the first point lies above 1000 °C (what {@link createBetaThermistor} accepts);
 *   `not-positive`, `out-of-range`, `not-finite`, `wrong-type` for bad numbers (resistances within
 *   `OHMS_LIMITS` of the core package); `unknown-option` for a key it does not know (naming the
 *   closest), `missing-option`.
 * @example
 * ```ts
 * fitBeta({ points: [{ ohms: 10000, temperatureCelsius: 25 }, { ohms: 1070.3, temperatureCelsius: 85 }] });
 * // { referenceOhms: 10000, referenceCelsius: 25, betaKelvin: ≈ 3977.0 }
 * ```
 */
export function fitBeta(options: FitBetaOptions): Required<Omit<BetaThermistorOptions, 'rangeCelsius'>> {
  const o = checkOptions('options', options, { known: ['points'], required: ['points'] });
  checkPoints(o['points'], 2);
  const points = o['points'] as readonly ThermistorPoint[];
  const t1 = points[0]!.temperatureCelsius;
  const t2 = points[1]!.temperatureCelsius;
  if (t1 === t2) {
    throw new BridgeworkError('singular', '`points` must be at two different temperatures', {
      param: 'points',
      value: points,
    });
  }
  const k1 = t1 + ZERO_CELSIUS_KELVIN;
  const k2 = t2 + ZERO_CELSIUS_KELVIN;
  const betaKelvin = Math.log(points[0]!.ohms / points[1]!.ohms) * k1 * (k2 / (t2 - t1));
  if (betaKelvin > 1e6 || t1 > 1000) {
    throw new BridgeworkError(
      'out-of-range',
      `\`points\` must give a beta model createBetaThermistor accepts (B ≤ 1e6 K, a reference at most 1000 °C); got B = ${formatValue(betaKelvin)} K at ${formatValue(t1)} °C`,
      { param: 'points', value: points, limit: 1e6 },
    );
  }
  if (!(betaKelvin > 0)) {
    throw new BridgeworkError(
      'no-solution',
      `\`points\` must describe an NTC (resistance falling with temperature); B = ${betaKelvin}`,
      {
        param: 'points',
        value: points,
      },
    );
  }
  return { referenceOhms: points[0]!.ohms, referenceCelsius: t1, betaKelvin };
}
