import { differenceOfProducts } from '@bridgework/core';
import type { PrincipalStrains } from '../PrincipalStrains.js';

/**
 * Principal direction of a symmetric 2×2 tensor from its deviatoric parts, in (−π/2, π/2].
 *
 * θ = ½·atan2(g, d) with d = (εx − εy)/2 and g = γxy/2: atan2 keeps the quadrant, so θ is the
 * direction of the larger principal value (not merely a stationary direction). atan2(−0, d < 0)
 * gives −π, which is the same axis as +π: it is reported as +π/2.
 */
export function principalAngle(d: number, g: number): number {
  const theta = 0.5 * Math.atan2(g, d);
  return theta <= -Math.PI / 2 ? theta + Math.PI : theta;
}

/** Wraps an axis direction (defined modulo π) into (−π/2, π/2]. */
export function wrapAxis(angleRadians: number): number {
  let a = angleRadians - Math.PI * Math.floor((angleRadians + Math.PI / 2) / Math.PI);
  // Now a ∈ [−π/2, π/2) up to rounding; move the closed end to +π/2.
  if (a <= -Math.PI / 2) a += Math.PI;
  if (a > Math.PI / 2) a -= Math.PI;
  return a;
}

/**
 * Mohr's circle of a plane strain state (engineering shear γxy).
 *
 * Centre c = (εx + εy)/2, radius R = √(((εx − εy)/2)² + (γxy/2)²), ε1,2 = c ± R. The principal
 * strain of smaller magnitude is taken from the invariant ε1·ε2 = εx·εy − (γxy/2)² (formed with
 * the error-free `differenceOfProducts`, on inputs scaled by a power of two) whenever c ± R would
 * cancel, so both keep full relative precision. The circle counts as a point (equal principal strains, direction undefined) when
 * R ≤ `equalTolerance`.
 */
export function mohrStrain(
  strainX: number,
  strainY: number,
  shearStrainXY: number,
  equalTolerance: number,
): PrincipalStrains {
  const c = 0.5 * (strainX + strainY);
  const d = 0.5 * (strainX - strainY);
  const g = 0.5 * shearStrainXY;
  const r = Math.hypot(d, g);
  let maxStrain: number;
  let minStrain: number;
  if (Math.abs(c) >= 3 * r) {
    // No cancellation: |c ∓ R| ≥ 2|c|/3.
    maxStrain = c + r;
    minStrain = c - r;
  } else {
    // ε1·ε2 = εx·εy − g², formed error-free on inputs scaled by a power of two (exact), so that
    // the products of very small strains do not underflow.
    const k =
      2 **
      Math.min(1000, -Math.floor(Math.log2(Math.max(Math.abs(strainX), Math.abs(strainY), Math.abs(g)))));
    const product = differenceOfProducts(strainX * k, strainY * k, g * k, g * k);
    if (c >= 0) {
      maxStrain = c + r;
      minStrain = product / (maxStrain * k) / k;
    } else {
      minStrain = c - r;
      maxStrain = product / (minStrain * k) / k;
    }
  }
  const equalPrincipalStrains = r <= equalTolerance;
  return {
    maxStrain,
    minStrain,
    maxShearStrain: 2 * r,
    angleFromXRadians: equalPrincipalStrains ? 0 : principalAngle(d, g),
    equalPrincipalStrains,
  };
}
