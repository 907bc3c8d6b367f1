/** The principal strains of a plane strain state and the direction of the larger one. */
export interface PrincipalStrains {
  /** Larger (algebraically) in-plane principal strain ε1, m/m. */
  readonly maxStrain: number;
  /** Smaller (algebraically) in-plane principal strain ε2, m/m. */
  readonly minStrain: number;
  /** Maximum in-plane engineering shear strain γmax = ε1 − ε2 (≥ 0), m/m. */
  readonly maxShearStrain: number;
  /**
   * Direction of `maxStrain`, counterclockwise from +x, in radians in (−π/2, π/2]; 0 when
   * `equalPrincipalStrains` is true (then every direction is principal, 0 among them).
   */
  readonly angleFromXRadians: number;
  /**
   * True when ε1 = ε2 (Mohr's circle is a point): every direction is principal, so the angles
   * (reported as 0) carry no information; check this flag before using them.
   */
  readonly equalPrincipalStrains: boolean;
}
