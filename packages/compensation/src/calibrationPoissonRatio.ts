/**
 * The Poisson ratio ν0 of the calibration beam on which gauge factors and transverse
 * sensitivities are measured: 0.285 (the steel beam of the gauge-factor test, ASTM E251; from
 * memory). The default `poissonRatio0` of every transverse-sensitivity function.
 *
 * @example
 * ```ts
 * CALIBRATION_POISSON_RATIO; // 0.285
 * ```
 */
export const CALIBRATION_POISSON_RATIO = 0.285;

/** The transverse sensitivity of a gauge and the calibration convention it refers to. */
export interface TransverseSensitivityOptions {
  /** Transverse sensitivity Kt of the gauge, in (−1, 1) (as a fraction: 2 % is 0.02). */
  readonly transverseSensitivity: number;
  /** Poisson ratio ν0 of the gauge-factor calibration beam, in (−1, 0.5]. Default 0.285. */
  readonly poissonRatio0?: number;
}
