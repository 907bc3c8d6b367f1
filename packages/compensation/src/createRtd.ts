import {
  BridgeworkError,
  OHMS_LIMITS,
  checkFinite,
  checkOhms,
  checkOptions,
  checkPositive,
  checkRange,
  formatValue,
} from '@bridgework/core';
import { rtdToleranceCelsius, type RtdToleranceOptions } from './rtdTolerance.js';

/** The Callendar–Van Dusen coefficients of a platinum resistance thermometer. */
export interface CallendarVanDusenCoefficients {
  /** A in 1/°C. */
  readonly a: number;
  /** B in 1/°C². */
  readonly b: number;
  /** C in 1/°C⁴ (used below 0 °C only). */
  readonly c: number;
}

/**
 * The Callendar–Van Dusen coefficients of IEC 60751:2008 for industrial platinum thermometers
 * (α = 0.00385 /°C): A = 3.9083 × 10⁻³ /°C, B = −5.775 × 10⁻⁷ /°C², C = −4.183 × 10⁻¹² /°C⁴.
 *
 * @example
 * ```ts
 * IEC_60751_COEFFICIENTS.a; // 0.0039083
 * ```
 */
export const IEC_60751_COEFFICIENTS: CallendarVanDusenCoefficients = Object.freeze({
  a: 3.9083e-3,
  b: -5.775e-7,
  c: -4.183e-12,
});

/** Options of {@link createRtd}. Coefficients default to {@link IEC_60751_COEFFICIENTS}. */
export interface RtdOptions {
  /** Resistance at 0 °C, R0, in Ω (> 0). Default 100 (Pt100); 1000 for a Pt1000. */
  readonly r0Ohms?: number;
  /** Callendar–Van Dusen A in 1/°C (> 0). Default 3.9083e-3. */
  readonly a?: number;
  /** Callendar–Van Dusen B in 1/°C². Default −5.775e-7. */
  readonly b?: number;
  /** Callendar–Van Dusen C in 1/°C⁴ (below 0 °C). Default −4.183e-12. */
  readonly c?: number;
}

/** The tolerance of a sensor at a temperature, in °C and in Ω (see `Rtd.toleranceAt`). */
export interface RtdTolerance {
  /** Tolerance half-width in °C. */
  readonly celsius: number;
  /** The same tolerance in Ω: `celsius` times the local slope dR/dt. */
  readonly ohms: number;
}

/** A platinum resistance thermometer per IEC 60751 (see {@link createRtd}). */
export interface Rtd {
  /** R0 in Ω. */
  readonly r0Ohms: number;
  /** Callendar–Van Dusen A, 1/°C. */
  readonly a: number;
  /** Callendar–Van Dusen B, 1/°C². */
  readonly b: number;
  /** Callendar–Van Dusen C, 1/°C⁴. */
  readonly c: number;
  /** The temperature range of IEC 60751, [−200, 850] °C. */
  readonly rangeCelsius: readonly [number, number];
  /** The resistances over that range, [R(−200 °C), R(850 °C)] in Ω. */
  readonly rangeOhms: readonly [number, number];
  /**
   * Resistance at a temperature, Ω.
   *
   * @param temperatureCelsius - In [−200, 850] °C.
   * @throws {@link @bridgework/core!BridgeworkError} `out-of-range`, `not-finite`, `wrong-type`.
   */
  ohmsAt(temperatureCelsius: number): number;
  /**
   * Temperature at a resistance, °C: the exact inverse of `ohmsAt` (within 1e-9 K).
   *
   * @param ohms - In `rangeOhms`.
   * @throws {@link @bridgework/core!BridgeworkError} `out-of-range`, `not-finite`, `wrong-type`.
   */
  temperatureAt(ohms: number): number;
  /**
   * Slope dR/dt at a temperature, Ω/°C.
   *
   * @param temperatureCelsius - In [−200, 850] °C.
   */
  slopeAt(temperatureCelsius: number): number;
  /**
   * The IEC 60751 tolerance of a class at a temperature, in °C and in Ω (via the local slope).
   *
   * @param options - Class, temperature and element construction (see `rtdToleranceCelsius`).
   */
  toleranceAt(options: RtdToleranceOptions): RtdTolerance;
}

