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
