import { BridgeworkError, checkFinite, checkFiniteResult, checkOptions, checkStrain } from '@bridgework/core';
import { checkGeometry } from './internal/inputs.js';
import { readModulus, sectionOrDirect } from './internal/members.js';
import type { Section } from './sectionProperties.js';

/** Options of {@link createBendingMember}. */
export interface BendingMemberOptions {
  /** Young's modulus E in Pa (> 0). */
  readonly modulusPascals: number;
  /** The cross-section at the gauges (see {@link sectionProperties}). Give this or `sectionModulusCubicMeters`. */
  readonly section?: Section;
  /** Elastic section modulus S = I/c in m³ (> 0), for other shapes. Give this or `section`. */
  readonly sectionModulusCubicMeters?: number;
  /**
   * Lever arm L in m (> 0): the distance along the member from the line of the applied force to
   * the gauged section, for the force maps. Optional; without it only the moment maps work.
   */
  readonly leverArmMeters?: number;
}

/** A member in bending: moment (and force at a lever arm) ↔ surface strain (see {@link createBendingMember}). */
export interface BendingMember {
  /** Young's modulus E, Pa. */
  readonly modulusPascals: number;
  /** Elastic section modulus S, m³. */
  readonly sectionModulusCubicMeters: number;
  /** Lever arm L, m, or `undefined` when not configured. */
  readonly leverArmMeters: number | undefined;
  /**
   * Bending moment M = E·S·ε at the gauged section, N·m (positive when the gauged face is in tension).
   *
   * @param strain - Surface bending strain in m/m, in (−1, 1).
   * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite`, `out-of-range`.
   */
  momentFromStrain(strain: number): number;
  /**
   * Surface bending strain ε = M/(E·S), m/m.
   *
   * @param momentNewtonMeters - Bending moment in N·m, finite.
   * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite`.
   */
  strainFromMoment(momentNewtonMeters: number): number;
  /**
   * Force F = E·S·ε/L applied at the lever arm, N.
   *
   * @param strain - Surface bending strain in m/m, in (−1, 1).
   * @throws {@link @bridgework/core!BridgeworkError} `missing-option` (no `leverArmMeters`
   *   configured), `wrong-type`, `not-finite`, `out-of-range`.
   */
  forceFromStrain(strain: number): number;
  /**
   * Surface bending strain ε = F·L/(E·S) for a force at the lever arm, m/m.
   *
   * @param forceNewtons - Force in N, finite.
   * @throws {@link @bridgework/core!BridgeworkError} `missing-option` (no `leverArmMeters`),
   *   `wrong-type`, `not-finite`.
   */
  strainFromForce(forceNewtons: number): number;
}

/**
 * Creates the moment–strain (and force–strain) map of a member in elastic bending.
 *
 * @remarks
 * Euler–Bernoulli beam theory: the surface stress is σ = M·c/I = M/S, so the surface strain is
 * ε = M/(E·S), and M = E·S·ε. A force at lever arm L from the gauged section (a cantilever loaded
 * at its end, a load-cell beam) gives M = F·L, so F = E·S·ε/L. Any strength-of-materials text
 * (for example Gere & Goodno, _Mechanics of Materials_, stresses in beams; from memory). With
 * S = b·h²/6 for a rectangle, πD³/32 for a round bar and π(D⁴ − d⁴)/(32D) for a tube
 * ({@link sectionProperties}).
 *
 * ε is the bending strain at the surface: what a `'half-bending'`, `'full-bending'` or
 * `'full-bending-poisson'` bridge returns (gauges on opposite faces, axial strain cancelled). The
 * sign follows the gauge: positive strain (the gauged face, arm 1, in tension) gives a positive
 * moment and force. Valid for slender members in the elastic range, away from load points and
 * supports (shear and local stresses are not modelled).
 *
 * @param options - `modulusPascals`, `section` or `sectionModulusCubicMeters`, optional `leverArmMeters`.
 * @returns An evaluator with the moment and force maps.
 * @throws {@link @bridgework/core!BridgeworkError} `missing-option`, `conflicting-options`,
 *   `wrong-type`, `not-finite`, `not-positive`, and the section errors.
 * @example
 * ```ts
 * const beam = createBendingMember({
 *   modulusPascals: 200e9,
 *   section: { shape: 'rectangular', widthMeters: 0.02, depthMeters: 0.006 },
 *   leverArmMeters: 0.1,
 * });
 * beam.momentFromStrain(500e-6); // 11.999999999999998 (12 N·m)
 * beam.forceFromStrain(500e-6); // 119.99999999999997 (120 N)
 * ```
 */
export function createBendingMember(options: BendingMemberOptions): BendingMember {
  const o = checkOptions('options', options, {
    known: ['modulusPascals', 'section', 'sectionModulusCubicMeters', 'leverArmMeters'],
    required: ['modulusPascals'],
  });
  const modulusPascals = readModulus(o);
  const sectionModulusCubicMeters = sectionOrDirect(
    o,
    'sectionModulusCubicMeters',
    (p) => p.sectionModulusCubicMeters,
    3,
    'm³',
  );
  const leverArmMeters =
    o['leverArmMeters'] === undefined
      ? undefined
      : checkGeometry('leverArmMeters', o['leverArmMeters'], 1, 'm');
  const rigidity = modulusPascals * sectionModulusCubicMeters; // N·m per unit strain

  function leverArm(): number {
    if (leverArmMeters === undefined) {
      throw new BridgeworkError(
        'missing-option',
        '`leverArmMeters` must be given to createBendingMember for the force maps; got undefined',
        { param: 'leverArmMeters', value: undefined },
      );
    }
    return leverArmMeters;
  }

  return {
    modulusPascals,
    sectionModulusCubicMeters,
    leverArmMeters,
    momentFromStrain: (strain) => rigidity * checkStrain('strain', strain),
    strainFromMoment: (momentNewtonMeters) =>
      checkFiniteResult(checkFinite('momentNewtonMeters', momentNewtonMeters) / rigidity, {
        what: 'the strain',
        param: 'momentNewtonMeters',
        value: momentNewtonMeters,
      }),
    forceFromStrain: (strain) => {
      const arm = leverArm();
      return (rigidity * checkStrain('strain', strain)) / arm;
    },
    strainFromForce: (forceNewtons) => {
      const arm = leverArm();
      return checkFiniteResult((checkFinite('forceNewtons', forceNewtons) * arm) / rigidity, {
        what: 'the strain',
        param: 'forceNewtons',
        value: forceNewtons,
      });
    },
  };
}