const T_MIN = -200;
const T_MAX = 850;
/** Newton steps stop when they move t by less than this, °C (the result is then far closer). */
const STEP_TOLERANCE_CELSIUS = 1e-12;
const MAX_ITERATIONS = 100;

/**
 * Creates a platinum resistance thermometer model per IEC 60751 (Callendar–Van Dusen).
 *
 * @remarks
 * IEC 60751:2008 defines R(t) = R0·[1 + A·t + B·t² + C·(t − 100)·t³] for −200 ≤ t < 0 °C and
 * R(t) = R0·(1 + A·t + B·t²) for 0 ≤ t ≤ 850 °C. The forward map is evaluated by Horner's rule.
 * The inverse above 0 °C is the quadratic's root in the cancellation-free form
 * t = 2x/(A + √(A² + 4Bx)), x = R/R0 − 1. Below 0 °C no closed form exists for the quartic: the
 * quadratic alone is wrong by 2.4 K at −200 °C. The inverse starts from the quadratic's root and
 * iterates Newton's method on the full quartic, safeguarded by bisection inside [−200, 0] °C (the
 * quartic is strictly increasing there, which is checked at creation), until a step is below
 * 1e-12 °C; the round trip is within 1e-9 K (tested against 40-digit references and by property
 * tests; it is in fact about 1e-13 K). The slope is dR/dt = R0·(A + 2Bt) above 0 °C and
 * R0·(A + 2Bt + C·(4t³ − 300t²)) below. Custom coefficients are accepted when they keep R
 * positive and strictly increasing over [−200, 850] °C.
 *
 * @param options - R0 and the Callendar–Van Dusen coefficients (IEC 60751 by default).
 * @returns The evaluator: `ohmsAt`, `temperatureAt`, `slopeAt`, `toleranceAt` and the ranges.
 * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` when the coefficients do not give
 *   a positive, strictly increasing R(t) over the range (param `b` or `c`), or an R(850 °C) above
 *   1e15 Ω (`r0Ohms` or `a`); `not-positive`, `not-finite`, `wrong-type` for bad numbers;
 *   `out-of-range` for an `r0Ohms` outside `OHMS_LIMITS` of the core package; `unknown-option`
 *   for a key it does not know (naming the closest). The evaluator throws `out-of-range` for a
 *   temperature or resistance outside the range.
 * @example
 * ```ts
 * const pt100 = createRtd();
 * pt100.ohmsAt(100); // ≈ 138.5055 Ω (IEC 60751 table: 138.51)
 * pt100.temperatureAt(60.25584); // ≈ -100 (table: 60.26 Ω)
 * pt100.toleranceAt({ toleranceClass: 'A', temperatureCelsius: 100 }); // { celsius: 0.35, ohms: 0.132748 }
 * ```
 */
