import type { RosetteLayout } from '@bridgework/core';
import { checkOptions } from '@bridgework/core';
import { createRosette, type RosetteLegStrains, type RosetteReduction } from './createRosette.js';

/** Options of {@link reduceRosette}. */
export interface ReduceRosetteOptions {
  /** `'rectangular'`, `'delta'` or `{ anglesRadians: [θa, θb, θc] }` (see `RosetteLayout` in `@bridgework/core`). */
  readonly layout: RosetteLayout;
  /** Leg strains `[εa, εb, εc]` in m/m, each in (−1, 1), in the order of the layout's angles. */
  readonly strains: RosetteLegStrains;
}

/**
 * Reduces one set of rosette readings to the strain state, principal strains and direction.
 *
 * @remarks
 * A one-shot form of {@link createRosette}: `createRosette({ layout }).reduce(strains)`. For many
 * readings of one rosette, create it once. The method, the conventions (angles counterclockwise
 * from gauge a, engineering shear γxy), the equal-principal-strain flag and the rejection of
 * nearly parallel legs are described there.
 *
 * Legs corrected for transverse sensitivity by the compensation package
 * (`correctRosetteTransverse({ layout, strains, … })`, same layout type, same leg order) feed
 * straight in: correct the legs, then reduce.
 *
 * @param options - `layout` and `strains`.
 * @returns εx, εy, γxy, ε1, ε2, γmax (m/m), the direction of ε1 from gauge a and from x (rad),
 *   and `equalPrincipalStrains`.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option`, `invalid-shape`, `wrong-type`,
 *   `not-finite`, `out-of-range` (|ε| ≥ 1), `singular` (nearly parallel legs).
 * @example
 * ```ts
 * reduceRosette({ layout: 'rectangular', strains: [770e-6, 1180e-6, -350e-6] });
 * // { strainX: 0.00077, strainY: -0.00035, shearStrainXY: 0.0019400000000000003,
 * //   maxStrain: 0.00133004464…, minStrain: -0.00091004464…, maxShearStrain: 0.00224008928…,
 * //   angleRadians: 0.523610… (30.0006°), angleFromXRadians: 0.523610…, equalPrincipalStrains: false }
 * ```
 */
export function reduceRosette(options: ReduceRosetteOptions): RosetteReduction {
  const o = checkOptions('options', options, {
    known: ['layout', 'strains'],
    required: ['layout', 'strains'],
  });
  return createRosette({ layout: o['layout'] as RosetteLayout }).reduce(o['strains'] as RosetteLegStrains);
}
