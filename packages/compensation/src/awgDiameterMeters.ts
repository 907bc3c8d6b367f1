import { checkInteger } from '@bridgework/core';

/** Smallest AWG size accepted: −3 stands for 0000 (4/0), −2 for 000, −1 for 00. */
const AWG_MIN = -3;
/** Largest AWG size accepted. */
const AWG_MAX = 56;

/**
 * The nominal diameter of a solid round conductor of an American Wire Gauge size, in metres.
 *
 * @remarks
 * The ASTM B258 rule, unrounded: d = 0.127 mm × 92^((36 − n)/39), which puts 39 geometric steps
 * between AWG 36 (0.127 mm) and AWG 0000 (11.684 mm). Sizes 0000, 000 and 00 are written −3, −2
 * and −1 (n = 0 is size 0). The published tables round d to 0.0001 in (AWG 26: 0.0159 in, from
 * memory); this function returns the unrounded rule (AWG 26: 0.01594 in = 0.4049 mm), which the
 * table's entries round. The size range −3…56 is that of the ASTM table (from memory). For a stranded
 * conductor the nominal size gives about the same cross-section but not the same diameter.
 *
 * @param awg - AWG size: an integer in [−3, 56] (−3 = 0000).
 * @returns Diameter in m.
 * @throws {@link @bridgework/core!BridgeworkError} `wrong-type`, `not-finite`, `not-integer`, `out-of-range`.
 * @example
 * ```ts
 * awgDiameterMeters(26); // 4.0489187450565083e-4 (0.405 mm)
 * awgDiameterMeters(36); // 1.27e-4
 * ```
 */
export function awgDiameterMeters(awg: number): number {
  const n = checkInteger('awg', awg, { min: AWG_MIN, max: AWG_MAX });
  return 0.127e-3 * Math.pow(92, (36 - n) / 39);
}
