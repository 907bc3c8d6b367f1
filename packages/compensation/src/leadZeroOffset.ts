import { checkOhms, checkOptions, blameOption } from '@bridgework/core';
import type { QuarterBridgeGaugeOptions } from './leadDesensitization.js';
import { checkQuarterSetup, quarterBridge, quarterGaugeKeys } from './internal/leads.js';

/** Options of {@link leadZeroOffset}. */
export interface LeadZeroOffsetOptions extends QuarterBridgeGaugeOptions {
  /** Resistance of one lead conductor RL in Ω (≥ 0). */
  readonly ohmsPerLead: number;
}

/** The zero offset that lead resistance gives a quarter bridge (see {@link leadZeroOffset}). */
export interface LeadZeroOffset {
  /** Output ratio at zero strain with the leads, V/V. */
  readonly offsetRatio: number;
  /**
   * The strain (m/m) that a model of the same bridge without leads reads for `offsetRatio`: the
   * apparent strain of the leads before the channel is zeroed.
   */
  readonly apparentStrain: number;
}

/**
 * The zero offset of a two- or three-wire quarter bridge caused by its lead resistance.
 *
 * @remarks
 * Both numbers come from `createStrainBridge` of the bridge package (exact, ideal meter): the
 * offset is the ratio of the bridge with its leads at zero strain, and the apparent strain is the
 * exact inverse of that ratio through the same bridge without leads. Two-wire leads add 2RL to
 * arm 1, so the apparent strain is exactly 2RL/(GF·Rg) whatever the completion; with
 * completion = Rg the offset is RL/(2(Rg + RL)). Three-wire leads add RL to arms 1 and 2, so with
 * completion = Rg the bridge stays balanced: offset and apparent strain are exactly 0 (the reason
 * for the three-wire circuit). These closed forms are checked in the tests.
 *
 * @param options - Gauge factor, gauge and completion resistance, lead resistance and wiring.
 * @returns The offset ratio and its apparent strain.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for a wiring other than
 *   two- or three-wire; `not-positive`, `negative`, `not-finite`, `wrong-type` for bad numbers;
 *   `out-of-range` (against `ohmsPerLead`) when the offset is beyond what the lead-free bridge can
 *   read, or for a gauge factor or resistance outside its limits;
 *   `unknown-option` for a key it does not know (naming the closest), `missing-option` for a
 *   required one.
 * @example
 * ```ts
 * const z = leadZeroOffset({ gaugeFactor: 2, gaugeOhms: 350, ohmsPerLead: 1, wiring: 'two-wire' });
 * z.offsetRatio; // 0.0014245014245... (1.42 mV/V)
 * z.apparentStrain; // 0.002857142857... (2857 µε = 2·1/(2·350))
 * ```
 */
export function leadZeroOffset(options: LeadZeroOffsetOptions): LeadZeroOffset {
  const o = checkOptions('options', options, {
    known: [...quarterGaugeKeys, 'ohmsPerLead'],
    required: ['gaugeFactor', 'wiring', 'ohmsPerLead'],
  });
  const setup = checkQuarterSetup(o);
  const ohmsPerLead = checkOhms('ohmsPerLead', o['ohmsPerLead'], { allowZero: true });
  const offsetRatio = quarterBridge(setup, ohmsPerLead).offsetRatio;
  const apparentStrain = blameOption(
    {
      param: 'ohmsPerLead',
      value: ohmsPerLead,
      requirement: 'must leave a zero offset the bridge without leads can read',
    },
    () => quarterBridge(setup, undefined).strainFromRatio(offsetRatio),
  );
  return { offsetRatio, apparentStrain };
}
