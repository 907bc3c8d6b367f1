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

/**
 * The start of {@link Rtd.temperatureAt}'s inverse below 0 °C, for conversion loops that reproduce
 * it operation for operation (the channel package's RTD kernel): with x = R/R0 − 1 in
 * [x(−200 °C), 0), u = (x − xMin)·scale − 1, u₂ = u·u and u₄ = u₂·u₂, the start is
 * t₀ = x·(p₀ + p₁u + (p₂ + p₃u)·u₂ + (p₄ + p₅u + (p₆ + p₇u)·u₂)·u₄ + p₈·(u₄·u₄)) (Estrin's scheme,
 * evaluated left to right as written), the pᵢ being `coefficients[i]`. One Newton step on the
 * quartic follows: δ = (t₀·(A + t₀·(B + t₀·(C·(t₀ − 100)))) − x)/(A + t₀·(2B + t₀·(C·(4t₀ − 300)))),
 * t = t₀ − δ, kept when δ²·guard ≤ |t₀| and −201 °C ≤ t₀ < 0 (else the safeguarded iteration
 * decides).
 */
export interface RtdInverseStart {
  /** x(−200 °C), the lower end of the polynomial's interval. */
  readonly xMin: number;
  /** 2/|xMin|: u = (x − xMin)·scale − 1 runs over [−1, 1]. */
  readonly scale: number;
  /** The polynomial's nine coefficients (degree 8), lowest power first. */
  readonly coefficients: readonly number[];
  /** The proved bound's factor K·κ²·2⁵⁶ (see `createRtd`); Infinity when no bound holds. */
  readonly guard: number;
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
   * Temperature at a resistance, °C: the inverse of `ohmsAt`, within 4 ulp of the exact root of
   * x = R/R0 − 1 (40-digit checks; the round trip is within 1e-9 K).
   *
   * @param ohms - In `rangeOhms`.
   * @throws {@link @bridgework/core!BridgeworkError} `out-of-range`, `not-finite`, `wrong-type`.
   */
  temperatureAt(ohms: number): number;
  /** The start of the inverse below 0 °C (see {@link RtdInverseStart}). */
  readonly inverseStart: RtdInverseStart;
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
/** Degree of the start's polynomial for t/x below 0 °C. */
const START_DEGREE = 8;
/** Lower end of the interval the Newton step's bound covers, °C (a start a little below −200 °C). */
const T_BOUND = -201;

/**
 * Creates a platinum resistance thermometer model per IEC 60751 (Callendar–Van Dusen).
 *
 * @remarks
 * IEC 60751:2008 defines R(t) = R0·[1 + A·t + B·t² + C·(t − 100)·t³] for −200 ≤ t < 0 °C and
 * R(t) = R0·(1 + A·t + B·t²) for 0 ≤ t ≤ 850 °C. The forward map is evaluated by Horner's rule.
 * The inverse above 0 °C is the quadratic's root in the cancellation-free form
 * t = 2x/(A + √(A² + 4Bx)), x = R/R0 − 1. Below 0 °C no closed form exists for the quartic: the
 * quadratic alone is wrong by 2.4 K at −200 °C. Below 0 °C the inverse starts from a polynomial
 * for t/x over [x(−200 °C), 0] (degree 8, interpolated at Chebyshev nodes at creation from the
 * converged iteration below; about 1e-10 relative for IEC 60751's coefficients)
 * and takes one Newton step on the full quartic, t = t₀ − δ, δ = f(t₀)/f′(t₀). The step's error is
 * proved small: with κ = max f′/min f′ and K = max |f″|/(2 min f′) over [−201, 0] °C (computed at
 * creation from the coefficients: f′ at the ends and at the roots of f″, f″ at the ends),
 * |t₀ − t*| ≤ κ|δ| and |t − t*| ≤ K·κ²·δ², so the step is kept only when δ²·K·κ²·2⁵⁶ ≤ |t₀|: the
 * method's error is then below 2⁻⁵⁶ of the result, and what remains is rounding (within 4 ulp of
 * the exact root of the rounded x, 40-digit checks). Otherwise (custom coefficients the start
 * does not follow) Newton's method iterates on the quartic from the quadratic's root,
 * safeguarded by bisection inside [−200, 0] °C (the quartic is strictly increasing there, which is
 * checked at creation), until a step is below 1e-12 °C. The round trip is within 1e-9 K (tested
 * against 40-digit references and by property tests; it is in fact about 1e-13 K). Conversion
 * loops reproduce the inverse operation for operation from `inverseStart`. The slope is dR/dt = R0·(A + 2Bt) above 0 °C and
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

  /** Safeguarded Newton on the quartic over [−200, 0] °C from the quadratic's root, to convergence. */
  function iterateBelowZero(target: number, quadratic: number): number {
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
    return Number.NaN;
  }
  const quadraticRoot = (target: number): number => {
    const disc = a * a + 4 * b * target;
    return disc >= 0 ? (2 * target) / (a + Math.sqrt(disc)) : target / a;
  };
  const inverseStart = fitInverseStart(x(T_MIN), a, b, c, dx, (target) =>
    iterateBelowZero(target, quadraticRoot(target)),
  );
  const { xMin, scale, guard } = inverseStart;
  const [p0, p1, p2, p3, p4, p5, p6, p7, p8] = inverseStart.coefficients as [
    number,
    number,
    number,
    number,
    number,
    number,
    number,
    number,
    number,
  ];

