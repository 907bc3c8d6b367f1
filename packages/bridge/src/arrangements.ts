import { checkOneOf, type LeadWiring } from '@bridgework/core';

/**
 * A strain-gauge bridge arrangement, named by its physics.
 *
 * @remarks
 * Arm strains, with ε the measured strain and ν the Poisson ratio (arms not listed hold
 * completion resistors):
 *
 * | arrangement | arm 1 | arm 2 | arm 3 | arm 4 | bridge factor N |
 * |---|---|---|---|---|---|
 * | `'quarter'` | ε | – | – | – | 1 |
 * | `'half-bending'` | ε | −ε | – | – | 2 |
 * | `'half-poisson'` | ε | −νε | – | – | 1 + ν |
 * | `'half-opposite'` | ε | – | ε | – | 2 |
 * | `'full-bending'` | ε | −ε | ε | −ε | 4 |
 * | `'full-poisson'` | ε | −νε | ε | −νε | 2(1 + ν) |
 * | `'full-shear'` | ε | −ε | ε | −ε | 4 (ε = the ±45° gauge strain) |
 * | `'full-bending-poisson'` | ε | −νε | νε | −ε | 2(1 + ν) |
 *
 * For small strains Vout/Vexc ≈ N·GF·ε/4. `'full-bending-poisson'` has the axial and transverse
 * gauges of the tension face in arms 1 and 2 and those of the compression face in arms 4 and 3.
 */
export type StrainArrangement =
  | 'quarter'
  | 'half-bending'
  | 'half-poisson'
  | 'half-opposite'
  | 'full-bending'
  | 'full-poisson'
  | 'full-shear'
  | 'full-bending-poisson';

/** Every {@link StrainArrangement}, in the order of the table in its documentation. */
export const strainArrangements: readonly StrainArrangement[] = [
  'quarter',
  'half-bending',
  'half-poisson',
  'half-opposite',
  'full-bending',
  'full-poisson',
  'full-shear',
  'full-bending-poisson',
];

/** A gauge's strain as `axial·ε + poisson·ν·ε`; `null` marks a completion resistor. */
export type GaugePattern = readonly [axial: number, poisson: number] | null;

/** One row of {@link arrangementTable}: what each arm holds and the lead wirings the arrangement accepts. */
export interface ArrangementInfo {
  /** Arms R1…R4 (ring order): each gauge's strain pattern, or `null` for a completion resistor. */
  readonly arms: readonly [GaugePattern, GaugePattern, GaugePattern, GaugePattern];
  /** The lead wirings this arrangement accepts (see {@link StrainBridgeOptions.leads}). */
  readonly wirings: readonly LeadWiring[];
}

/**
 * Arm patterns and the lead wirings each arrangement accepts: the one table from which
 * {@link createStrainBridge} and the channel package read every arrangement.
 *
 * @example
 * ```ts
 * arrangementTable['half-bending'].arms; // [[1, 0], [-1, 0], null, null]
 * arrangementTable.quarter.wirings; // ['two-wire', 'three-wire']
 * ```
 */
export const arrangementTable: Readonly<Record<StrainArrangement, ArrangementInfo>> = {
  quarter: { arms: [[1, 0], null, null, null], wirings: ['two-wire', 'three-wire'] },
  'half-bending': { arms: [[1, 0], [-1, 0], null, null], wirings: ['three-wire'] },
  'half-poisson': { arms: [[1, 0], [0, -1], null, null], wirings: ['three-wire'] },
  'half-opposite': { arms: [[1, 0], null, [1, 0], null], wirings: ['two-wire'] },
  'full-bending': {
    arms: [
      [1, 0],
      [-1, 0],
      [1, 0],
      [-1, 0],
    ],
    wirings: ['four-wire', 'six-wire'],
  },
  'full-poisson': {
    arms: [
      [1, 0],
      [0, -1],
      [1, 0],
      [0, -1],
    ],
    wirings: ['four-wire', 'six-wire'],
  },
  'full-shear': {
    arms: [
      [1, 0],
      [-1, 0],
      [1, 0],
      [-1, 0],
    ],
    wirings: ['four-wire', 'six-wire'],
  },
  'full-bending-poisson': {
    arms: [
      [1, 0],
      [0, -1],
      [0, 1],
      [-1, 0],
    ],
    wirings: ['four-wire', 'six-wire'],
  },
};

/**
 * True when the arrangement needs a Poisson ratio (it has a transverse gauge).
 *
 * @param arrangement - A strain arrangement.
 * @returns Whether `poissonRatio` is required.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for a name that is not an
 *   arrangement (names are case-sensitive: `'quarter'`, not `'Quarter'`).
 * @example
 * ```ts
 * needsPoissonRatio('half-poisson'); // true
 * needsPoissonRatio('quarter'); // false
 * ```
 */
export function needsPoissonRatio(arrangement: StrainArrangement): boolean {
  return arrangementTable[checkOneOf('arrangement', arrangement, strainArrangements)].arms.some(
    (g) => g !== null && g[1] !== 0,
  );
}
