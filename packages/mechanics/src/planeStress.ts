import { checkLength, checkOptions, checkStrain, requireOption } from '@bridgework/core';
import { checkExclusive, checkModulus, checkPoissonRatio, shearModulusOf } from './internal/inputs.js';
import { mohrStrain } from './internal/mohr.js';
import { readStrainState, type StrainState } from './strainState.js';

/** The elastic constants of an isotropic, linear-elastic material. */
export interface ElasticOptions {
  /** Young's modulus E in Pa (> 0), e.g. 200e9 for steel. */
  readonly modulusPascals: number;
  /** Poisson ratio ν, in (−1, 0.5]. */
  readonly poissonRatio: number;
}

/** Options of {@link planeStress} from principal strains. */
export interface PlaneStressFromPrincipalOptions extends ElasticOptions {
  /** The two in-plane principal strains [ε1, ε2] in m/m, each in (−1, 1), in either order. */
  readonly principalStrains: readonly [number, number];
  /** Not given with `principalStrains` (the two exclude each other). */
  readonly strainState?: undefined;
}

/** Options of {@link planeStress} from a full strain state (for example a rosette reduction). */
export interface PlaneStressFromStateOptions extends ElasticOptions {
  /** εx, εy and the engineering shear γxy in m/m, each in (−1, 1); a `RosetteReduction` will do. */
  readonly strainState: StrainState;
  /** Not given with `strainState` (the two exclude each other). */
  readonly principalStrains?: undefined;
}

/** Stresses of a plane stress state (σ3 = 0 normal to the surface). */
export interface PlaneStress {
  /** Larger in-plane principal stress σ1, Pa (tension positive). */
  readonly maxStressPascals: number;
  /** Smaller in-plane principal stress σ2, Pa. */
  readonly minStressPascals: number;
  /** Maximum in-plane shear stress (σ1 − σ2)/2 (≥ 0), Pa. */
  readonly maxShearPascals: number;
  /** Absolute maximum shear stress with σ3 = 0: max(σ1 − σ2, |σ1|, |σ2|)/2 (≥ 0), Pa. */
  readonly absoluteMaxShearPascals: number;
  /** Von Mises equivalent stress √(σ1² − σ1σ2 + σ2²) (≥ 0), Pa. */
  readonly vonMisesPascals: number;
  /** Tresca equivalent stress, twice the absolute maximum shear (≥ 0), Pa. */
  readonly trescaPascals: number;
  /** Strain normal to the surface, εz = −ν(ε1 + ε2)/(1 − ν), m/m. */
  readonly outOfPlaneStrain: number;
}

/** Plane stress from a full strain state: the principal values and the x–y components. */
export interface PlaneStressWithComponents extends PlaneStress {
  /** Normal stress σx, Pa. */
  readonly stressXPascals: number;
  /** Normal stress σy, Pa. */
  readonly stressYPascals: number;
  /** Shear stress τxy = G·γxy, Pa (same sign convention as γxy). */
  readonly shearStressXYPascals: number;
}