export function createRtd(options: RtdOptions = {}): Rtd {
  const o = checkOptions('options', options, { known: ['r0Ohms', 'a', 'b', 'c'] });
  const r0Ohms = o['r0Ohms'] === undefined ? 100 : checkOhms('r0Ohms', o['r0Ohms']);
  const a = o['a'] === undefined ? IEC_60751_COEFFICIENTS.a : checkPositive('a', o['a']);
  const b = o['b'] === undefined ? IEC_60751_COEFFICIENTS.b : checkFinite('b', o['b']);
  const c = o['c'] === undefined ? IEC_60751_COEFFICIENTS.c : checkFinite('c', o['c']);

  // x(t) = R/R0 − 1 and its derivative.
  const x = (t: number): number => (t >= 0 ? t * (a + t * b) : t * (a + t * (b + t * (c * (t - 100)))));
  const dx = (t: number): number => (t >= 0 ? a + 2 * b * t : a + t * (2 * b + t * (c * (4 * t - 300))));

  checkMonotone(a, b, c, dx);
  if (!(1 + x(T_MIN) > 0)) {
    throw new BridgeworkError('out-of-range', '`c` must keep R(−200 °C) > 0', { param: 'c', value: c });
  }

  const limits = { min: T_MIN, max: T_MAX };
  // x(850 °C) is the largest value of x (x is increasing): it bounds every resistance.
  const top = r0Ohms * (1 + x(T_MAX));
  if (!(top <= OHMS_LIMITS.max)) {
    const param = Number.isFinite(x(T_MAX)) ? 'r0Ohms' : Math.abs(a) >= Math.abs(b * T_MAX) ? 'a' : 'b';
    throw new BridgeworkError(
      'out-of-range',
      `\`${param}\` must keep R(850 °C) within ${OHMS_LIMITS.max} Ω; got ${formatValue(o[param])} (R(850 °C) = ${formatValue(top)} Ω)`,
      { param, value: o[param], limit: OHMS_LIMITS.max },
    );
  }
  const rangeOhms = Object.freeze([r0Ohms * (1 + x(T_MIN)), r0Ohms * (1 + x(T_MAX))] as [number, number]);

  function temperatureAt(ohms: number): number {
    const r = checkRange('ohms', ohms, { min: rangeOhms[0], max: rangeOhms[1] });
    const target = r / r0Ohms - 1;
    const disc = a * a + 4 * b * target;
    const quadratic = disc >= 0 ? (2 * target) / (a + Math.sqrt(disc)) : target / a;
    if (target >= 0) return quadratic;
    // Safeguarded Newton on the quartic over the bracket [−200, 0], where x(t) is increasing.
    let lo = T_MIN;
    let hi = 0;
    let t = Math.min(hi, Math.max(lo, quadratic));
    for (let i = 0; i < MAX_ITERATIONS; i++) {
      const f = x(t) - target;
      if (f === 0) return t;
      if (f < 0) lo = t;
      else hi = t;
      let next = t - f / dx(t);
      if (!(next >= lo && next <= hi)) next = 0.5 * (lo + hi);
      if (Math.abs(next - t) <= STEP_TOLERANCE_CELSIUS) return next;
      t = next;
    }
    throw new BridgeworkError(
      'not-converged',
      `\`ohms\` could not be inverted within ${MAX_ITERATIONS} steps; got ${formatValue(ohms)}`,
      {
        param: 'ohms',
        value: ohms,
      },
    );
  }

  function slopeAt(temperatureCelsius: number): number {
    return r0Ohms * dx(checkRange('temperatureCelsius', temperatureCelsius, limits));
  }

  return {
    r0Ohms,
    a,
    b,
    c,
    rangeCelsius: Object.freeze([T_MIN, T_MAX] as [number, number]),
    rangeOhms,
    ohmsAt(temperatureCelsius: number): number {
      return r0Ohms * (1 + x(checkRange('temperatureCelsius', temperatureCelsius, limits)));
    },
    temperatureAt,
    slopeAt,
    toleranceAt(toleranceOptions: RtdToleranceOptions): RtdTolerance {
      const celsius = rtdToleranceCelsius(toleranceOptions);
      return { celsius, ohms: celsius * slopeAt(toleranceOptions.temperatureCelsius) };
    },
  };
}

/**
 * Checks that dx/dt > 0 over [−200, 850] °C. Above 0 °C the slope is linear in t, so its ends
 * decide; below, the slope's minimum lies at an end or where its derivative
 * 2B + C·(12t² − 600t) vanishes.
 */
function checkMonotone(a: number, b: number, c: number, dx: (t: number) => number): void {
  if (!(dx(T_MAX) > 0)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`b\` must keep dR/dt = R0·(A + 2Bt) > 0 up to 850 °C; got ${formatValue(b)}`,
      { param: 'b', value: b },
    );
  }
  const candidates = [T_MIN, 0];
  if (c !== 0) {
    // 12C·t² − 600C·t + 2B = 0
    const disc = 360000 * c * c - 96 * b * c;
    if (disc >= 0) {
      const root = Math.sqrt(disc);
      candidates.push((600 * c + root) / (24 * c), (600 * c - root) / (24 * c));
    }
  }
  for (const t of candidates) {
    if (t >= T_MIN && t <= 0 && !(dx(t) > 0)) {
      throw new BridgeworkError(
        'out-of-range',
        `\`c\` must keep dR/dt > 0 between −200 and 0 °C; got ${formatValue(c)} (slope ≤ 0 at ${t} °C)`,
        { param: 'c', value: c },
      );
    }
  }
}
