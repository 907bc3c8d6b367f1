import { BridgeworkError, checkPositive, checkRange, formatValue } from '@bridgework/core';

/** Poisson ratio of an isotropic solid, in (−1, 0.5] (the thermodynamic bounds, as in bridge). */
export function checkPoissonRatio(param: string, value: unknown): number {
  return checkRange(param, value, { min: -1, max: 0.5, minExclusive: true });
}

/** The largest elastic modulus accepted, in Pa (diamond's Young's modulus is about 1.2e12 Pa). */
export const MAX_MODULUS_PASCALS = 1e13;

/** Checks an elastic modulus: (0, 1e13] Pa. */
export function checkModulus(param: string, value: unknown): number {
  return checkRange(param, checkPositive(param, value), { max: MAX_MODULUS_PASCALS });
}

/** The lengths of a member accepted, in m: 1 µm to 1 km (a gauge needs a surface of some size). */
export const METERS_LIMITS = { min: 1e-6, max: 1e3 } as const;

/**
 * Checks a length (power 1), an area (2), a section modulus (3) or a second moment of area (4)
 * against the length limits raised to that power, so that every section property formed from them
 * is finite and non-zero.
 */
export function checkGeometry(param: string, value: unknown, power: 1 | 2 | 3 | 4, unit: string): number {
  const x = checkPositive(param, value);
  const min = METERS_LIMITS.min ** power;
  const max = METERS_LIMITS.max ** power;
  if (!(x >= min && x <= max)) {
    throw new BridgeworkError(
      'out-of-range',
      `\`${param}\` must be in [${min}, ${max}] ${unit}; got ${formatValue(x)}`,
      { param, value: x, limit: [min, max] },
    );
  }
  return x;
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
