/**
 * How a sensor is connected to the instrument, named by its conductor count.
 *
 * @remarks
 * - `'two-wire'`: a quarter-bridge gauge on two leads; both leads sit in series with the gauge.
 * - `'three-wire'`: a quarter- or half-bridge on three leads; one lead sits in arm 1, one in arm 2,
 *   and the third (the sense lead to S−) carries no current, so lead resistance and its
 *   temperature drift largely cancel.
 * - `'four-wire'`: a full bridge on four leads; the two excitation leads drop part of the
 *   excitation, so the span is reduced by Rin/(Rin + 2·RL).
 * - `'six-wire'`: a full bridge with two sense leads that measure the excitation at the bridge
 *   (remote sense); the excitation-lead drop is removed from the ratio.
 */
export type LeadWiring = 'two-wire' | 'three-wire' | 'four-wire' | 'six-wire';

/** Every {@link LeadWiring} value, for option checks. */
export const leadWirings: readonly LeadWiring[] = ['two-wire', 'three-wire', 'four-wire', 'six-wire'];

/** Lead wires of a sensor: the resistance of one conductor and how the sensor is wired. */
export interface LeadsOptions {
  /** Resistance of one lead conductor in Ω (≥ 0), at the temperature of interest. */
  readonly ohmsPerLead: number;
  /** The wiring of the sensor. */
  readonly wiring: LeadWiring;
}
