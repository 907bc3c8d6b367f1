import { BridgeworkError, checkRange, formatValue } from '@bridgework/core';
import { CALIBRATION_POISSON_RATIO } from '../calibrationPoissonRatio.js';

/** Checks a transverse sensitivity Kt, in (−1, 1). */
export function checkTransverseSensitivity(param: string, value: unknown): number {
  return checkRange(param, value, { min: -1, max: 1, minExclusive: true, maxExclusive: true });
}

/** Checks ν0 (default 0.285), in (−1, 0.5]. */
export function checkPoissonRatio0(value: unknown): number {
  if (value === undefined) return CALIBRATION_POISSON_RATIO;
  return checkRange('poissonRatio0', value, { min: -1, max: 0.5, minExclusive: true });
}

/** Checks `transverseSensitivity` given as one number or as one number per gauge. */
export function checkTransverseSensitivities(value: unknown, count: number): number[] {
  if (Array.isArray(value)) {
    if (value.length !== count) {
      throw new BridgeworkError(
        'invalid-shape',
        `\`transverseSensitivity\` must be a number or an array of length ${count}; got ${formatValue(value)}`,
        { param: 'transverseSensitivity', value, limit: count },
      );
    }
    return value.map((k: unknown, i) => checkTransverseSensitivity(`transverseSensitivity[${i}]`, k));
  }
  const k = checkTransverseSensitivity('transverseSensitivity', value);
  return Array.from({ length: count }, () => k);
}
