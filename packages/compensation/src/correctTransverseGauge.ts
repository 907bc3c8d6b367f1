import { checkFinite, checkFiniteResult, checkOptions } from '@bridgework/core';
import type { TransverseSensitivityOptions } from './calibrationPoissonRatio.js';
import { checkPoissonRatio0, checkTransverseSensitivity } from './internal/transverse.js';

/** Options of {@link correctTransverseGauge}. */
export interface CorrectTransverseGaugeOptions extends TransverseSensitivityOptions {
  /** The strain indicated by the gauge, m/m. */
  readonly strain: number;
  /** The true strain perpendicular to the gauge axis, m/m (known from the stress state or another gauge). */
  readonly transverseStrain: number;
}

/**
 * Corrects one gauge's reading for transverse sensitivity, given the true transverse strain.
 *
 * @remarks
 * Inverts ε̂ = (εa + Kt·εt)/(1 − ν0·Kt) ({@link indicatedTransverseStrain}) for the axial strain:
 *
 *   εa = ε̂·(1 − ν0·Kt) − Kt·εt.
 *
 * Use it when the transverse strain is known independently, for example εt = −ν·εa on a bar in
 * uniaxial stress of Poisson ratio ν (then the error vanishes only when ν = ν0). When the
 * transverse strain is itself measured by a second gauge, use {@link correctTransversePair},
 * which corrects both readings together. Exact closed form (three roundings).
 *
 * @param options - Indicated strain, true transverse strain, Kt, ν0.
 * @returns The true axial strain, m/m.
 * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` for Kt outside (−1, 1) or ν0
 *   outside (−1, 0.5], or (against the first strain) a result beyond binary64; `not-finite`,
 *   `wrong-type` for bad numbers;
 *   `unknown-option` for a key it does not know (naming the closest), `missing-option` for a
 *   required one.
 * @example
 * ```ts
 * correctTransverseGauge({ strain: 9.996982801971236e-4, transverseStrain: -3e-4, transverseSensitivity: 0.02 });
 * // 1e-3 (to an ulp)
 * ```
 */
export function correctTransverseGauge(options: CorrectTransverseGaugeOptions): number {
  const o = checkOptions('options', options, {
    known: ['strain', 'transverseStrain', 'transverseSensitivity', 'poissonRatio0'],
    required: ['strain', 'transverseStrain', 'transverseSensitivity'],
  });
  const strain = checkFinite('strain', o['strain']);
  const transverseStrain = checkFinite('transverseStrain', o['transverseStrain']);
  const k = checkTransverseSensitivity('transverseSensitivity', o['transverseSensitivity']);
  const nu0 = checkPoissonRatio0(o['poissonRatio0']);
  return checkFiniteResult(strain * (1 - nu0 * k) - k * transverseStrain, {
    what: 'the corrected strain',
    param: 'strain',
    value: strain,
  });
}