/**
 * Stresses from surface strains of an isotropic linear-elastic material in plane stress.
 *
 * @remarks
 * Hooke's law for plane stress (σz = τxz = τyz = 0, the free surface where gauges sit; any
 * strength-of-materials text, e.g. Timoshenko & Goodier, _Theory of Elasticity_; from memory):
 *
 *   σ1 = E(ε1 + νε2)/(1 − ν²),  σ2 = E(ε2 + νε1)/(1 − ν²),
 *   σx = E(εx + νεy)/(1 − ν²),  σy = E(εy + νεx)/(1 − ν²),  τxy = G·γxy,  G = E/(2(1 + ν)),
 *   εz = −ν(ε1 + ε2)/(1 − ν).
 *
 * For an isotropic material the principal stress and strain directions coincide, so the
 * direction of σ1 is the `angleRadians` of the rosette reduction. From these:
 * in-plane maximum shear τmax = (σ1 − σ2)/2 = G·(ε1 − ε2); with σ3 = 0 the absolute maximum shear
 * is max(σ1 − σ2, |σ1|, |σ2|)/2 and Tresca's equivalent stress twice that; von Mises
 * σvm = √(σ1² − σ1σ2 + σ2²), evaluated as √(((σ1 − σ2)² + σ1² + σ2²)/2) so that no term
 * cancels. From a strain state the principal strains come from Mohr's circle
 * ({@link principalStrainsFromState}) and ε1 − ε2 = 2R is taken from the circle, not from a
 * difference of nearly equal numbers.
 *
 * Accuracy: every field within a few ulps of the same equations evaluated in 40-digit decimal
 * arithmetic (tested to 1e-14 relative, or 1e-14 of the largest stress when a field is much
 * smaller than the others). Valid while the material stays linear-elastic: compare the result
 * with the yield strength.
 *
 * @param options - `principalStrains` or `strainState` (exactly one), `modulusPascals`, `poissonRatio`.
 * @returns Principal stresses, shears and equivalent stresses in Pa, and εz in m/m; with a
 *   `strainState`, also σx, σy and τxy.
 * @throws {@link @bridgework/core!BridgeworkError} `missing-option` (neither strain input, or a
 *   missing constant), `conflicting-options` (both strain inputs), `invalid-shape`
 *   (`principalStrains` not a pair), `wrong-type`, `not-finite`, `not-positive` (E),
 *   `out-of-range` (ν outside (−1, 0.5], |ε| ≥ 1).
 * @example
 * ```ts
 * planeStress({
 *   strainState: { strainX: 800e-6, strainY: -200e-6, shearStrainXY: 600e-6 },
 *   modulusPascals: 200e9,
 *   poissonRatio: 0.3,
 * });
 * // { maxStressPascals: 175.4212…e6, minStressPascals: -3.9927…e6, vonMisesPascals: 177.4513…e6,
 * //   stressXPascals: 162.6373…e6, stressYPascals: 8.7912…e6, shearStressXYPascals: 46.1538…e6, … }
 * ```
 */
export function planeStress(options: PlaneStressFromStateOptions): PlaneStressWithComponents;
export function planeStress(options: PlaneStressFromPrincipalOptions): PlaneStress;
export function planeStress(
  options: PlaneStressFromStateOptions | PlaneStressFromPrincipalOptions,
): PlaneStress | PlaneStressWithComponents {
  const o = checkOptions('options', options, {
    known: ['modulusPascals', 'poissonRatio', 'principalStrains', 'strainState'],
    required: ['modulusPascals', 'poissonRatio'],
  });
  checkExclusive(o, ['principalStrains', 'strainState']);
  const modulusPascals = checkModulus('modulusPascals', o['modulusPascals']);
  const nu = checkPoissonRatio('poissonRatio', o['poissonRatio']);
  const k = modulusPascals / ((1 - nu) * (1 + nu));
  const shearModulus = shearModulusOf(modulusPascals, nu);

  if (o['strainState'] !== undefined) {
    const { strainX, strainY, shearStrainXY } = readStrainState('strainState', o['strainState']);
    const p = mohrStrain(strainX, strainY, shearStrainXY, 0);
    return {
      ...principalStresses(p.maxStrain, p.minStrain, p.maxShearStrain, strainX + strainY),
      stressXPascals: k * (strainX + nu * strainY),
      stressYPascals: k * (strainY + nu * strainX),
      shearStressXYPascals: shearModulus * shearStrainXY,
    };
  }
  const pair = checkLength<number>(
    'principalStrains',
    requireOption('principalStrains', o['principalStrains'], 'or `strainState`'),
    2,
  );
  const e1 = checkStrain('principalStrains[0]', pair[0]);
  const e2 = checkStrain('principalStrains[1]', pair[1]);
  const max = Math.max(e1, e2);
  const min = Math.min(e1, e2);
  return principalStresses(max, min, max - min, e1 + e2);

  function principalStresses(max: number, min: number, difference: number, sum: number): PlaneStress {
    const maxStressPascals = k * (max + nu * min);
    const minStressPascals = k * (min + nu * max);
    const maxShearPascals = shearModulus * difference;
    const absoluteMaxShearPascals = Math.max(
      maxShearPascals,
      0.5 * Math.abs(maxStressPascals),
      0.5 * Math.abs(minStressPascals),
    );
    const twiceShear = 2 * maxShearPascals;
    return {
      maxStressPascals,
      minStressPascals,
      maxShearPascals,
      absoluteMaxShearPascals,
      vonMisesPascals: Math.sqrt(
        0.5 *
          (twiceShear * twiceShear +
            maxStressPascals * maxStressPascals +
            minStressPascals * minStressPascals),
      ),
      trescaPascals: 2 * absoluteMaxShearPascals,
      outOfPlaneStrain: (-nu * sum) / (1 - nu) + 0, // + 0: report +0, not −0, for ε1 + ε2 = 0
    };
  }
}
