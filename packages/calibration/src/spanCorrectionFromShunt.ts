import { BridgeworkError, checkNonNegative, checkOptions, checkRange, formatValue } from '@bridgework/core';
import type { CheckResult } from './checkResult.js';
import { MAGNITUDE_LIMIT, checkBoundedArray, checkNonZero, finiteResult } from './internal/checks.js';

function conflict(param: string, message: string): never {
  throw new BridgeworkError('conflicting-options', message, { param });
}

/** Options of {@link spanCorrectionFromShunt}. */
export interface SpanCorrectionOptions {
  /**
   * The step the shunt should give through the exact network, in the channel's reading unit (V/V,
   * or converter codes): from {@link shuntRatios}, {@link ratioChangeFromShunt} or the channel's
   * model. Non-zero, magnitude ≤ 1e100.
   */
  readonly expectedStep: number;
  /** Standard uncertainty of `expectedStep` (≥ 0; from the shunt's tolerance, say), same unit. Default 0. */
  readonly expectedStepStandardUncertainty?: number;
  /** The measured step (reading with the shunt minus reading without it), same unit. Excludes the sample arrays. */
  readonly measuredStep?: number;
  /** Standard uncertainty of `measuredStep` (≥ 0), when it is given as one number. */
  readonly measuredStepStandardUncertainty?: number;
  /** Readings without the shunt (one or more samples of a short recording). With `shuntedReadings`. */
  readonly zeroReadings?: readonly number[];
  /** Readings with the shunt connected (one or more samples). With `zeroReadings`. */
  readonly shuntedReadings?: readonly number[];
  /**
   * Largest |span error| that passes the plausibility check, as a fraction (in (0, 1)). Default
   * 0.05: a larger mismatch usually means a wrong shunt, arm, placement or cable model rather
   * than a gain to be corrected.
   */
  readonly plausibleSpanErrorFraction?: number;
}

/** A span correction from a shunt step (see {@link spanCorrectionFromShunt}). */
export interface SpanCorrection {
  /** The span factor k = expected step / measured step: multiply a reading's change from zero by k. */
  readonly factor: number;
  /** Standard uncertainty of k (`undefined` when neither step's uncertainty is known). */
  readonly factorStandardUncertainty: number | undefined;
  /** The span error of the channel before correction, measured/expected − 1, as a fraction. */
  readonly spanErrorFraction: number;
  /** The measured step used, reading unit. */
  readonly measuredStep: number;
  /** Its standard uncertainty (`undefined` when not known: one sample each and none given). */
  readonly measuredStepStandardUncertainty: number | undefined;
  /** The expected step used, reading unit. */
  readonly expectedStep: number;
  /**
   * A reading corrected for the span: zero + k·(reading − zero).
   *
   * @param reading - The reading, in the reading unit.
   * @param zeroReading - The channel's zero reading, same unit. Default 0.
   */
  correct(reading: number, zeroReading?: number): number;
}

const mean = (xs: readonly number[]): number => xs.reduce((s, x) => s + x / xs.length, 0);
/** Type A standard uncertainty of a mean, s/√n (JCGM 100:2008, 4.2.3); undefined for one sample. */
function uncertaintyOfMean(xs: readonly number[]): number | undefined {
  if (xs.length < 2) return undefined;
  const m = mean(xs);
  const ss = xs.reduce((s, x) => s + (x - m) ** 2, 0);
  return Math.sqrt(ss / (xs.length - 1) / xs.length);
}

/**
 * The span correction a measured shunt step calls for: the factor that makes the channel read the
 * step the exact network model predicts.
 *
 * @remarks
 * A linear channel indicates a change of its input as g·Δ, with g its gain relative to the model
 * (lead desensitization, gauge factor, amplifier and reference errors together). The shunt's step
 * through the exact network is Δ_exp; the channel reads Δ_meas = g·Δ_exp, so g = Δ_meas/Δ_exp and
 * every change from zero is corrected by k = 1/g = Δ_exp/Δ_meas:
 *
 *   corrected = zero + k·(reading − zero),  span error = Δ_meas/Δ_exp − 1.
 *
 * (Shunt calibration as a span check of a strain channel: common practice; the quotient of two
 * readings of one linear channel, derived here.) The correction is exact for gain errors; it
 * cannot correct a nonlinearity or an error that the shunt does not pass through (a gauge
 * factor error when the shunt is at the instrument end, for example).
 *
 * With sample arrays the measured step is the difference of the two means; each mean's standard
 * uncertainty is s/√n (Type A, JCGM 100:2008 4.2.3), combined in quadrature, which assumes
 * uncorrelated noise and no drift between the two recordings. The factor's uncertainty follows the
 * law of propagation for a quotient (JCGM 100:2008 5.1.6): u(k)/k = √((u(Δ_exp)/Δ_exp)² +
 * (u(Δ_meas)/Δ_meas)²).
 *
 * The result is a check: `ok` is false (with the reason) when the measured step has the opposite
 * sign to the expected one (a shunt on the wrong arm or reversed signal leads) or the span error
 * exceeds `plausibleSpanErrorFraction`; the figures are returned either way.
 *
 * @param options - The expected step and the measured step (one number, or the two recordings).
 * @returns `{ ok, value, issues }` with the span factor, span error and their uncertainties.
 * @throws {@link @bridgework/core!BridgeworkError} `unknown-option`, `missing-option` by the options
 *   rule; `conflicting-options` for both `measuredStep` and sample arrays, or neither;
 *   `out-of-range` for a zero step or a value beyond ±1e100; `not-finite`, `wrong-type`,
 *   `negative`, `invalid-shape` for bad numbers or arrays.
 * @example
 * ```ts
 * const c = spanCorrectionFromShunt({ expectedStep: -1e-3, measuredStep: -0.9915e-3 });
 * c.value.factor; // ≈ 1.00857
 * c.value.spanErrorFraction; // ≈ -0.0085
 * c.value.correct(0.5e-3); // ≈ 0.50429e-3
 * ```
 */
