import { checkFinite, checkOptions, checkStrain } from '@bridgework/core';
import { mohrStrain } from './internal/mohr.js';
import type { PrincipalStrains } from './PrincipalStrains.js';

/**
 * A plane strain state on a surface, in the x–y frame of the rosette drawing.
 *
 * @remarks
 * Strains are in m/m, tension positive. The shear strain is the **engineering** shear strain
 * γxy = 2·εxy (the change of the right angle between x and y, in radians), not the tensor
 * component εxy; the strain tensor is `[[εx, γxy/2], [γxy/2, εy]]`. γxy > 0 when the right angle
 * between the +x and +y directions closes.
 */
export interface StrainState {
  /** Normal strain along x, m/m. */
  readonly strainX: number;
  /** Normal strain along y (x turned 90° counterclockwise), m/m. */
  readonly strainY: number;
  /** Engineering shear strain γxy = 2·εxy, m/m (radians). */
  readonly shearStrainXY: number;
}

const strainStateFields = ['strainX', 'strainY', 'shearStrainXY'];
// A rosette reduction is a strain state with its principal strains: it may be passed as one.
const strainStateKeys = [
  ...strainStateFields,
  'maxStrain',
  'minStrain',
  'maxShearStrain',
  'angleFromXRadians',
  'equalPrincipalStrains',
  'angleRadians',
];

/** @internal Reads and checks a {@link StrainState} option (a `RosetteReduction` will do). */
export function readStrainState(param: string, value: unknown): StrainState {
  const s = checkOptions(param, value, { known: strainStateKeys, required: strainStateFields });
  return {
    strainX: checkStrain(`${param}.strainX`, s['strainX']),
    strainY: checkStrain(`${param}.strainY`, s['strainY']),
    shearStrainXY: checkStrain(`${param}.shearStrainXY`, s['shearStrainXY']),
  };
}

/**
 * The normal strain in a direction θ of a plane strain state (the strain-transformation equation).
 *
 * @remarks
 * εθ = εx·cos²θ + εy·sin²θ + γxy·sinθ·cosθ, with θ counterclockwise from +x and γxy the
 * engineering shear strain; this is the reading of a gauge aligned at θ (transverse sensitivity
 * neglected). Any strength-of-materials text derives it from the displacement gradient (for
 * example Gere & Goodno, _Mechanics of Materials_, plane strain chapter; from memory). At θ = 0
 * the result is εx exactly.
 *
 * @param state - The strain state; each component in (−1, 1) m/m.
 * @param angleRadians - Direction θ in radians, counterclockwise from +x (any finite value).
 * @returns The normal strain along θ, m/m.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type` (state not an object, or a
 *   non-number), `not-finite`, `out-of-range` (a strain component with |ε| ≥ 1).
 * @example
 * ```ts
 * normalStrainAtAngle({ strainX: 800e-6, strainY: -200e-6, shearStrainXY: 600e-6 }, Math.PI / 4);
 * // 0.0006000000000000001 (600 µε: (800 − 200)/2 + 600/2)
 * ```
 */
export function normalStrainAtAngle(state: StrainState, angleRadians: number): number {
  const { strainX, strainY, shearStrainXY } = readStrainState('state', state);
  return strainAlong(strainX, strainY, shearStrainXY, checkFinite('angleRadians', angleRadians));
}

/** @internal εθ = εx·cos²θ + εy·sin²θ + γxy·sinθ·cosθ, unchecked. */
export function strainAlong(strainX: number, strainY: number, shearStrainXY: number, theta: number): number {
  const c = Math.cos(theta);
  const s = Math.sin(theta);
  return strainX * c * c + strainY * s * s + shearStrainXY * s * c;
}

/**
 * Principal strains, maximum shear strain and principal direction of a plane strain state.
 *
 * @remarks
 * Mohr's circle for strain (Mohr 1882; any strength-of-materials text): centre
 * c = (εx + εy)/2, radius R = √(((εx − εy)/2)² + (γxy/2)²),
 *
 *   ε1,2 = c ± R,  γmax = ε1 − ε2 = 2R,  θp = ½·atan2(γxy, εx − εy).
 *
 * θp is taken with the two-argument arctangent, so it is the direction of ε1 in every quadrant
 * (the one-argument form tan 2θp = γxy/(εx − εy) cannot tell ε1 from ε2). It lies in
 * (−π/2, π/2], counterclockwise positive. The principal strain of smaller magnitude comes from
 * the invariant ε1·ε2 = εx·εy − (γxy/2)² (an error-free product difference) when c ± R would
 * cancel, so both principal strains keep full relative precision: within a few ulps of the
 * eigenvalues of `[[εx, γxy/2], [γxy/2, εy]]`.
 *
 * Equal principal strains (εx = εy and γxy = 0 exactly; the given state is taken as exact):
 * `equalPrincipalStrains` is true and `angleFromXRadians` is 0 (every direction is principal).
 *
 * @param state - εx, εy and the engineering shear γxy, each in (−1, 1) m/m.
 * @returns ε1, ε2 (m/m), γmax (m/m), the direction of ε1 (rad) and the equal-strains flag.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite`, `out-of-range`
 *   (|ε| ≥ 1: probably µε passed as m/m).
 * @example
 * ```ts
 * principalStrainsFromState({ strainX: 770e-6, strainY: -350e-6, shearStrainXY: 1940e-6 });
 * // { maxStrain: 0.001330044641967453, minStrain: -0.0009100446419674531,
 * //   maxShearStrain: 0.002240089283934906, angleFromXRadians: 0.5236102813364414 (30.0006°),
 * //   equalPrincipalStrains: false }
 * ```
 */
export function principalStrainsFromState(state: StrainState): PrincipalStrains {
  const { strainX, strainY, shearStrainXY } = readStrainState('state', state);
  return mohrStrain(strainX, strainY, shearStrainXY, 0);
}
