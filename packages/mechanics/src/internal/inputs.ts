import { BridgeworkError, checkFinite, checkRange, formatValue } from '@bridgework/core';

/**
 * Checks a strain (m/m) for the small-strain relations of this package: finite and |ε| < 1.
 *
 * A strain of magnitude 1 or more lies far outside linear elasticity, and is almost always a
 * value in µε passed where m/m is expected, so it is rejected rather than used.
 */
export function checkStrain(param: string, value: unknown): number {
  const strain = checkFinite(param, value);
  if (!(Math.abs(strain) < 1)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`${param}\` must be a strain in m/m in (-1, 1) (use strainFromMicrostrain for µε); got ${formatValue(strain)}`,
      { param, value: strain, limit: [-1, 1] },
    );
  }
  return strain;
}

/** Poisson ratio of an isotropic solid, in (−1, 0.5] (the thermodynamic bounds, as in bridge). */
export function checkPoissonRatio(param: string, value: unknown): number {
  return checkRange(param, value, { min: -1, max: 0.5, minExclusive: true });
}

/** Shear modulus of an isotropic solid from E and ν: G = E/(2(1 + ν)). */
export function shearModulusOf(modulusPascals: number, poissonRatio: number): number {
  return modulusPascals / (2 * (1 + poissonRatio));
}

/** Throws `conflicting-options` when more than one of the named options is given. */
export function checkExclusive(o: Record<string, unknown>, names: readonly string[]): void {
  const given = names.filter((n) => o[n] !== undefined);
  if (given.length > 1) {
    throw new BridgeworkError(
      'conflicting-options',
      `\`${given[1]}\` must not be given together with \`${given[0]}\`; got both`,
      { param: given[1] as string, value: o[given[1] as string], limit: names },
    );
  }
}