export function spanCorrectionFromShunt(options: SpanCorrectionOptions): CheckResult<SpanCorrection> {
  const o = checkOptions('options', options, {
    known: [
      'expectedStep',
      'expectedStepStandardUncertainty',
      'measuredStep',
      'measuredStepStandardUncertainty',
      'zeroReadings',
      'shuntedReadings',
      'plausibleSpanErrorFraction',
    ],
    required: ['expectedStep'],
  });
  const bounded = (param: string, v: unknown): number =>
    checkRange(param, v, { min: -MAGNITUDE_LIMIT, max: MAGNITUDE_LIMIT });
  const expected = bounded('expectedStep', checkNonZero('expectedStep', o['expectedStep']));
  const uExpected =
    o['expectedStepStandardUncertainty'] === undefined
      ? 0
      : bounded(
          'expectedStepStandardUncertainty',
          checkNonNegative('expectedStepStandardUncertainty', o['expectedStepStandardUncertainty']),
        );
  const plausible =
    o['plausibleSpanErrorFraction'] === undefined
      ? 0.05
      : checkRange('plausibleSpanErrorFraction', o['plausibleSpanErrorFraction'], {
          min: 0,
          max: 1,
          minExclusive: true,
          maxExclusive: true,
        });
  const samples = o['zeroReadings'] !== undefined || o['shuntedReadings'] !== undefined;
  if (samples === (o['measuredStep'] !== undefined)) {
    conflict(
      samples ? 'measuredStep' : 'options',
      samples
        ? '`measuredStep` must not be given with `zeroReadings` and `shuntedReadings` (give one or the other)'
        : '`options` must give the measured step: `measuredStep`, or `zeroReadings` and `shuntedReadings`',
    );
  }
  let measured: number;
  let uMeasured: number | undefined;
  if (samples) {
    const zero = checkBoundedArray('zeroReadings', o['zeroReadings']);
    const shunted = checkBoundedArray('shuntedReadings', o['shuntedReadings']);
    for (const [param, xs] of [
      ['zeroReadings', zero],
      ['shuntedReadings', shunted],
    ] as const) {
      if (xs.length === 0) {
        throw new BridgeworkError('too-few-points', `\`${param}\` must hold at least one reading; got 0`, {
          param,
          value: 0,
          limit: 1,
        });
      }
    }
    measured = mean(shunted) - mean(zero);
    const u0 = uncertaintyOfMean(zero);
    const u1 = uncertaintyOfMean(shunted);
    uMeasured = u0 === undefined || u1 === undefined ? undefined : Math.hypot(u0, u1);
  } else {
    measured = bounded('measuredStep', o['measuredStep']);
    uMeasured =
      o['measuredStepStandardUncertainty'] === undefined
        ? undefined
        : bounded(
            'measuredStepStandardUncertainty',
            checkNonNegative('measuredStepStandardUncertainty', o['measuredStepStandardUncertainty']),
          );
  }
  if (measured === 0) {
    throw new BridgeworkError(
      'out-of-range',
      `the measured step must be non-zero (the channel did not respond to the shunt: check that it was connected); got ${formatValue(measured)}`,
      { param: samples ? 'shuntedReadings' : 'measuredStep', value: measured },
    );
  }
  const factor = expected / measured;
  const spanErrorFraction = measured / expected - 1;
  const relative =
    uMeasured === undefined && uExpected === 0
      ? undefined
      : Math.hypot(uExpected / expected, (uMeasured ?? 0) / measured);
  const factorStandardUncertainty = relative === undefined ? undefined : Math.abs(factor) * relative;
  const issues: string[] = [];
  if (factor < 0) {
    issues.push(
      `the measured step ${formatValue(measured)} has the opposite sign to the expected ${formatValue(expected)}: check the shunted arm and the signal leads before correcting the span.`,
    );
  } else if (Math.abs(spanErrorFraction) > plausible) {
    issues.push(
      `the span error ${(100 * spanErrorFraction).toFixed(2)} % exceeds the plausible ${(100 * plausible).toFixed(2)} %: check the shunt value, its arm and placement and the cable model before correcting the span.`,
    );
  }
  if (!Number.isFinite(factor) || !Number.isFinite(spanErrorFraction)) {
    throw new BridgeworkError(
      'out-of-range',
      `the measured step must not be vanishingly small against the expected one (the span factor overflows); got ${formatValue(measured)}`,
      { param: samples ? 'shuntedReadings' : 'measuredStep', value: measured },
    );
  }
  return {
    ok: issues.length === 0,
    issues,
    value: {
      factor,
      factorStandardUncertainty,
      spanErrorFraction,
      measuredStep: measured,
      measuredStepStandardUncertainty: uMeasured,
      expectedStep: expected,
      correct(reading: number, zeroReading = 0): number {
        const r = bounded('reading', reading);
        const z = bounded('zeroReading', zeroReading);
        return finiteResult('reading', r, z + factor * (r - z), 'the corrected reading');
      },
    },
  };
}
