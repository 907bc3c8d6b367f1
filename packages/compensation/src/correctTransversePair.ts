import { checkFinite, checkFiniteResult, checkLength, checkOptions } from '@bridgework/core';
import { checkPoissonRatio0, checkTransverseSensitivities } from './internal/transverse.js';

/** Options of {@link correctTransversePair}. */
export interface CorrectTransversePairOptions {
  /** Indicated strains [ε̂x, ε̂y] of two gauges at right angles (x and y), m/m. */
  readonly strains: readonly [number, number];
  /** Transverse sensitivity Kt of both gauges, or `[Kx, Ky]`, each in (−1, 1). */
  readonly transverseSensitivity: number | readonly [number, number];
  /** Poisson ratio ν0 of the gauge-factor calibration beam, in (−1, 0.5]. Default 0.285. */
  readonly poissonRatio0?: number;
}

/**
 * Corrects two orthogonal gauges (a tee rosette or a biaxial pair) for transverse sensitivity.
 *
 * @remarks
 * Each gauge's transverse strain is the other gauge's axial strain, so the two readings
 * ε̂x = (εx + Kx·εy)/(1 − ν0·Kx) and ε̂y = (εy + Ky·εx)/(1 − ν0·Ky) are solved together in closed
 * form (Dally & Riley, _Experimental Stress Analysis_, strain-gauge chapter, from memory, for
 * Kx = Ky):
 *
 *   εx = [(1 − ν0·Kx)·ε̂x − Kx·(1 − ν0·Ky)·ε̂y] / (1 − Kx·Ky)
 *   εy = [(1 − ν0·Ky)·ε̂y − Ky·(1 − ν0·Kx)·ε̂x] / (1 − Kx·Ky).
 *
 * With Kt = 0.02 the readings 999.69828 and −281.60515 µε return 1000 and −300 µε. The
 * denominator 1 − Kx·Ky ≥ 1 − max|K|² never vanishes for |K| < 1. A few roundings: within a few
 * ulps of the exact solution, relative to the larger strain.
 *
 * @param options - The two indicated strains, Kt (one or per gauge), ν0.
 * @returns The true strains `[εx, εy]`, m/m.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-shape` unless `strains` has two
 *   entries (and a Kt array two); `out-of-range` for Kt outside (−1, 1) or ν0 outside (−1, 0.5];
 *   `out-of-range` (against `strains`) when a corrected strain would exceed binary64; `not-finite`,
 *   `wrong-type` for bad numbers;
 *   `unknown-option` for a key it does not know (naming the closest), `missing-option` for a
 *   required one.
 * @example
 * ```ts
 * correctTransversePair({ strains: [9.996982801971236e-4, -2.8160514935130243e-4], transverseSensitivity: 0.02 });
 * // [1e-3, -3e-4] (to a few ulps)
 * ```
 */
export function correctTransversePair(options: CorrectTransversePairOptions): [number, number] {
  const o = checkOptions('options', options, {
    known: ['strains', 'transverseSensitivity', 'poissonRatio0'],
    required: ['strains', 'transverseSensitivity'],
  });
  const strains = checkLength<unknown>('strains', o['strains'], 2);
  const ex = checkFinite('strains[0]', strains[0]);
  const ey = checkFinite('strains[1]', strains[1]);
  const [kx, ky] = checkTransverseSensitivities(o['transverseSensitivity'], 2) as [number, number];
  const nu0 = checkPoissonRatio0(o['poissonRatio0']);
  // Readings scaled back to Fa: ε̂·(1 − ν0·K) = ε_axial + K·ε_transverse.
  const sx = ex * (1 - nu0 * kx);
  const sy = ey * (1 - nu0 * ky);
  const det = 1 - kx * ky;
  const blame = {
    what: 'the corrected strains',
    param: 'strains',
    value: o['strains'],
  };
  return [checkFiniteResult((sx - kx * sy) / det, blame), checkFiniteResult((sy - ky * sx) / det, blame)];
}
