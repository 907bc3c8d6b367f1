import { checkFinite, checkFiniteResult, checkOptions } from '@bridgework/core';
import type { TransverseSensitivityOptions } from './calibrationPoissonRatio.js';
import { checkPoissonRatio0, checkTransverseSensitivity } from './internal/transverse.js';

/** Options of {@link indicatedTransverseStrain}. */
export interface IndicatedTransverseStrainOptions extends TransverseSensitivityOptions {
  /** True strain along the gauge axis εa, m/m. */
  readonly axialStrain: number;
  /** True strain perpendicular to the gauge axis εt, m/m. */
  readonly transverseStrain: number;
}

/**
 * The strain a gauge indicates in a biaxial strain field, given its transverse sensitivity.
 *
 * @remarks
 * A gauge responds to strain across its axis as well: ΔR/R = Fa·εa + Ft·εt, with Kt = Ft/Fa. Its
 * gauge factor GF was measured on a beam in uniaxial stress, where εt = −ν0·εa, so
 * GF = Fa·(1 − ν0·Kt). The instrument at GF therefore indicates
 *
 *   ε̂ = (εa + Kt·εt)/(1 − ν0·Kt)
 *
 * (the standard transverse-sensitivity relation, e.g. Dally & Riley, _Experimental Stress
 * Analysis_, strain-gauge chapter; from memory). With Kt = 0.02, ν0 = 0.285, εx = 1000 µε and
 * εy = −300 µε, the x gauge reads 999.69828 µε and the y gauge −281.60515 µε. The corrections
 * ({@link correctTransverseGauge}, {@link correctTransversePair}, {@link correctRosetteTransverse})
 * invert this relation exactly.
 *
 * @param options - True axial and transverse strain, Kt, ν0.
 * @returns The indicated strain, m/m.
 * @throws {@link @bridgework/core!BridgeworkError} `out-of-range` for Kt outside (−1, 1) or ν0
 *   outside (−1, 0.5], or (against the first strain) a result beyond binary64; `not-finite`,
 *   `wrong-type` for bad numbers;
 *   `unknown-option` for a key it does not know (naming the closest), `missing-option` for a
 *   required one.
 * @example
 * ```ts
 * indicatedTransverseStrain({ axialStrain: 1e-3, transverseStrain: -3e-4, transverseSensitivity: 0.02 });
 * // 9.996982801971236e-4 (999.69828 µε)
 * ```
 */
export function indicatedTransverseStrain(options: IndicatedTransverseStrainOptions): number {
  const o = checkOptions('options', options, {
    known: ['axialStrain', 'transverseStrain', 'transverseSensitivity', 'poissonRatio0'],
    required: ['axialStrain', 'transverseStrain', 'transverseSensitivity'],
  });
  const axialStrain = checkFinite('axialStrain', o['axialStrain']);
  const transverseStrain = checkFinite('transverseStrain', o['transverseStrain']);
  const k = checkTransverseSensitivity('transverseSensitivity', o['transverseSensitivity']);
  const nu0 = checkPoissonRatio0(o['poissonRatio0']);
  return checkFiniteResult((axialStrain + k * transverseStrain) / (1 - nu0 * k), {
    what: 'the indicated strain',
    param: 'axialStrain',
    value: axialStrain,
  });
}