  function temperatureAt(ohms: number): number {
    const r = checkRange('ohms', ohms, { min: rangeOhms[0], max: rangeOhms[1] });
    const target = r / r0Ohms - 1;
    if (target >= 0) return quadraticRoot(target);
    // The piecewise-polynomial start and one Newton step on the quartic (see the remarks).
    const u = (target - xMin) * scale - 1;
    // Estrin's scheme (a short chain of dependent operations for conversion loops).
    const u2 = u * u;
    const u4 = u2 * u2;
    const t0 =
      target * (p0 + p1 * u + (p2 + p3 * u) * u2 + (p4 + p5 * u + (p6 + p7 * u) * u2) * u4 + p8 * (u4 * u4));
    const f = t0 * (a + t0 * (b + t0 * (c * (t0 - 100)))) - target;
    const delta = f / (a + t0 * (2 * b + t0 * (c * (4 * t0 - 300))));
    if (delta * delta * guard <= Math.abs(t0) && t0 >= T_BOUND && t0 < 0) return t0 - delta;
    const t = iterateBelowZero(target, quadraticRoot(target));
    if (t === t) return t;
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
    inverseStart,
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
/**
 * The polynomial start of the inverse below 0 °C (see {@link RtdInverseStart}): t/x
 * interpolated at Chebyshev nodes (`solve` gives the converged root), and the
 * guard of the Newton step's proved bound.
 */
function fitInverseStart(
  xMin: number,
  a: number,
  b: number,
  c: number,
  dx: (t: number) => number,
  solve: (target: number) => number,
): RtdInverseStart {
  const scale = 2 / -xMin;
  const n = START_DEGREE + 1;
  // Interpolation at n Chebyshev nodes of u ∈ [−1, 1]: the Vandermonde system, partial pivoting.
  const rows: number[][] = [];
  for (let j = 0; j < n; j++) {
    const u = Math.cos((Math.PI * (j + 0.5)) / n);
    const target = xMin + (u + 1) / scale;
    const row = Array.from({ length: n }, (_, i) => u ** i);
    row.push(solve(target) / target);
    rows.push(row);
  }
  const coefficients = solveSquare(rows);
  // f′ = dx on [−201, 0]: its extremes at the ends and where f″ = 2B + C(12t² − 600t) vanishes;
  // |f″| is largest at an end (f‴ = C(24t − 600) vanishes only at 25 °C).
  const points = [T_BOUND, 0];
  if (c !== 0) {
    const disc = 360000 * c * c - 96 * b * c;
    if (disc >= 0) {
      const root = Math.sqrt(disc);
      for (const t of [(600 * c + root) / (24 * c), (600 * c - root) / (24 * c)])
        if (t > T_BOUND && t < 0) points.push(t);
    }
  }
  const slopes = points.map(dx);
  const minSlope = Math.min(...slopes);
  const maxSlope = Math.max(...slopes);
  const curvature = Math.max(Math.abs(2 * b), Math.abs(2 * b + c * (12 * T_BOUND * T_BOUND - 600 * T_BOUND)));
  const kappa = maxSlope / minSlope;
  // Slopes bounded below by a margin (the rounding of the evaluations above) or no bound at all.
  const guard =
    minSlope > 1e-9 * maxSlope && coefficients.every(Number.isFinite)
      ? (curvature / (2 * minSlope)) * kappa * kappa * 2 ** 56 * (1 + 1e-6)
      : Infinity;
  return Object.freeze({
    xMin,
    scale,
    coefficients: Object.freeze(coefficients),
    guard,
  });
}

/** Solves the square system given as augmented rows [A | b] by Gaussian elimination with partial pivoting. */
function solveSquare(rows: number[][]): number[] {
  const n = rows.length;
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(rows[r]![col]!) > Math.abs(rows[pivot]![col]!)) pivot = r;
    [rows[col], rows[pivot]] = [rows[pivot]!, rows[col]!];
    const p = rows[col]!;
    for (let r = col + 1; r < n; r++) {
      const row = rows[r]!;
      const factor = row[col]! / p[col]!;
      for (let k = col; k <= n; k++) row[k] = row[k]! - factor * p[k]!;
    }
  }
  const out = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    const row = rows[r]!;
    let sum = row[n]!;
    for (let k = r + 1; k < n; k++) sum -= row[k]! * out[k]!;
    out[r] = sum / row[r]!;
  }
  return out;
}

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
