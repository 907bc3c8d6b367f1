import { checkFinite, checkFiniteResult, checkOptions, checkStrain } from '@bridgework/core';
import { readModulus, sectionOrDirect } from './internal/members.js';
import type { Section } from './sectionProperties.js';

/** Options of {@link createAxialMember}: the material and the area, given directly or by section. */
export interface AxialMemberOptions {
  /** Young's modulus E in Pa (> 0). */
  readonly modulusPascals: number;
  /** Cross-section area A in m² (> 0). Give this or `section`, not both. */
  readonly areaSquareMeters?: number;
  /** The cross-section, whose area is used (see {@link sectionProperties}). Give this or `areaSquareMeters`. */
  readonly section?: Section;
}

/** A member in tension or compression: force ↔ axial strain (see {@link createAxialMember}). */
export interface AxialMember {
  /** Young's modulus E, Pa. */
  readonly modulusPascals: number;
  /** Cross-section area A, m². */
  readonly areaSquareMeters: number;
  /** Axial rigidity E·A, N (force per unit strain). */
  readonly axialRigidityNewtons: number;
  /**
   * Axial force F = E·A·ε, N (tension positive).
   *
   * @param strain - Axial strain in m/m, in (−1, 1).
   * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite`, `out-of-range`.
   */
  forceFromStrain(strain: number): number;
  /**
   * Axial strain ε = F/(E·A), m/m.
   *
   * @param forceNewtons - Axial force in N (tension positive), finite.
   * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite`.
   */
  strainFromForce(forceNewtons: number): number;
}

/**
 * Creates the force–strain map of a member in uniform tension or compression.
 *
 * @remarks
 * Hooke's law for a prismatic bar, F = E·A·ε (any strength-of-materials text). ε is the axial
 * strain at the section, away from load introductions; it is what a `'half-poisson'`,
 * `'full-poisson'` or `'half-opposite'` bridge returns (bending cancelled by the gauge
 * placement). A single gauge on one face also reads bending strain. Both maps are single
 * roundings of the product or quotient (within 1 ulp of E·A·ε with E·A rounded once).
 *
 * @param options - `modulusPascals` and `areaSquareMeters` or `section`.
 * @returns An evaluator with `forceFromStrain`, `strainFromForce` and E·A.
 * @throws {@link @bridgework/core!BridgeworkError} `missing-option`, `conflicting-options`
 *   (both area and section), `wrong-type`, `not-finite`, `not-positive`, and the section errors.
 * @example
 * ```ts
 * const rod = createAxialMember({ modulusPascals: 205e9, section: { shape: 'circular', diameterMeters: 0.03 } });
 * rod.forceFromStrain(400e-6); // 57962.384… N (58.0 kN)
 * ```
 */
export function createAxialMember(options: AxialMemberOptions): AxialMember {
  const o = checkOptions('options', options, {
    known: ['modulusPascals', 'areaSquareMeters', 'section'],
    required: ['modulusPascals'],
  });
  const modulusPascals = readModulus(o);
  const areaSquareMeters = sectionOrDirect(o, 'areaSquareMeters', (p) => p.areaSquareMeters, 2, 'm²');
  const axialRigidityNewtons = modulusPascals * areaSquareMeters;
  return {
    modulusPascals,
    areaSquareMeters,
    axialRigidityNewtons,
    forceFromStrain: (strain) => axialRigidityNewtons * checkStrain('strain', strain),
    strainFromForce: (forceNewtons) =>
      checkFiniteResult(checkFinite('forceNewtons', forceNewtons) / axialRigidityNewtons, {
        what: 'the strain',
        param: 'forceNewtons',
        value: forceNewtons,
      }),
  };
}
