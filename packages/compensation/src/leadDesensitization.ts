import { createStrainBridge } from '@bridgework/bridge';
import { checkOhms, checkOneOf, checkOptions, leadWirings } from '@bridgework/core';
import { UNIT_SLOPE_GAUGE_FACTOR, type QuarterBridgeWiring } from './internal/leads.js';

export type { QuarterBridgeWiring } from './internal/leads.js';

const ZERO_OK = { allowZero: true } as const;
const allKeys = ['wiring', 'inputOhms', 'gaugeOhms', 'ohmsPerLead', 'completionOhms'];

/** Lead wirings of a full-bridge transducer (see `LeadWiring` in the core package). */
export type FullBridgeWiring = 'four-wire' | 'six-wire';

/** A quarter-bridge gauge and its wiring, shared by the lead functions that need the gauge factor. */
export interface QuarterBridgeGaugeOptions {
  /** Gauge factor (> 0). */
  readonly gaugeFactor: number;
  /** Unstrained gauge resistance Rg in Ω (> 0). Default 350. */
  readonly gaugeOhms?: number;
  /** Completion resistance of arms 2, 3 and 4 in Ω (> 0). Default `gaugeOhms`. */
  readonly completionOhms?: number;
  /** `'two-wire'` or `'three-wire'`. */
  readonly wiring: QuarterBridgeWiring;
}

/** Lead options of a quarter-bridge gauge on two or three wires. */
export interface QuarterBridgeLeadOptions {
  /** `'two-wire'` (both leads in arm 1) or `'three-wire'` (one lead in arm 1, one in arm 2). */
  readonly wiring: QuarterBridgeWiring;
  /** Unstrained gauge resistance Rg in Ω (> 0). */
  readonly gaugeOhms: number;
  /** Resistance of one lead conductor RL in Ω (≥ 0). */
  readonly ohmsPerLead: number;
  /**
   * Completion resistance of arms 2, 3 and 4 in Ω (> 0). When omitted the closed form of the
   * wiring's standard condition is returned (two-wire: bridge balanced with its leads,
   * completion = Rg + 2RL; three-wire: completion = Rg). When given, the exact slope of that
   * bridge is computed by `createStrainBridge`.
   */
  readonly completionOhms?: number;
}

/** Lead options of a full-bridge transducer on a four- or six-wire cable. */
export interface FullBridgeLeadOptions {
  /** `'four-wire'` (excitation leads in series with the excitation) or `'six-wire'` (remote sense). */
  readonly wiring: FullBridgeWiring;
  /** Input resistance Rin of the transducer (between its excitation terminals) in Ω (> 0). */
  readonly inputOhms: number;
  /** Resistance of one lead conductor RL in Ω (≥ 0). */
  readonly ohmsPerLead: number;
}

/** Options of {@link leadDesensitization}: a quarter-bridge gauge or a full-bridge transducer. */
export type LeadDesensitizationOptions = QuarterBridgeLeadOptions | FullBridgeLeadOptions;

/**
 * The fraction of the nominal sensitivity left by lead resistance (the lead desensitization).
 *
 * @remarks
 * The factor multiplies the slope d(ratio)/d(strain) at zero strain; an instrument that assumes
 * the nominal slope reads every strain low by it, and dividing an indicated strain by it corrects
 * the lead loss. Lead models are those of `createStrainBridge` in the bridge package:
 *
 * | wiring | closed form | exact when |
 * |---|---|---|
 * | `'two-wire'` | Rg/(Rg + 2RL) | the bridge is balanced with its leads: completion = Rg + 2RL |
 * | `'three-wire'` | Rg/(Rg + RL) | completion = Rg (no lead offset) |
 * | `'four-wire'` | Rin/(Rin + 2RL) | always (the excitation leads and Rin form a divider) |
 * | `'six-wire'` | 1 | always (remote sense measures the excitation at the bridge) |
 *
 * These are the common-practice lead corrections (for example Window & Holister, _Strain Gauge
 * Technology_, the lead-wire section, from memory); each agrees exactly with the slope of
 * `createStrainBridge` under the stated condition (tested to 1e-15). The reference slope is the
 * nominal one, GF·N/4. Under other conditions the closed forms are approximations: a two-wire
 * gauge with completion = Rg (zeroed by software) has the slope ratio (Rg/(Rg + RL))², not
 * Rg/(Rg + 2RL). Give `completionOhms` to get the exact slope of that bridge instead, computed by
 * `createStrainBridge` (ideal meter, no source resistance). The four-wire factor holds at every
 * strain for a bridge whose input resistance does not change with strain (bending and shear
 * bridges); for the Poisson full bridges it is the slope at zero.
 *
 * @param options - Wiring, gauge (or input) resistance, lead resistance, optional completion.
 * @returns The desensitization factor, in (0, 1] for the standard conditions.
 * Every resistance lies in `OHMS_LIMITS` of the core package (1 nΩ … 1 PΩ; leads may be 0), so
 * the factor is always finite, in (0, 1] for the standard conditions.
 *
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for an unknown wiring;
 *   `not-positive`, `negative`, `not-finite`, `wrong-type` for bad numbers; `out-of-range` for a
 *   resistance outside those limits; `unknown-option` (naming the closest key),
 *   `missing-option`.
 * @example
 * ```ts
 * leadDesensitization({ wiring: 'two-wire', gaugeOhms: 350, ohmsPerLead: 1.339 }); // 0.99240...
 * leadDesensitization({ wiring: 'three-wire', gaugeOhms: 350, ohmsPerLead: 1.339 }); // 0.99618...
 * leadDesensitization({ wiring: 'four-wire', inputOhms: 700, ohmsPerLead: 2 }); // 0.99431...
 * ```
 */
export function leadDesensitization(options: LeadDesensitizationOptions): number {
  const wiring = checkOneOf(
    'wiring',
    checkOptions('options', options, { known: allKeys, required: ['wiring'] })['wiring'],
    leadWirings,
  );
  if (wiring === 'four-wire' || wiring === 'six-wire') {
    const o = checkOptions('options', options, {
      known: ['wiring', 'inputOhms', 'ohmsPerLead'],
      required: ['inputOhms', 'ohmsPerLead'],
    });
    const inputOhms = checkOhms('inputOhms', o['inputOhms']);
    const ohmsPerLead = checkOhms('ohmsPerLead', o['ohmsPerLead'], ZERO_OK);
    return wiring === 'six-wire' ? 1 : inputOhms / (inputOhms + 2 * ohmsPerLead);
  }
  const o = checkOptions('options', options, {
    known: ['wiring', 'gaugeOhms', 'ohmsPerLead', 'completionOhms'],
    required: ['gaugeOhms', 'ohmsPerLead'],
  });
  const gaugeOhms = checkOhms('gaugeOhms', o['gaugeOhms']);
  const ohmsPerLead = checkOhms('ohmsPerLead', o['ohmsPerLead'], ZERO_OK);
  if (o['completionOhms'] === undefined) {
    return gaugeOhms / (gaugeOhms + (wiring === 'two-wire' ? 2 * ohmsPerLead : ohmsPerLead));
  }
  const completionOhms = checkOhms('completionOhms', o['completionOhms']);
  // With GF = 4 the nominal quarter-bridge slope GF/4 is exactly 1, so the slope is the factor.
  return createStrainBridge({
    arrangement: 'quarter',
    gaugeFactor: UNIT_SLOPE_GAUGE_FACTOR,
    gaugeOhms,
    completionOhms,
    leads: { ohmsPerLead, wiring },
  }).sensitivity;
}
