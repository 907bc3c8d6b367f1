/** Plain-double polynomial helpers for the fits (no mathjs: these run per call of a fit's maps). */
import { BridgeworkError } from '@bridgework/core';

/** Horner evaluation of Σ c[k]·t^k. */
export function horner(c: readonly number[], t: number): number {
  let y = 0;
  for (let k = c.length - 1; k >= 0; k--) y = y * t + (c[k] as number);
  return y;
}

/** Coefficients of the derivative: d/dt Σ c[k]·t^k = Σ (k+1)·c[k+1]·t^k. */
export function derivative(c: readonly number[]): number[] {
  return c.slice(1).map((ck, k) => (k + 1) * ck);
}

/**
 * Real roots of a polynomial of degree ≤ 2 (c = [c0, c1, c2]), ascending; a double root counts
 * once. The quadratic uses the cancellation-free form q = −(b + sign(b)·√(b² − 4ac))/2.
 */
export function rootsUpToQuadratic(c: readonly number[]): number[] {
  const c0 = c[0] ?? 0;
  const c1 = c[1] ?? 0;
  const c2 = c[2] ?? 0;
  if (c2 === 0) return c1 === 0 ? [] : [-c0 / c1];
  const disc = c1 * c1 - 4 * c2 * c0;
  if (disc < 0) return [];
  const q = -0.5 * (c1 + (c1 < 0 ? -Math.sqrt(disc) : Math.sqrt(disc)));
  const roots = q === 0 ? [0] : [c0 / q, q / c2];
  return [...new Set(roots)].sort((a, b) => a - b);
}

/**
 * The binomial change of basis from t = (x − center)/half to x: column k holds the x-coefficients
 * of t^k = Σ_j C(k, j)·x^j·(−center)^(k−j)/half^k, so that c = T·a maps scaled coefficients a to
 * coefficients c in x.
 */
export function scaledToUnscaled(center: number, half: number, degree: number): number[][] {
  const t = Array.from({ length: degree + 1 }, () => new Array<number>(degree + 1).fill(0));
  for (let k = 0; k <= degree; k++) {
    let binomial = 1;
    for (let j = 0; j <= k; j++) {
      (t[j] as number[])[k] = (binomial * (-center) ** (k - j)) / half ** k;
      binomial = (binomial * (k - j)) / (j + 1);
    }
  }
  return t;
}

/** Maximum iterations of {@link solveMonotone}; a bracket of 2 halves below 4ε in about 55. */
export const MAX_ITERATIONS = 100;

/**
 * Solves p(t) = target for t in [lo, hi], where p is strictly monotone on the interval and
 * p(lo), p(hi) bracket the target: safeguarded Newton–Raphson (a Newton step when it stays inside
 * the current bracket and at least halves the step, else bisection; Press et al., _Numerical
 * Recipes_, routine rtsafe). Stops when a step is below 4ε·max(1, |t|). A target that the ends do
 * not bracket (within rounding of an end) returns the nearer end.
 *
 * @throws BridgeworkError `not-converged` after {@link MAX_ITERATIONS} iterations.
 */
export function solveMonotone(
  p: readonly number[],
  dp: readonly number[],
  target: number,
  lo: number,
  hi: number,
): number {
  const fLo = horner(p, lo) - target;
  const fHi = horner(p, hi) - target;
  if (fLo === 0) return lo;
  if (fHi === 0) return hi;
  // Not bracketed: the target lies within rounding of an end (the caller allows a few ulps).
  if (fLo < 0 === fHi < 0) return Math.abs(fLo) <= Math.abs(fHi) ? lo : hi;
  // Orient so that f(below) < 0 < f(above).
  let below = fLo < 0 ? lo : hi;
  let above = fLo < 0 ? hi : lo;
  let t = 0.5 * (lo + hi);
  let step = Math.abs(hi - lo);
  let previousStep = step;
  for (let i = 0; i < MAX_ITERATIONS; i++) {
    const f = horner(p, t) - target;
    if (f === 0) return t;
    if (f < 0) below = t;
    else above = t;
    const df = horner(dp, t);
    const newton = t - f / df;
    const inside = (newton - below) * (newton - above) < 0;
    if (!inside || Math.abs(2 * f) > Math.abs(previousStep * df)) {
      previousStep = step;
      step = 0.5 * (above - below);
      t = below + step;
    } else {
      previousStep = step;
      step = f / df;
      t = newton;
    }
    if (Math.abs(step) <= 4 * Number.EPSILON * Math.max(1, Math.abs(t))) return t;
  }
  throw new BridgeworkError(
    'not-converged',
    `the inverse of the fit did not converge in ${MAX_ITERATIONS} iterations for reading ${target}`,
    { param: 'reading', value: target, limit: MAX_ITERATIONS },
  );
}
