import { checkOneOf, type LeadWiring } from '@bridgework/core';

/** A gauge's strain as `axial·ε + poisson·ν·ε`; `null` marks a completion resistor. */
export type GaugePattern = readonly [axial: number, poisson: number] | null;

/**
 * What the strain ε of an arrangement is, which decides the quantities it can give: a normal
 * strain (axial or surface), a bending strain (the axial part cancelled), or the ±45° strain of
 * pure shear.
 */
export type MeasuredStrain = 'normal' | 'bending' | 'shear';

/** One row of {@link arrangementTable}: what each arm holds, the lead wirings the arrangement accepts, and what it measures. */
export interface ArrangementInfo {
  /** Arms R1…R4 (ring order): each gauge's strain pattern, or `null` for a completion resistor. */
  readonly arms: readonly [GaugePattern, GaugePattern, GaugePattern, GaugePattern];
  /** The lead wirings this arrangement accepts (see `StrainBridgeOptions.leads`). */
  readonly wirings: readonly LeadWiring[];
  /** What its strain ε is (see {@link MeasuredStrain}). */
  readonly measures: MeasuredStrain;
}

const arrangementRows = {
  quarter: { arms: [[1, 0], null, null, null], wirings: ['two-wire', 'three-wire'], measures: 'normal' },
  'half-bending': { arms: [[1, 0], [-1, 0], null, null], wirings: ['three-wire'], measures: 'bending' },
  'half-poisson': { arms: [[1, 0], [0, -1], null, null], wirings: ['three-wire'], measures: 'normal' },
  'half-opposite': { arms: [[1, 0], null, [1, 0], null], wirings: ['two-wire'], measures: 'normal' },
  'full-bending': {
    arms: [
      [1, 0],
      [-1, 0],
      [1, 0],
      [-1, 0],
    ],
    wirings: ['four-wire', 'six-wire'],
    measures: 'bending',
  },
  'full-poisson': {
    arms: [
      [1, 0],
      [0, -1],
      [1, 0],
      [0, -1],
    ],
    wirings: ['four-wire', 'six-wire'],
    measures: 'normal',
  },
  'full-shear': {
    arms: [
      [1, 0],
      [-1, 0],
      [1, 0],
      [-1, 0],
    ],
    wirings: ['four-wire', 'six-wire'],
    measures: 'shear',
  },
  'full-bending-poisson': {
    arms: [
      [1, 0],
      [0, -1],
      [0, 1],
      [-1, 0],
    ],
    wirings: ['four-wire', 'six-wire'],
    measures: 'bending',
  },
} as const satisfies Readonly<Record<string, ArrangementInfo>>;

/**
 * A strain-gauge bridge arrangement, named by its physics: a key of {@link arrangementTable}
 * (see its table of arm strains).
 */
export type StrainArrangement = keyof typeof arrangementRows;

/**
 * Arm patterns, accepted lead wirings and measured strain of each arrangement: the one table from
 * which {@link createStrainBridge}, `createStrainBridgeKernel` and the channel package read every
 * arrangement. Its keys are the {@link StrainArrangement} names and {@link strainArrangements}, so
 * a new arrangement is one row here.
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
 *
 * @example
 * ```ts
 * arrangementTable['half-bending'].arms; // [[1, 0], [-1, 0], null, null]
 * arrangementTable.quarter.wirings; // ['two-wire', 'three-wire']
 * ```
 */
export const arrangementTable: Readonly<Record<StrainArrangement, ArrangementInfo>> = arrangementRows;

/** Every {@link StrainArrangement}, in the order of {@link arrangementTable}. */
export const strainArrangements: readonly StrainArrangement[] = Object.keys(
  arrangementRows,
) as StrainArrangement[];

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
