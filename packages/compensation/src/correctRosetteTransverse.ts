import {
  BridgeworkError,
  checkFiniteResult,
  checkLength,
  checkOptions,
  checkFinite,
  rosetteLegAngles,
  type RosetteLayout,
} from '@bridgework/core';
import { solve3 } from './internal/solve3.js';
import { checkPoissonRatio0, checkTransverseSensitivities } from './internal/transverse.js';

/** Options of {@link correctRosetteTransverse}. */
export interface CorrectRosetteTransverseOptions {
  /** The rosette layout (`'rectangular'`, `'delta'` or `{ anglesRadians }`), as in the core package. */
  readonly layout: RosetteLayout;
  /** Indicated strains of legs a, b and c, m/m. */
  readonly strains: readonly [number, number, number];
  /** Transverse sensitivity Kt of every leg, or `[Ka, Kb, Kc]`, each in (−1, 1). */
  readonly transverseSensitivity: number | readonly [number, number, number];
  /** Poisson ratio ν0 of the gauge-factor calibration beam, in (−1, 0.5]. Default 0.285. */
  readonly poissonRatio0?: number;
}

/**
 * Smallest accepted |sin(θb − θa)·sin(θc − θb)·sin(θa − θc)|, the determinant of the rosette's
 * strain-transformation matrix (0.5 rectangular, 0.6495 delta). Below it the legs are within
 * about 0.45° of parallel and the strain state is not determined.
 */
const MIN_GEOMETRY_DETERMINANT = 1e-6;

/**
 * Corrects the three legs of a strain rosette for transverse sensitivity (Kt may differ per leg).
 *
 * @remarks
 * Leg i at angle θi reads ε̂i = (ε(θi) + Ki·ε(θi + 90°))/(1 − ν0·Ki) ({@link indicatedTransverseStrain}),
 * with ε(θ) = εx·cos²θ + εy·sin²θ + γxy·sinθ·cosθ. That is three linear equations in
 * (εx, εy, γxy):
 *
 *   (1 − ν0·Ki)·ε̂i = (cos²θi + Ki·sin²θi)·εx + (sin²θi + Ki·cos²θi)·εy + (1 − Ki)·sinθi·cosθi·γxy,
 *
 * solved by Gaussian elimination with partial pivoting (backward stable). Since
 * ε(θ) + ε(θ + 90°) = εx + εy = S for every θ, each corrected leg then follows from S alone,
 *
 *   εi = [(1 − ν0·Ki)·ε̂i − Ki·S] / (1 − Ki),
 *
 * which damps any solve error by Ki/(1 − Ki). For equal Kt this reproduces the closed forms of
 * the rectangular and delta rosettes (tested). The corrected `[εa, εb, εc]` feed straight into a
 * rosette reduction with the same `layout` (the mechanics package's `reduceRosette`). Accuracy:
 * within 1e-14 relative to the largest strain for the standard layouts.
 *
 * @param options - Layout, indicated leg strains, Kt (one or per leg), ν0.
 * @returns The corrected leg strains `[εa, εb, εc]`, m/m.
 * @throws {@link @bridgework/core!BridgeworkError} `singular` when legs are (nearly) parallel;
 *   `invalid-option`, `invalid-shape` for a bad layout, `strains` or Kt array; `out-of-range` for
 *   Kt outside (−1, 1) or ν0 outside (−1, 0.5], and (against `strains`) when a corrected strain
 *   would exceed binary64 (strains near 1e308, or Kt within rounding of 1); `not-finite`,
 *   `wrong-type` for bad numbers;
 *   `unknown-option` for a key it does not know (naming the closest), `missing-option` for a
 *   required one.
 * @example
 * ```ts
 * correctRosetteTransverse({
 *   layout: 'rectangular',
 *   strains: [9.996982801971236e-4, 3.5e-4, -2.8160514935130243e-4],
 *   transverseSensitivity: 0.02,
 * }); // ≈ [1e-3, 3.4082e-4, -3e-4]
 * ```
 */
export function correctRosetteTransverse(options: CorrectRosetteTransverseOptions): [number, number, number] {
  const o = checkOptions('options', options, {
    known: ['layout', 'strains', 'transverseSensitivity', 'poissonRatio0'],
    required: ['layout', 'strains', 'transverseSensitivity'],
  });
  const angles = rosetteLegAngles(o['layout'] as RosetteLayout);
  const raw = checkLength<unknown>('strains', o['strains'], 3);
  const strains = raw.map((e, i) => checkFinite(`strains[${i}]`, e));
  const k = checkTransverseSensitivities(o['transverseSensitivity'], 3);
  const nu0 = checkPoissonRatio0(o['poissonRatio0']);

  const [ta, tb, tc] = angles;
  const geometry = Math.abs(Math.sin(tb - ta) * Math.sin(tc - tb) * Math.sin(ta - tc));
  if (!(geometry >= MIN_GEOMETRY_DETERMINANT)) {
    throw new BridgeworkError(
      'singular',
      `\`layout\` must have three distinct gauge directions (|sin(θb−θa)·sin(θc−θb)·sin(θa−θc)| ≥ ${MIN_GEOMETRY_DETERMINANT}); got ${geometry}`,
      { param: 'layout', value: o['layout'], limit: MIN_GEOMETRY_DETERMINANT },
    );
  }
  const scaled = strains.map((e, i) => e * (1 - nu0 * k[i]!)) as [number, number, number];
  const rows = angles.map((theta, i) => {
    const c = Math.cos(theta);
    const s = Math.sin(theta);
    const ki = k[i]!;
    return [c * c + ki * s * s, s * s + ki * c * c, (1 - ki) * s * c] as [number, number, number];
  });
  // The solve is linear: do it on legs scaled to at most 1, so no product overflows on the way.
  const scale = Math.max(1, ...scaled.map(Math.abs));
  const [ex0, ey0] = solve3(rows, scaled.map((e) => e / scale) as [number, number, number]);
  const ex = ex0 * scale;
  const ey = ey0 * scale;
  const sum = ex + ey;
  const blame = {
    what: 'the corrected strains',
    param: 'strains',
    value: o['strains'],
  };
  return scaled.map((e, i) => checkFiniteResult((e - k[i]! * sum) / (1 - k[i]!), blame)) as [
    number,
    number,
    number,
  ];
}
