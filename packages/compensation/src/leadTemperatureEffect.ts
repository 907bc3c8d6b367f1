import { blameOption, checkFinite, checkOhms, checkOptions } from '@bridgework/core';
import type { QuarterBridgeGaugeOptions } from './leadDesensitization.js';
import { checkQuarterSetup, quarterBridge, quarterGaugeKeys } from './internal/leads.js';

/** Options of {@link leadTemperatureEffect}. */
export interface LeadTemperatureEffectOptions extends QuarterBridgeGaugeOptions {
  /** Resistance of one lead when the channel was zeroed (and as its bridge model assumes), Ω (≥ 0). */
  readonly referenceOhmsPerLead: number;
  /** Resistance of one lead now, after its temperature changed, Ω (≥ 0); see `wireOhms`. */
  readonly ohmsPerLead: number;
  /** The true strain of the gauge now, m/m. Default 0 (the drift of the zero). */
  readonly strain?: number;
}

/** What a lead temperature change does to a quarter bridge (see {@link leadTemperatureEffect}). */
export interface LeadTemperatureEffect {
  /** Change of the zero-strain output ratio, V/V (now minus reference). */
  readonly zeroShiftRatio: number;
  /** The strain the channel indicates, m/m: the reading inverted with the reference leads. */
  readonly indicatedStrain: number;
  /** Indicated minus true strain, m/m: the apparent strain caused by the lead change. */
  readonly apparentStrain: number;
  /** Fractional change of the slope at zero strain (now / reference − 1). */
  readonly spanChange: number;
}

const ZERO_OK = { allowZero: true } as const;

/**
 * The zero shift, apparent strain and span change of a two- or three-wire quarter bridge whose
 * leads changed resistance (usually with temperature) after the channel was set up.
 *
 * @remarks
 * The channel is modelled as `createStrainBridge` of the bridge package with the reference leads
 * (RL0): that is what it was zeroed and scaled with. The gauge is read now through leads of RL1,
 * the exact forward map of a second bridge, and the reading is inverted exactly through the
 * first. Everything is exact (ideal meter, no source resistance); nothing is linearised.
 *
 * Closed forms that the tests check, with ΔRL = RL1 − RL0 and completion Rc:
 * - two-wire: arm 1 gains 2ΔRL, so the apparent strain is exactly 2ΔRL/(GF·Rg) at every strain;
 * - three-wire: the bridge reads the same when R1/R2 is the same, which gives an apparent strain
 *   at zero strain of ΔRL·(Rc − Rg)/(GF·Rg·(Rc + RL1)): exactly 0 when Rc = Rg. The lead change
 *   still alters the span (by about −ΔRL/(Rg + RL0)), so a strained gauge shows a small error.
 * Lead resistance at a temperature comes from `wireOhms` (copper: +0.393 %/K).
 *
 * @param options - Bridge, wiring, reference and present lead resistance, true strain.
 * @returns Zero shift (V/V), indicated and apparent strain (m/m), span change (fraction).
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for a wiring other than
 *   two- or three-wire; `out-of-range` for a strain outside the bridge's strain
 *   range (also when the reading at the new lead resistance is beyond what the reference bridge
 *   reads), a gauge factor outside [0.01, 1000] or a resistance outside `OHMS_LIMITS`;
 *   `not-positive`, `negative`, `not-finite`, `wrong-type` for bad numbers;
 *   `unknown-option` for a key it does not know (naming the closest), `missing-option` for a
 *   required one.
 * @example
 * ```ts
 * // 350 Ω gauge, GF 2, two-wire, leads 1.339 Ω at zeroing, 1.418 Ω after a 15 K rise:
 * leadTemperatureEffect({
 *   gaugeFactor: 2, wiring: 'two-wire', referenceOhmsPerLead: 1.339, ohmsPerLead: 1.418,
 * }).apparentStrain; // 2.257e-4 (226 µε = 2·0.079/(2·350))
 * ```
 */
export function leadTemperatureEffect(options: LeadTemperatureEffectOptions): LeadTemperatureEffect {
  const o = checkOptions('options', options, {
    known: [...quarterGaugeKeys, 'referenceOhmsPerLead', 'ohmsPerLead', 'strain'],
    required: ['gaugeFactor', 'wiring', 'referenceOhmsPerLead', 'ohmsPerLead'],
  });
  const setup = checkQuarterSetup(o);
  const referenceOhmsPerLead = checkOhms('referenceOhmsPerLead', o['referenceOhmsPerLead'], ZERO_OK);
  const ohmsPerLead = checkOhms('ohmsPerLead', o['ohmsPerLead'], ZERO_OK);
  const strain = o['strain'] === undefined ? 0 : checkFinite('strain', o['strain']);
  const reference = quarterBridge(setup, referenceOhmsPerLead);
  const now = quarterBridge(setup, ohmsPerLead);
  const indicatedStrain = blameOption(
    {
      param: 'strain',
      value: strain,
      requirement: 'must give a reading the bridge can take at both lead resistances',
    },
    () => reference.strainFromRatio(now.ratioFromStrain(strain)),
  );
  return {
    zeroShiftRatio: now.offsetRatio - reference.offsetRatio,
    indicatedStrain,
    apparentStrain: indicatedStrain - strain,
    spanChange: now.sensitivity / reference.sensitivity - 1,
  };
}
