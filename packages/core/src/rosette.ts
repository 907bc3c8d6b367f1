import { BridgeworkError } from './BridgeworkError.js';
import { checkFinite, checkOptions, formatValue } from './checks.js';

/**
 * The layout of a three-gauge strain rosette.
 *
 * @remarks
 * Angles are measured counterclockwise from gauge a, which lies along the x axis:
 * - `'rectangular'`: gauges a, b, c at 0°, 45°, 90°;
 * - `'delta'`: gauges a, b, c at 0°, 60°, 120°;
 * - `{ anglesRadians: [θa, θb, θc] }`: any three distinct directions (θa is usually 0).
 *
 * Shared by the transverse-sensitivity correction of rosette legs (compensation) and rosette
 * reduction (mechanics), so corrected legs feed straight into the reduction.
 */
export type RosetteLayout = 'rectangular' | 'delta' | RosetteAngles;

/** A rosette of any three gauge directions. */
export interface RosetteAngles {
  /** Directions of gauges a, b and c in radians, counterclockwise from x; three distinct directions. */
  readonly anglesRadians: readonly [number, number, number];
}

/**
 * The directions of the three gauges of a rosette layout, in radians counterclockwise from x.
 *
 * @param layout - `'rectangular'`, `'delta'` or `{ anglesRadians }`.
 * @returns `[θa, θb, θc]` in radians.
 * @throws {@link BridgeworkError} `invalid-option` for an unknown layout name; `invalid-shape`
 *   unless `anglesRadians` holds three numbers; `not-finite` for a non-finite angle; `unknown-option`
 *   for a key other than `anglesRadians`, `missing-option` without it.
 * @example
 * ```ts
 * rosetteLegAngles('rectangular'); // [0, 0.7853981633974483, 1.5707963267948966]
 * ```
 */
export function rosetteLegAngles(layout: RosetteLayout): [number, number, number] {
  if (layout === 'rectangular') return [0, Math.PI / 4, Math.PI / 2];
  if (layout === 'delta') return [0, Math.PI / 3, (2 * Math.PI) / 3];
  if (typeof layout === 'string') {
    throw new BridgeworkError(
      'invalid-option',
      `\`layout\` must be one of 'rectangular', 'delta' or { anglesRadians }; got ${formatValue(layout)}`,
      { param: 'layout', value: layout, limit: ['rectangular', 'delta'] },
    );
  }
  const angles = checkOptions('layout', layout, { known: ['anglesRadians'], required: ['anglesRadians'] })[
    'anglesRadians'
  ];
  if (!Array.isArray(angles) || angles.length !== 3) {
    throw new BridgeworkError(
      'invalid-shape',
      `\`layout.anglesRadians\` must be an array of length 3; got ${formatValue(angles)}`,
      { param: 'layout.anglesRadians', value: angles, limit: 3 },
    );
  }
  return [
    checkFinite('layout.anglesRadians[0]', angles[0]),
    checkFinite('layout.anglesRadians[1]', angles[1]),
    checkFinite('layout.anglesRadians[2]', angles[2]),
  ];
}
